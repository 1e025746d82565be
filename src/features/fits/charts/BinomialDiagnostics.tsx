import { useMemo, useState } from 'react';
import type { BinomialDiagnosticsDto } from '@shared/fits';
import { countFormat, formatShare, formatStat } from '@/lib/numbers';
import { confusionAt } from './diagnosticsData';
import { Metric } from './GaussianDiagnostics';
import { ScatterChart } from './ScatterChart';

/** ROC curve with its AUC, the calibration plot, and a confusion table at a threshold the reader moves. */
export function BinomialDiagnostics({ d }: { d: BinomialDiagnosticsDto }) {
  const [threshold, setThreshold] = useState(0.5);
  const roc = useMemo(() => d.roc.map((p) => ({ x: p.falsePositiveRate, y: p.truePositiveRate })), [d.roc]);
  const calibration = useMemo(() => d.calibration.map((b) => ({ x: b.meanPredicted, y: b.observedShare })), [d.calibration]);
  const c = useMemo(() => confusionAt(d.probabilities, d.observed, threshold), [d, threshold]);
  const total = c.truePositive + c.falsePositive + c.trueNegative + c.falseNegative;
  // The outcome's own level names; 1 / 0 for a numeric outcome (older fits stored only the 1 level).
  const yes = d.positiveClass ?? '1';
  const no = d.negativeClass ?? (d.positiveClass === null ? '0' : `not ${d.positiveClass}`);
  return (
    <div className="space-y-3">
      <dl className="flex flex-wrap gap-6 text-sm">
        <Metric name="AUC" value={formatStat(d.auc)} />
        <Metric name="Rows" value={`${countFormat.format(d.rowCount)} ${d.rows === 'holdout' ? 'held-out rows' : 'rows fitted'}`} />
      </dl>
      <div className="grid gap-4 lg:grid-cols-2">
        <ScatterChart id="roc" title={`ROC curve (AUC ${formatStat(d.auc, 3)})`} description="True against false positive rate as the threshold moves; the dashed diagonal is guessing." points={roc} line xLabel="False positive rate" yLabel="True positive rate" reference={{ from: [0, 0], to: [1, 1] }} domain={{ x: [0, 1], y: [0, 1] }} />
        <ScatterChart id="calibration" title="Calibration" description="Rows binned by predicted probability: the observed share against the mean prediction. On the dashed line, predictions mean what they say." points={calibration} line xLabel="Mean predicted probability" yLabel="Observed share" reference={{ from: [0, 0], to: [1, 1] }} domain={{ x: [0, 1], y: [0, 1] }} />
      </div>
      <section aria-labelledby="confusion-heading" className="rounded-lg border border-slate-200 bg-white p-4 dark:border-slate-800 dark:bg-slate-900">
        <h3 id="confusion-heading" className="text-base font-bold">
          Confusion table
        </h3>
        <label className="mt-2 flex items-center gap-3 text-sm">
          <span>Threshold</span>
          <input type="range" min={0.01} max={0.99} step={0.01} value={threshold} onChange={(e) => setThreshold(Number(e.target.value))} aria-valuetext={threshold.toFixed(2)} />
          <span className="font-mono">{threshold.toFixed(2)}</span>
        </label>
        <table className="mt-3 border-collapse text-sm">
          <caption className="sr-only">Predicted against observed at threshold {threshold.toFixed(2)}</caption>
          <thead>
            <tr>
              <td />
              <th scope="col" className="px-3 py-1 text-left">Predicted {yes}</th>
              <th scope="col" className="px-3 py-1 text-left">Predicted {no}</th>
            </tr>
          </thead>
          <tbody className="font-mono">
            <tr>
              <th scope="row" className="px-3 py-1 text-left font-sans">Observed {yes}</th>
              <td className="px-3 py-1">{countFormat.format(c.truePositive)}</td>
              <td className="px-3 py-1">{countFormat.format(c.falseNegative)}</td>
            </tr>
            <tr>
              <th scope="row" className="px-3 py-1 text-left font-sans">Observed {no}</th>
              <td className="px-3 py-1">{countFormat.format(c.falsePositive)}</td>
              <td className="px-3 py-1">{countFormat.format(c.trueNegative)}</td>
            </tr>
          </tbody>
        </table>
        <p className="mt-2 text-xs text-slate-600 dark:text-slate-400">
          Accuracy {formatShare(total ? (c.truePositive + c.trueNegative) / total : NaN)} · sensitivity {formatShare(c.truePositive / (c.truePositive + c.falseNegative))} · specificity{' '}
          {formatShare(c.trueNegative / (c.trueNegative + c.falsePositive))} over {countFormat.format(total)} rows{total < d.rowCount ? ' (a sample)' : ''}.
        </p>
      </section>
    </div>
  );
}
