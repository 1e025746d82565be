import type { HistogramBin } from '@shared/datasets';
import { formatStat } from './format';

/** A small bar chart of a numeric column's bins (plain SVG: it is 120 x 32 pixels). */
export function Histogram({ bins, label }: { bins: HistogramBin[]; label: string }) {
  const max = Math.max(1, ...bins.map((b) => b.count));
  const w = 120 / bins.length;
  const first = bins[0];
  const last = bins[bins.length - 1];
  return (
    <svg width={120} height={32} role="img" aria-label={`Histogram of ${label} from ${formatStat(first.from)} to ${formatStat(last.to)}`} className="text-lariat-600 dark:text-lariat-300">
      {bins.map((b, i) => {
        const h = (b.count / max) * 30;
        return (
          <rect key={i} x={i * w + 0.5} y={32 - h} width={Math.max(1, w - 1)} height={h} fill="currentColor">
            <title>{`${formatStat(b.from)} to ${formatStat(b.to)}: ${b.count}`}</title>
          </rect>
        );
      })}
    </svg>
  );
}
