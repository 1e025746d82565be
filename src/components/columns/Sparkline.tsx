import type { ColumnSchema } from '@shared/datasets';
import { countFormat, formatStat } from '@/lib/numbers';

const W = 72;
const H = 20;

/**
 * A tiny picture of one column for a table row: the histogram of a numeric column, or the counts of
 * the most frequent levels of a categorical one. Plain SVG: hundreds are on screen at once.
 */
export function Sparkline({ column }: { column: ColumnSchema }) {
  const s = column.summary;
  const bars: { count: number; title: string }[] = s.histogram
    ? s.histogram.map((b) => ({ count: b.count, title: `${formatStat(b.from)} to ${formatStat(b.to)}: ${countFormat.format(b.count)}` }))
    : (s.levels ?? []).slice(0, 8).map((l) => ({ count: l.count, title: `${l.level}: ${countFormat.format(l.count)}` }));
  if (bars.length === 0) return <span className="text-xs text-slate-500 dark:text-slate-400">–</span>;
  const max = Math.max(1, ...bars.map((b) => b.count));
  const w = W / bars.length;
  const what = s.histogram ? 'Histogram' : 'Most frequent values';
  return (
    <svg width={W} height={H} role="img" aria-label={`${what} of ${column.name}`} className={s.histogram ? 'text-lariat-600 dark:text-lariat-300' : 'text-saffron-600 dark:text-saffron-400'}>
      {bars.map((b, i) => {
        const h = Math.max(1, (b.count / max) * (H - 1));
        return (
          <rect key={i} x={i * w} y={H - h} width={Math.max(1, w - 1)} height={h} fill="currentColor">
            <title>{b.title}</title>
          </rect>
        );
      })}
    </svg>
  );
}

/** One line of numbers: moments and range for numbers, the top levels for categories. */
export function summaryLine(c: ColumnSchema): string {
  const s = c.summary;
  if (s.mean !== undefined) return `mean ${formatStat(s.mean)} · sd ${formatStat(s.sd)} · ${formatStat(s.min)} to ${formatStat(s.max)}`;
  if (s.levels && s.levels.length > 0) {
    const top = s.levels.slice(0, 3).map((l) => `${l.level} (${countFormat.format(l.count)})`);
    return `${top.join(' · ')}${s.levels.length > 3 ? ' · …' : ''}`;
  }
  return s.distinct === null ? 'many distinct values' : `${countFormat.format(s.distinct)} distinct values`;
}
