import type { Header } from '@tanstack/react-table';
import type { ReactNode } from 'react';
import type { SortableFeatures } from './features';

type AnyHeader = Header<SortableFeatures, never, never> | Header<SortableFeatures, any, any>; // eslint-disable-line @typescript-eslint/no-explicit-any

/** A column heading: a button that cycles the sort, with aria-sort on the cell for screen readers. */
export function SortableHeader({ header, children, className = '' }: { header: AnyHeader; children: ReactNode; className?: string }) {
  const sorted = header.column.getIsSorted();
  const canSort = header.column.getCanSort();
  return (
    <th
      scope="col"
      aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}
      className={`whitespace-nowrap px-2 py-1.5 text-left text-xs font-bold text-slate-700 dark:text-slate-300 ${className}`}
    >
      {canSort ? (
        <button type="button" onClick={header.column.getToggleSortingHandler()} className="inline-flex items-center gap-1 hover:underline">
          {children}
          <span aria-hidden="true" className="text-slate-500">
            {sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}
          </span>
        </button>
      ) : (
        children
      )}
    </th>
  );
}
