import type { ParseReport as Report } from '@shared/datasets';
import { countFormat } from './format';

/** What the parser found and decided, in sentences. */
export function ParseReport({ report }: { report: Report }) {
  const markers = report.missingMarkers.map((m) => (m === '' ? '(blank)' : m)).join(', ');
  // Reports stored before the choice existed have no headerRow: they all had a header row.
  const firstRow = report.headerRow === false ? 'data (columns named column_1, column_2, ...)' : 'column names';
  return (
    <section aria-labelledby="report-heading" className="space-y-2 text-sm">
      <h2 id="report-heading" className="text-lg font-bold">
        Parse report
      </h2>
      <p>
        {report.fileName}: {countFormat.format(report.rowCount)} rows, {report.columnCount} columns, UTF-8, {report.lineEndings} line endings. Missing-value markers: {markers}.
      </p>
      <p data-testid="parse-report-first-row">First row: {firstRow}.</p>
      <ul className="list-disc space-y-1 pl-5">
        {report.notes.map((n, i) => (
          <li key={i}>{n}</li>
        ))}
      </ul>
    </section>
  );
}
