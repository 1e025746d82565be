import type { ColumnSchema } from '@shared/datasets';
import { countFormat, formatStat } from './format';
import { Histogram } from './Histogram';

/** The numbers of one column's summary: counts, then moments and quartiles or the top levels. */
export function ColumnSummary({ column }: { column: ColumnSchema }) {
  const s = column.summary;
  const stats: [string, string][] = [
    ['count', countFormat.format(s.count)],
    ['missing', countFormat.format(s.missing)],
    ['distinct', s.distinct === null ? 'many' : countFormat.format(s.distinct)],
  ];
  if (s.mean !== undefined) {
    stats.push(['mean', formatStat(s.mean)], ['sd', formatStat(s.sd)], ['min', formatStat(s.min)], ['q1', formatStat(s.q1)], ['median', formatStat(s.median)], ['q3', formatStat(s.q3)], ['max', formatStat(s.max)]);
  }
  return (
    <div className="space-y-2">
      <dl className="grid grid-cols-5 gap-x-3 gap-y-1 text-xs">
        {stats.map(([k, v]) => (
          <div key={k}>
            <dt className="text-slate-600 dark:text-slate-400">{k}</dt>
            <dd className="font-mono">{v}</dd>
          </div>
        ))}
      </dl>
      {s.histogram && <Histogram bins={s.histogram} label={column.name} />}
      {s.levels && s.mean === undefined && (
        <ul className="flex flex-wrap gap-1 text-xs">
          {s.levels.slice(0, 12).map((l) => (
            <li key={l.level} className="rounded bg-slate-100 px-1.5 py-0.5 dark:bg-slate-800">
              {l.level} <span className="text-slate-600 dark:text-slate-400">({countFormat.format(l.count)})</span>
            </li>
          ))}
          {s.levels.length > 12 && <li className="px-1.5 py-0.5">…</li>}
        </ul>
      )}
    </div>
  );
}
