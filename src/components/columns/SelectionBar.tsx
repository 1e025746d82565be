import type { ColumnSchema } from '@shared/datasets';
import { countFormat } from '@/lib/numbers';
import type { ColumnSelection } from './ColumnTable';

const BUTTON = 'rounded border border-slate-300 px-2 py-1 text-xs font-bold hover:bg-slate-100 disabled:opacity-50 dark:border-slate-600 dark:hover:bg-slate-800';

/**
 * Bulk choices for the predictor picker. "The shown ones" follow the search and type filter above,
 * so choosing by type or by name pattern is: filter, then add or remove what is shown.
 */
export function SelectionBar({ columns, shown, selection }: { columns: ColumnSchema[]; shown: ColumnSchema[]; selection: ColumnSelection }) {
  const available = (list: ColumnSchema[]) => list.filter((c) => (selection.unavailable?.(c) ?? null) === null).map((c) => c.name);
  const chosen = available(columns).filter((n) => selection.selected.has(n)).length;
  const shownNames = available(shown);
  const change = (add: string[], remove: string[]) => {
    const next = new Set(selection.selected);
    for (const n of remove) next.delete(n);
    for (const n of add) next.add(n);
    selection.onChange(next);
  };
  const filtered = shown.length !== columns.length;
  return (
    <div className="flex flex-wrap items-center gap-2" role="group" aria-label="Choose many columns at once">
      <span className="text-sm font-bold" aria-live="polite">
        {countFormat.format(chosen)} chosen
      </span>
      <button type="button" className={BUTTON} onClick={() => change(available(columns), [])}>
        Select all
      </button>
      <button type="button" className={BUTTON} onClick={() => change([], [...selection.selected])}>
        Select none
      </button>
      <button type="button" className={BUTTON} disabled={!filtered || shownNames.length === 0} onClick={() => change(shownNames, [])}>
        Add the {countFormat.format(shownNames.length)} shown
      </button>
      <button type="button" className={BUTTON} disabled={!filtered || shownNames.length === 0} onClick={() => change([], shownNames)}>
        Remove the {countFormat.format(shownNames.length)} shown
      </button>
    </div>
  );
}
