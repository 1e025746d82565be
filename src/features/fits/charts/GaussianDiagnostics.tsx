import { useMemo } from 'react';
import type { GaussianDiagnosticsDto } from '@shared/fits';
import { countFormat, formatStat } from '@/lib/numbers';
import { qqPoints } from './diagnosticsData';
import { ScatterChart } from './ScatterChart';

/** Residuals against fitted values and the normal Q-Q plot, with R squared and RMSE. */
export function GaussianDiagnostics({ d }: { d: GaussianDiagnosticsDto }) {
  const scatter = useMemo(() => d.fitted.map((x, i) => ({ x, y: d.residual[i] })), [d]);
  const qq = useMemo(() => qqPoints(d.residual), [d.residual]);
  const lo = Math.min(...d.fitted);
  const hi = Math.max(...d.fitted);
  const qlo = qq.length ? Math.min(qq[0].x, qq[0].y) : -3;
  const qhi = qq.length ? Math.max(qq[qq.length - 1].x, qq[qq.length - 1].y) : 3;
  const rows = d.rows === 'holdout' ? 'held-out rows' : 'rows fitted';
  return (
    <div className="space-y-3">
      <dl className="flex flex-wrap gap-6 text-sm">
        <Metric name="R squared" value={formatStat(d.rSquared)} />
        <Metric name="RMSE" value={formatStat(d.rmse)} />
        <Metric name="Rows" value={`${countFormat.format(d.rowCount)} ${rows}${d.fitted.length < d.rowCount ? ` (${countFormat.format(d.fitted.length)} drawn)` : ''}`} />
      </dl>
      <div className="grid gap-4 lg:grid-cols-2">
        <ScatterChart id="residuals" title="Residuals against fitted values" description="A shapeless band around zero is what a good fit looks like; a curve or a funnel is not." points={scatter} xLabel="Fitted value" yLabel="Residual" reference={{ from: [lo, 0], to: [hi, 0] }} />
        <ScatterChart id="qq" title="Normal Q-Q plot of the residuals" description="Standardized residuals against normal quantiles; points off the dashed line show heavy tails or skew." points={qq} xLabel="Normal quantile" yLabel="Standardized residual" reference={{ from: [qlo, qlo], to: [qhi, qhi] }} />
      </div>
    </div>
  );
}

export function Metric({ name, value }: { name: string; value: string }) {
  return (
    <div>
      <dt className="text-xs text-slate-600 dark:text-slate-400">{name}</dt>
      <dd className="font-mono font-bold">{value}</dd>
    </div>
  );
}
