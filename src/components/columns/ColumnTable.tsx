/**
 * The columns of a dataset version as one compact row each: name, type, missing share, a tiny
 * histogram and a one-line summary. Searchable (text or `x_*` wildcard pattern), filterable by type,
 * sortable, and virtualized so 5,000 columns scroll as smoothly as 5. With `selection` it becomes the
 * predictor picker of the fit form (select all / none / the shown ones, i.e. by type or by pattern).
 */
import { useMemo, useRef, useState, type ReactNode } from 'react';
import { createColumnHelper, useTable } from '@tanstack/react-table';
import { useVirtualizer } from '@tanstack/react-virtual';
import { COLUMN_TYPE_LABELS, COLUMN_TYPES, type ColumnSchema, type ColumnType } from '@shared/datasets';
import { countFormat, formatShare } from '@/lib/numbers';
import { sortableFeatures } from '../table/features';
import { SortableHeader } from '../table/SortableHeader';
import { filterColumns, missingShare } from './filter';
import { SelectionBar } from './SelectionBar';
import { Sparkline, summaryLine } from './Sparkline';

export interface ColumnSelection {
  selected: ReadonlySet<string>;
  onChange: (next: Set<string>) => void;
  /** Why a column cannot be chosen (e.g. it is the outcome), or null when it can. */
  unavailable?: (c: ColumnSchema) => string | null;
  /** Accessible name of a row's checkbox. */
  checkboxLabel?: (name: string) => string;
}

interface Props {
  columns: ColumnSchema[];
  /** Names the table for assistive technology, e.g. "Columns of version 3". */
  label: string;
  selection?: ColumnSelection;
  /** Replaces the plain type label (the dataset page puts an editable select here). */
  renderType?: (c: ColumnSchema) => ReactNode;
  /** Small text under the name (e.g. why the type was inferred). */
  renderNote?: (c: ColumnSchema) => ReactNode;
  /** One more column at the end (e.g. "Use in models"). */
  extra?: { header: string; cell: (c: ColumnSchema) => ReactNode };
  /** Height of the scrolling area in pixels. */
  height?: number;
}

const ROW_HEIGHT = 48;
const helper = createColumnHelper<typeof sortableFeatures, ColumnSchema>();
const TABLE_COLUMNS = helper.columns([
  helper.accessor('name', { id: 'name', header: 'Name', sortFn: 'alphanumeric' }),
  helper.accessor((c) => COLUMN_TYPE_LABELS[c.type], { id: 'type', header: 'Type', sortFn: 'text' }),
  helper.accessor((c) => missingShare(c), { id: 'missing', header: 'Missing', sortFn: 'basic' }),
  helper.accessor((c) => c.summary.distinct ?? Number.POSITIVE_INFINITY, { id: 'distinct', header: 'Distinct', sortFn: 'basic' }),
  helper.accessor((c) => c.position, { id: 'position', header: 'Position', sortFn: 'basic' }),
]);
const HIDDEN = new Set(['position']);

export function ColumnTable({ columns, label, selection, renderType, renderNote, extra, height = 480 }: Props) {
  const [pattern, setPattern] = useState('');
  const [type, setType] = useState<ColumnType | 'all'>('all');
  const shown = useMemo(() => filterColumns(columns, { pattern, type }), [columns, pattern, type]);
  const table = useTable({ features: sortableFeatures, columns: TABLE_COLUMNS, data: shown, getRowId: (c) => c.name }, (s) => ({ sorting: s.sorting }));
  const rows = table.getRowModel().rows;
  const scrollRef = useRef<HTMLDivElement>(null);
  const virtualizer = useVirtualizer({ count: rows.length, getScrollElement: () => scrollRef.current, estimateSize: () => ROW_HEIGHT, overscan: 8 });
  const items = virtualizer.getVirtualItems();
  const padTop = items.length > 0 ? items[0].start : 0;
  const padBottom = items.length > 0 ? virtualizer.getTotalSize() - items[items.length - 1].end : 0;
  const colCount = 5 + (selection ? 1 : 0) + (extra ? 1 : 0);
  const types = COLUMN_TYPES.filter((t) => columns.some((c) => c.type === t));
  const header = table.getHeaderGroups()[0];

  return (
    <div className="space-y-2">
      <div className="flex flex-wrap items-end gap-3 text-sm">
        <label className="flex flex-col gap-0.5">
          <span className="text-xs font-bold text-slate-700 dark:text-slate-300">Find columns</span>
          <input
            type="search"
            value={pattern}
            onChange={(e) => setPattern(e.target.value)}
            placeholder="name, or a pattern like x_*"
            className="w-56 rounded border border-slate-300 px-2 py-1 dark:border-slate-700 dark:bg-slate-950"
          />
        </label>
        <label className="flex flex-col gap-0.5">
          <span className="text-xs font-bold text-slate-700 dark:text-slate-300">Type</span>
          <select value={type} onChange={(e) => setType(e.target.value as ColumnType | 'all')} className="rounded border border-slate-300 px-2 py-1 dark:border-slate-700 dark:bg-slate-950">
            <option value="all">All types</option>
            {types.map((t) => (
              <option key={t} value={t}>
                {COLUMN_TYPE_LABELS[t]}
              </option>
            ))}
          </select>
        </label>
        <p className="pb-1 text-xs text-slate-600 dark:text-slate-400" aria-live="polite">
          Showing {countFormat.format(shown.length)} of {countFormat.format(columns.length)} columns
        </p>
      </div>
      {selection && <SelectionBar columns={columns} shown={shown} selection={selection} />}
      <div
        ref={scrollRef}
        tabIndex={0}
        role="region"
        aria-label={`${label} (scrolls)`}
        style={{ maxHeight: height }}
        className="overflow-auto rounded-lg border border-slate-200 bg-white dark:border-slate-800 dark:bg-slate-900"
      >
        <table className="w-full table-fixed border-collapse text-sm" aria-label={label} aria-rowcount={rows.length + 1}>
          <thead className="sticky top-0 z-10 bg-slate-100 dark:bg-slate-800">
            <tr>
              {selection && (
                <th scope="col" className="w-10 px-2 py-1.5 text-left text-xs font-bold">
                  <span className="sr-only">Chosen</span>
                </th>
              )}
              {header.headers
                .filter((h) => !HIDDEN.has(h.column.id))
                .map((h) => (
                  <SortableHeader key={h.id} header={h} className={WIDTHS[h.column.id]}>
                    {String(h.column.columnDef.header)}
                  </SortableHeader>
                ))}
              <th scope="col" className="w-24 px-2 py-1.5 text-left text-xs font-bold text-slate-700 dark:text-slate-300">
                Shape
              </th>
              <th scope="col" className="px-2 py-1.5 text-left text-xs font-bold text-slate-700 dark:text-slate-300">
                Summary
              </th>
              {extra && (
                <th scope="col" className="w-32 px-2 py-1.5 text-left text-xs font-bold text-slate-700 dark:text-slate-300">
                  {extra.header}
                </th>
              )}
            </tr>
          </thead>
          <tbody>
            {padTop > 0 && (
              <tr aria-hidden="true" style={{ height: padTop }}>
                <td colSpan={colCount} />
              </tr>
            )}
            {items.map((item) => {
              const c = rows[item.index].original;
              const why = selection?.unavailable?.(c) ?? null;
              return (
                <tr key={c.name} data-column={c.name} aria-rowindex={item.index + 2} style={{ height: ROW_HEIGHT }} className="border-t border-slate-100 align-middle dark:border-slate-800">
                  {selection && (
                    <td className="px-2">
                      <input
                        type="checkbox"
                        aria-label={selection.checkboxLabel?.(c.name) ?? `Choose ${c.name}`}
                        title={why ?? undefined}
                        disabled={why !== null}
                        checked={why === null && selection.selected.has(c.name)}
                        onChange={(e) => {
                          const next = new Set(selection.selected);
                          if (e.target.checked) next.add(c.name);
                          else next.delete(c.name);
                          selection.onChange(next);
                        }}
                      />
                    </td>
                  )}
                  <td className="truncate px-2">
                    <span className="font-bold" title={c.name}>
                      {c.name}
                    </span>
                    {renderNote && <span className="block truncate text-xs text-slate-600 dark:text-slate-400">{renderNote(c)}</span>}
                  </td>
                  <td className="truncate px-2">{renderType ? renderType(c) : COLUMN_TYPE_LABELS[c.type]}</td>
                  <td className="px-2 font-mono text-xs">{formatShare(missingShare(c))}</td>
                  <td className="px-2 font-mono text-xs">{c.summary.distinct === null ? 'many' : countFormat.format(c.summary.distinct)}</td>
                  <td className="px-2">
                    <Sparkline column={c} />
                  </td>
                  <td className="truncate px-2 text-xs" title={summaryLine(c)}>
                    {summaryLine(c)}
                  </td>
                  {extra && <td className="px-2 text-xs">{extra.cell(c)}</td>}
                </tr>
              );
            })}
            {padBottom > 0 && (
              <tr aria-hidden="true" style={{ height: padBottom }}>
                <td colSpan={colCount} />
              </tr>
            )}
          </tbody>
        </table>
      </div>
    </div>
  );
}

const WIDTHS: Record<string, string> = { name: 'w-[20%]', type: 'w-40', missing: 'w-16', distinct: 'w-20' };
