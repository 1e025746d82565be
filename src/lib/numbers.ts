/** Number formats shared by tables and charts (results and column summaries). */

export const countFormat = new Intl.NumberFormat('en-US');

/** Up to 4 significant digits, without trailing noise; exponent form for very large or small values. */
export function formatStat(x: number | null | undefined, digits = 4): string {
  if (x === undefined || x === null || !Number.isFinite(x)) return '–';
  if (x !== 0 && (Math.abs(x) >= 1e6 || Math.abs(x) < 1e-3)) return x.toExponential(digits - 1);
  return String(Number(x.toPrecision(digits)));
}

/** A share in [0, 1] as a percentage: "0%", "0.4%", "12%". */
export function formatShare(x: number): string {
  if (!Number.isFinite(x)) return '–';
  if (x === 0) return '0%';
  const pct = x * 100;
  return `${pct < 1 ? pct.toFixed(1) : pct < 10 ? pct.toFixed(1).replace(/\.0$/, '') : Math.round(pct)}%`;
}

/** Seconds as "4 s", "2 min 05 s", "1 h 03 min". */
export function formatDuration(seconds: number): string {
  if (!Number.isFinite(seconds) || seconds < 0) return '–';
  if (seconds < 60) return `${seconds < 10 ? seconds.toFixed(1).replace(/\.0$/, '') : Math.round(seconds)} s`;
  const m = Math.floor(seconds / 60);
  if (m < 60) return `${m} min ${String(Math.round(seconds % 60)).padStart(2, '0')} s`;
  return `${Math.floor(m / 60)} h ${String(m % 60).padStart(2, '0')} min`;
}
