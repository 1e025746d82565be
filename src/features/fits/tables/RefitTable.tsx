/** The unpenalized refit on the terms kept at the chosen lambda, with its post-selection caution. */
import { createColumnHelper } from '@tanstack/react-table';
import type { RefitDto, RefitRowDto } from '@shared/fits';
import { DataTable } from '@/components/table/DataTable';
import type { sortableFeatures } from '@/components/table/features';
import { formatStat } from '@/lib/numbers';

const helper = createColumnHelper<typeof sortableFeatures, RefitRowDto>();
const mono = (v: number | null) => <span className="font-mono">{v === null ? '–' : formatStat(v)}</span>;

export function RefitTable({ refit }: { refit: RefitDto }) {
  const stat = refit.statisticKind;
  const columns = helper.columns([
    helper.accessor('term', { header: 'Term', sortFn: 'alphanumeric', cell: (i) => <span className="font-bold">{i.getValue()}</span> }),
    helper.accessor('estimate', { header: 'Estimate', sortFn: 'basic', cell: (i) => mono(i.getValue()) }),
    helper.accessor((r) => r.standardError ?? Number.NaN, { id: 'se', header: 'Standard error', sortFn: 'basic', cell: (i) => mono(Number.isNaN(i.getValue()) ? null : i.getValue()) }),
    helper.accessor((r) => r.statistic ?? Number.NaN, { id: 'statistic', header: `${stat} value`, sortFn: 'basic', cell: (i) => mono(Number.isNaN(i.getValue()) ? null : i.getValue()) }),
    helper.accessor((r) => r.pValue ?? Number.NaN, { id: 'p', header: 'Nominal p', sortFn: 'basic', cell: (i) => mono(Number.isNaN(i.getValue()) ? null : i.getValue()) }),
  ]);
  const rows = [refit.intercept, ...refit.coefficients];
  return (
    <section aria-labelledby="refit-heading" className="space-y-2">
      <h3 id="refit-heading" className="text-base font-bold">
        Unpenalized refit on the selected terms
      </h3>
      <p role="note" className="rounded border-l-4 border-saffron-500 bg-saffron-300/15 px-3 py-2 text-sm dark:bg-saffron-500/10">
        <strong>After selection.</strong> {refit.caution}
      </p>
      {refit.status !== 'converged' && <p className="text-sm font-bold text-red-800 dark:text-red-300">{refit.message}</p>}
      {refit.aliased.length > 0 && <p className="text-sm">Left out as exact combinations of other terms: {refit.aliased.join(', ')}.</p>}
      <DataTable data={rows} columns={columns} label="Unpenalized refit" getRowId={(r) => r.term} height={320} />
      <p className="text-xs text-slate-600 dark:text-slate-400">Residual degrees of freedom: {refit.residualDf}.</p>
    </section>
  );
}
