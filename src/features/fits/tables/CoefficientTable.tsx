/**
 * The coefficients at the chosen lambda, on the original and the standardized scale, with the share
 * of CV folds that keep each term (selection stability) and its group. Sortable; nonzero-only by default.
 */
import { useMemo, useState } from 'react';
import { createColumnHelper } from '@tanstack/react-table';
import type { FitResultsDto } from '@shared/fits';
import { DataTable } from '@/components/table/DataTable';
import type { sortableFeatures } from '@/components/table/features';
import { countFormat, formatShare, formatStat } from '@/lib/numbers';

interface Row {
  term: string;
  column: string;
  group: string;
  value: number;
  standardized: number;
  stability: number | null;
}

const helper = createColumnHelper<typeof sortableFeatures, Row>();
const num = (v: number) => <span className="font-mono">{formatStat(v)}</span>;

export function CoefficientTable({ results, index }: { results: FitResultsDto; index: number }) {
  const [nonzeroOnly, setNonzeroOnly] = useState(true);
  const [search, setSearch] = useState('');
  const hasGroups = results.termGroups.some((g) => g !== null);
  const all = useMemo(() => {
    const value = new Float64Array(results.terms.length);
    const standardized = new Float64Array(results.terms.length);
    const c = results.coefficients[index];
    const s = results.standardizedCoefficients[index];
    c.terms.forEach((j, k) => (value[j] = c.values[k]));
    s.terms.forEach((j, k) => (standardized[j] = s.values[k]));
    return results.terms.map((term, j) => ({
      term,
      column: results.termColumns[j],
      group: results.termGroups[j] ?? '',
      value: value[j],
      standardized: standardized[j],
      stability: results.stability ? results.stability[j] : null,
    }));
  }, [results, index]);
  const rows = useMemo(() => {
    const q = search.trim().toLowerCase();
    return all.filter((r) => (!nonzeroOnly || r.value !== 0) && (!q || r.term.toLowerCase().includes(q)));
  }, [all, nonzeroOnly, search]);
  const columns = useMemo(
    () =>
      helper.columns([
        helper.accessor('term', { header: 'Term', sortFn: 'alphanumeric', cell: (i) => <span className="font-bold">{i.getValue()}</span> }),
        ...(hasGroups ? [helper.accessor('group', { header: 'Group', sortFn: 'alphanumeric' })] : []),
        helper.accessor('value', { header: 'Coefficient', sortFn: 'basic', cell: (i) => num(i.getValue()) }),
        helper.accessor('standardized', { header: 'Standardized', sortFn: 'basic', cell: (i) => num(i.getValue()) }),
        helper.accessor((r) => Math.abs(r.standardized), { id: 'size', header: '|Standardized|', sortFn: 'basic', cell: (i) => num(i.getValue()) }),
        ...(results.stability
          ? [
              helper.accessor((r) => r.stability ?? 0, {
                id: 'stability',
                header: 'Kept in folds',
                sortFn: 'basic',
                cell: (i) => <StabilityBar share={i.getValue()} />,
              }),
            ]
          : []),
      ]),
    [hasGroups, results.stability],
  );
  const nonzero = all.filter((r) => r.value !== 0).length;
  return (
    <section aria-labelledby="coefficients-heading" className="space-y-2">
      <h3 id="coefficients-heading" className="text-base font-bold">
        Coefficients at the chosen lambda
      </h3>
      <p className="text-xs text-slate-600 dark:text-slate-400">
        {countFormat.format(nonzero)} of {countFormat.format(all.length)} terms are nonzero. Standardized: per standard deviation of the term, comparable across terms.
        {results.stability && ' Kept in folds: the share of cross-validation fits at this lambda that keep the term (selection stability).'}
      </p>
      <div className="flex flex-wrap items-center gap-4 text-sm">
        <label className="flex items-center gap-2">
          <input type="checkbox" checked={nonzeroOnly} onChange={(e) => setNonzeroOnly(e.target.checked)} />
          Nonzero terms only
        </label>
        <label className="flex items-center gap-2">
          <span>Find a term</span>
          <input type="search" value={search} onChange={(e) => setSearch(e.target.value)} className="w-40 rounded border border-slate-300 px-2 py-0.5 dark:border-slate-700 dark:bg-slate-950" />
        </label>
      </div>
      <DataTable data={rows} columns={columns} label="Coefficients at the chosen lambda" getRowId={(r) => r.term} initialSorting={[{ id: 'size', desc: true }]} />
    </section>
  );
}

function StabilityBar({ share }: { share: number }) {
  return (
    <span className="flex items-center gap-2">
      <span aria-hidden="true" className="inline-block h-2 w-16 rounded-sm bg-slate-200 dark:bg-slate-700">
        <span className="block h-2 rounded-sm bg-lariat-600 dark:bg-lariat-300" style={{ width: `${Math.round(share * 100)}%` }} />
      </span>
      <span className="font-mono">{formatShare(share)}</span>
    </span>
  );
}
