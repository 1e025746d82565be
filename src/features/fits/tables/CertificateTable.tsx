/** The solver's certificate for every lambda: duality gap, iterations, why it stopped, time. */
import { useMemo } from 'react';
import { createColumnHelper } from '@tanstack/react-table';
import type { FitResultsDto, LambdaCertificateDto } from '@shared/fits';
import { DataTable } from '@/components/table/DataTable';
import type { sortableFeatures } from '@/components/table/features';
import { formatStat } from '@/lib/numbers';

interface Row extends LambdaCertificateDto {
  position: number;
  lambda: number;
  nonzero: number;
}

const STATUS_WORDS: Record<LambdaCertificateDto['status'], string> = {
  converged: 'Converged',
  'iteration-limit': 'Stopped at the iteration limit',
  'numerical-failure': 'Numerical failure',
};

const helper = createColumnHelper<typeof sortableFeatures, Row>();
const COLUMNS = helper.columns([
  helper.accessor('position', { header: '#', sortFn: 'basic' }),
  helper.accessor('lambda', { header: 'Lambda', sortFn: 'basic', cell: (i) => <span className="font-mono">{formatStat(i.getValue())}</span> }),
  helper.accessor('nonzero', { header: 'Nonzero', sortFn: 'basic' }),
  helper.accessor('gap', { header: 'Gap', sortFn: 'basic', cell: (i) => <span className="font-mono">{formatStat(i.getValue(), 3)}</span> }),
  helper.accessor('tolerance', { header: 'Tolerance', sortFn: 'basic', cell: (i) => <span className="font-mono">{formatStat(i.getValue(), 2)}</span> }),
  helper.accessor('iterations', { header: 'Iterations', sortFn: 'basic' }),
  helper.accessor('status', {
    header: 'Status',
    sortFn: 'text',
    cell: (i) => (i.getValue() === 'converged' ? STATUS_WORDS.converged : <strong className="text-red-800 dark:text-red-300">{STATUS_WORDS[i.getValue()]}</strong>),
  }),
  helper.accessor('stoppingReason', { header: 'Why it stopped', sortFn: 'text', cell: (i) => <span className="text-xs">{i.getValue()}</span> }),
  helper.accessor('timeMs', { header: 'Time (ms)', sortFn: 'basic', cell: (i) => <span className="font-mono">{formatStat(i.getValue(), 3)}</span> }),
]);

export function CertificateTable({ results }: { results: FitResultsDto }) {
  const rows = useMemo(
    () => results.certificates.map((c, i) => ({ ...c, position: i + 1, lambda: results.lambda[i], nonzero: results.nonzero[i] })),
    [results],
  );
  const bad = results.unconvergedLambdas.length;
  return (
    <section aria-labelledby="certificates-heading" className="space-y-2">
      <h3 id="certificates-heading" className="text-base font-bold">
        Solver certificates
      </h3>
      <p className={`text-sm ${bad ? 'font-bold text-red-800 dark:text-red-300' : 'text-slate-700 dark:text-slate-300'}`}>
        {bad === 0
          ? `Every one of the ${rows.length} lambdas converged: its duality gap, relative to the null model, is within the tolerance.`
          : `${bad} of ${rows.length} lambdas did not converge (positions ${results.unconvergedLambdas.map((i) => i + 1).join(', ')}); their coefficients are not certified.`}
      </p>
      <DataTable data={rows} columns={COLUMNS} label="Solver certificate per lambda" getRowId={(r) => String(r.position)} rowClassName={(r) => (r.status === 'converged' ? '' : 'bg-red-50 dark:bg-red-950/40')} height={320} />
    </section>
  );
}
