/** Display formats for the datasets pages. */
export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(1)} KB`;
  return `${(bytes / (1024 * 1024)).toFixed(1)} MB`;
}

export { formatWhen } from '@/lib/dates';

/** Up to 4 significant digits, without trailing noise. */
export function formatStat(x: number | undefined): string {
  if (x === undefined || !Number.isFinite(x)) return '–';
  if (x !== 0 && (Math.abs(x) >= 1e6 || Math.abs(x) < 1e-3)) return x.toExponential(3);
  return String(Number(x.toPrecision(4)));
}

export const countFormat = new Intl.NumberFormat();
