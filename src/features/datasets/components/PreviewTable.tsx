/**
 * The first rows of a version, sortable by clicking a header (TanStack Table's sorting on the rows
 * loaded), with only the visible rows and columns in the DOM (TanStack Virtual, both directions), so
 * thousands of rows scroll fast and a 5,000-column table does not put millions of cells in the page.
 */
import { createColumnHelper, createSortedRowModel, rowSortingFeature, tableFeatures, useTable, type Row, type SortingState } from '@tanstack/react-table';
import { useVirtualizer } from '@tanstack/react-virtual';
import { useMemo, useRef, useState } from 'react';
import type { PreviewDto } from '@shared/datasets';
import { countFormat } from './format';

type Cell = string | number | null;
type PreviewRow = Cell[];

/** Missing values last whichever way the column is sorted is not possible with one comparator; they sort lowest. */
function compareCells(a: Cell, b: Cell): number {
  if (a === b) return 0;
  if (a === null) return -1;
  if (b === null) return 1;
  if (typeof a === 'number' && typeof b === 'number') return a - b;
  return String(a).localeCompare(String(b), undefined, { numeric: true });
}

const features = tableFeatures({ rowSortingFeature, sortedRowModel: createSortedRowModel() });
const sortCells = (a: Row<typeof features, PreviewRow>, b: Row<typeof features, PreviewRow>, id: string) => compareCells(a.getValue(id) as Cell, b.getValue(id) as Cell);
const helper = createColumnHelper<typeof features, PreviewRow>();
const ROW_HEIGHT = 28;
/** A first guess of a column's width; the real width of each drawn header is measured. */
const COLUMN_WIDTH = 110;

export function PreviewTable({ preview }: { preview: PreviewDto }) {
  const columns = useMemo(
    () => helper.columns(preview.columns.map((name, j) => helper.accessor((row) => row[j], { id: `c${j}`, header: name, sortFn: sortCells }))),
    [preview.columns],
  );
  const [sorting, setSorting] = useState<SortingState>([]);
  // Ascending first for every column (the library's default starts numbers descending).
  const table = useTable({ features, columns, data: preview.rows, state: { sorting }, onSortingChange: setSorting, sortDescFirst: false });
  const rows = table.getRowModel().rows;
  const scroller = useRef<HTMLDivElement>(null);
  const virtualizer = useVirtualizer({ count: rows.length, getScrollElement: () => scroller.current, estimateSize: () => ROW_HEIGHT, overscan: 10 });
  const items = virtualizer.getVirtualItems();
  const padTop = items[0]?.start ?? 0;
  const padBottom = virtualizer.getTotalSize() - (items[items.length - 1]?.end ?? 0);
  const columnVirtualizer = useVirtualizer({
    horizontal: true,
    count: preview.columns.length,
    getScrollElement: () => scroller.current,
    estimateSize: () => COLUMN_WIDTH,
    overscan: 4,
  });
  const shown = columnVirtualizer.getVirtualItems();
  const padLeft = shown[0]?.start ?? 0;
  const padRight = columnVirtualizer.getTotalSize() - (shown[shown.length - 1]?.end ?? 0);

  return (
    <section aria-labelledby="preview-heading" className="space-y-2">
      <h2 id="preview-heading" className="text-lg font-bold">
        Preview
      </h2>
      <p className="text-sm text-slate-700 dark:text-slate-300">
        The first {countFormat.format(preview.rows.length)} of {countFormat.format(preview.totalRows)} rows. Click a column name to sort these rows.
      </p>
      <div ref={scroller} className="max-h-96 overflow-auto rounded border border-slate-200 dark:border-slate-800" tabIndex={0} aria-label="Preview rows">
        <table className="w-max min-w-full text-left font-mono text-xs" aria-colcount={preview.columns.length} aria-rowcount={rows.length + 1}>
          <thead className="sticky top-0 bg-slate-100 dark:bg-slate-800">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id} aria-rowindex={1}>
                {padLeft > 0 && <th style={{ width: padLeft, minWidth: padLeft }} aria-hidden="true" />}
                {shown.map((column) => {
                  const header = group.headers[column.index];
                  const sorted = header.column.getIsSorted();
                  return (
                    <th
                      key={header.id}
                      ref={columnVirtualizer.measureElement}
                      data-index={column.index}
                      aria-colindex={column.index + 1}
                      aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : 'none'}
                      className="px-2 py-1"
                    >
                      <button type="button" onClick={header.column.getToggleSortingHandler()} className="font-bold">
                        <table.FlexRender header={header} />
                        {sorted === 'asc' ? ' ▲' : sorted === 'desc' ? ' ▼' : ''}
                      </button>
                    </th>
                  );
                })}
                {padRight > 0 && <th style={{ width: padRight, minWidth: padRight }} aria-hidden="true" />}
              </tr>
            ))}
          </thead>
          <tbody>
            {padTop > 0 && <tr style={{ height: padTop }} aria-hidden="true" />}
            {items.map((item) => {
              const row = rows[item.index];
              const cells = row.getAllCells();
              return (
                <tr key={row.id} style={{ height: ROW_HEIGHT }} aria-rowindex={item.index + 2} className="border-t border-slate-100 dark:border-slate-800">
                  {padLeft > 0 && <td aria-hidden="true" />}
                  {shown.map((column) => {
                    const cell = cells[column.index];
                    const v = cell.getValue() as Cell;
                    return (
                      <td key={cell.id} aria-colindex={column.index + 1} className={`whitespace-nowrap px-2 ${typeof v === 'number' ? 'text-right' : ''}`}>
                        {v === null ? <span className="text-slate-400">missing</span> : String(v)}
                      </td>
                    );
                  })}
                  {padRight > 0 && <td aria-hidden="true" />}
                </tr>
              );
            })}
            {padBottom > 0 && <tr style={{ height: padBottom }} aria-hidden="true" />}
          </tbody>
        </table>
      </div>
    </section>
  );
}
