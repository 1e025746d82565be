/**
 * A sortable table on @tanstack/react-table whose rows are virtualized (@tanstack/react-virtual):
 * the results tables can have thousands of rows (one per term or per lambda).
 */
import { useRef } from 'react';
import { useTable, type ColumnDef, type SortingState } from '@tanstack/react-table';
import { useVirtualizer } from '@tanstack/react-virtual';
import { sortableFeatures, type SortableFeatures } from './features';
import { SortableHeader } from './SortableHeader';

interface Props<T extends object> {
  data: T[];
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  columns: ColumnDef<SortableFeatures, T, any>[];
  /** Names the table for assistive technology. */
  label: string;
  getRowId: (row: T) => string;
  initialSorting?: SortingState;
  /** Extra attributes per row (e.g. a warning colour for an unconverged lambda). */
  rowClassName?: (row: T) => string;
  height?: number;
  rowHeight?: number;
}

export function DataTable<T extends object>({ data, columns, label, getRowId, initialSorting = [], rowClassName, height = 420, rowHeight = 34 }: Props<T>) {
  const table = useTable({ features: sortableFeatures, columns, data, getRowId, initialState: { sorting: initialSorting } }, (s) => ({ sorting: s.sorting }));
  const rows = table.getRowModel().rows;
  const scrollRef = useRef<HTMLDivElement>(null);
  const virtualizer = useVirtualizer({ count: rows.length, getScrollElement: () => scrollRef.current, estimateSize: () => rowHeight, overscan: 10 });
  const items = virtualizer.getVirtualItems();
  const padTop = items.length > 0 ? items[0].start : 0;
  const padBottom = items.length > 0 ? virtualizer.getTotalSize() - items[items.length - 1].end : 0;
  const width = columns.length;
  return (
    <div ref={scrollRef} tabIndex={0} role="region" aria-label={`${label} (scrolls)`} style={{ maxHeight: height }} className="overflow-auto rounded-lg border border-slate-200 bg-white dark:border-slate-800 dark:bg-slate-900">
      <table className="w-full border-collapse text-sm" aria-label={label} aria-rowcount={rows.length + 1}>
        <thead className="sticky top-0 z-10 bg-slate-100 dark:bg-slate-800">
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id}>
              {group.headers.map((h) => (
                <SortableHeader key={h.id} header={h}>
                  <table.FlexRender header={h} />
                </SortableHeader>
              ))}
            </tr>
          ))}
        </thead>
        <tbody>
          {padTop > 0 && (
            <tr aria-hidden="true" style={{ height: padTop }}>
              <td colSpan={width} />
            </tr>
          )}
          {items.map((item) => {
            const row = rows[item.index];
            return (
              <tr key={row.id} aria-rowindex={item.index + 2} style={{ height: rowHeight }} className={`border-t border-slate-100 dark:border-slate-800 ${rowClassName?.(row.original) ?? ''}`}>
                {row.getAllCells().map((cell) => (
                  <td key={cell.id} className="whitespace-nowrap px-2 py-1">
                    <table.FlexRender cell={cell} />
                  </td>
                ))}
              </tr>
            );
          })}
          {padBottom > 0 && (
            <tr aria-hidden="true" style={{ height: padBottom }}>
              <td colSpan={width} />
            </tr>
          )}
        </tbody>
      </table>
    </div>
  );
}
