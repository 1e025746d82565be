/**
 * Comparing fits (the URL holds the list, so a reviewer can link to it): key numbers and their
 * differences with standard errors, overlaid CV curves, each fit's coefficient paths, coefficients side
 * by side at each chosen lambda, what entered, left or changed sign (with stability), the spec changes.
 */
import { useState, type ReactNode } from 'react';
import { Link, useSearchParams } from 'react-router';
import { MAX_COMPARE, SELECTION_CHANGE_LABELS, type ComparisonDto } from '@shared/compare';
import type { FitDetailDto } from '@shared/fits';
import { paths } from '@/app/paths';
import { Button } from '@/components/Button';
import { Cautions } from '@/components/Cautions';
import { SelectField } from '@/components/Field';
import { Loading } from '@/components/Loading';
import { Notice } from '@/components/Notice';
import { PageHeader } from '@/components/PageHeader';
import { formatShare, formatStat } from '@/lib/numbers';
import { useCurrentWorkspace } from '@/lib/workspace-context';
import { useComparedFits } from '../api/compared-fits';
import { useComparison } from '../api/comparison';
import { useModelList, useModelVersions } from '../api/models';
import { CompareCvChart } from './CompareCvChart';

const CELL = 'border-b border-slate-100 px-2 py-1 dark:border-slate-800';

/** `renderPaths`: the app passes the fits feature's path chart (features don't import each other). */
export function ComparePage({ renderPaths }: { renderPaths?: (fit: FitDetailDto) => ReactNode }) {
  const { workspaceId } = useCurrentWorkspace();
  const [params, setParams] = useSearchParams();
  const ids = (params.get('fits') ?? '').split(',').filter(Boolean);
  const setIds = (next: string[]) => setParams(next.length ? { fits: next.join(',') } : {});
  const comparison = useComparison(workspaceId, ids);
  const details = useComparedFits(workspaceId, ids);
  const fits = details.map((d) => d.data).filter((d): d is FitDetailDto => Boolean(d));
  return (
    <>
      <PageHeader title="Compare fits" description="Versions of one model, or models on the same outcome. The first fit is the baseline; copy the address to share this comparison." />
      <div className="space-y-6">
        <FitPicker workspaceId={workspaceId} ids={ids} onChange={setIds} />
        {ids.length < 2 && <Notice>Add at least two finished fits.</Notice>}
        {comparison.isFetching && <Loading label="Comparing…" />}
        {comparison.error && <Notice tone="error">{comparison.error.message}</Notice>}
        {comparison.data && <ComparisonTables c={comparison.data} workspaceId={workspaceId} />}
        {comparison.data && fits.length === ids.length && <CompareCvChart fits={fits} />}
        {comparison.data && renderPaths && fits.length === ids.length && (
          <div className="grid gap-4 lg:grid-cols-2">
            {fits.map((f) => (
              <div key={f.id}>
                <h3 className="text-sm font-bold">
                  {f.modelName}, version {f.version}
                </h3>
                {renderPaths(f)}
              </div>
            ))}
          </div>
        )}
        {comparison.data && <Cautions />}
      </div>
    </>
  );
}

function FitPicker({ workspaceId, ids, onChange }: { workspaceId: string; ids: string[]; onChange: (ids: string[]) => void }) {
  const models = useModelList(workspaceId);
  const [modelId, setModelId] = useState('');
  const [fitId, setFitId] = useState('');
  const versions = useModelVersions(workspaceId, modelId);
  const finished = (versions.data?.versions ?? []).filter((v) => v.status === 'finished' && !ids.includes(v.id));
  return (
    <section aria-label="Fits to compare" className="flex flex-wrap items-end gap-3 rounded-lg border border-slate-200 bg-white p-4 dark:border-slate-800 dark:bg-slate-900">
      <SelectField label="Model" value={modelId} onChange={(e) => setModelId(e.target.value)} options={[{ value: '', label: 'Choose a model' }, ...(models.data ?? []).map((m) => ({ value: m.id, label: m.name }))]} />
      <SelectField label="Version" value={fitId} disabled={!modelId} onChange={(e) => setFitId(e.target.value)} options={[{ value: '', label: 'Choose a version' }, ...finished.map((v) => ({ value: v.id, label: `Version ${v.version}` }))]} />
      <Button
        variant="secondary"
        disabled={!fitId || ids.length >= MAX_COMPARE}
        onClick={() => {
          onChange([...ids, fitId]);
          setFitId('');
        }}
      >
        Add to the comparison
      </Button>
      {ids.length > 0 && (
        <Button variant="quiet" onClick={() => onChange([])}>
          Clear
        </Button>
      )}
    </section>
  );
}

function ComparisonTables({ c, workspaceId }: { c: ComparisonDto; workspaceId: string }) {
  const name = (k: number) => `${c.fits[k].modelName} v${c.fits[k].version}`;
  return (
    <div className="space-y-6">
      <section aria-labelledby="fits-heading" className="overflow-x-auto">
        <h2 id="fits-heading" className="text-base font-bold">
          The fits at their chosen lambdas
        </h2>
        <table className="mt-2 border-collapse text-sm">
          <thead>
            <tr className="text-left">
              <th className={CELL}>Fit</th>
              <th className={CELL}>Data</th>
              <th className={CELL}>Lambda (rule)</th>
              <th className={CELL}>Terms</th>
              <th className={CELL}>Deviance explained</th>
              <th className={CELL}>CV error ± SE</th>
              <th className={CELL}>Holdout</th>
            </tr>
          </thead>
          <tbody>
            {c.fits.map((f, k) => (
              <tr key={f.id}>
                <td className={CELL}>
                  <Link className="underline" to={paths.workspace.fit.getHref(workspaceId, f.id)}>
                    {name(k)}
                  </Link>
                  {k === 0 && <span className="ml-1 text-xs text-slate-500">(baseline)</span>}
                  {f.unconverged && <span className="ml-1 text-xs font-bold text-red-700">did not converge everywhere</span>}
                </td>
                <td className={CELL}>
                  {f.datasetVersion.datasetName} v{f.datasetVersion.number}
                </td>
                <td className={`${CELL} font-mono`}>
                  {formatStat(f.chosen.lambda)} ({f.chosen.rule})
                </td>
                <td className={CELL}>{f.nonzero}</td>
                <td className={CELL}>{formatShare(f.devianceExplained)}</td>
                <td className={`${CELL} font-mono`}>{f.cv ? `${formatStat(f.cv.mean)} ± ${formatStat(f.cv.standardError)} (${f.cv.metric})` : '—'}</td>
                <td className={CELL}>{f.holdout ? f.holdout.metrics.map((m) => `${m.name} ${formatStat(m.value)}`).join(', ') : '—'}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>

      {c.pairs.map((p) => (
        <section key={p.other} aria-label={`${name(p.other)} against ${name(0)}`} className="space-y-3 rounded-lg border border-slate-200 bg-white p-4 dark:border-slate-800 dark:bg-slate-900">
          <h2 className="text-base font-bold">
            {name(p.other)} against {name(0)}
          </h2>
          {p.notes.map((n) => (
            <Notice key={n}>{n}</Notice>
          ))}
          <table className="border-collapse text-sm">
            <caption className="text-left font-bold">Differences ({name(p.other)} minus the baseline)</caption>
            <tbody>
              {p.metrics.map((m) => (
                <tr key={m.name}>
                  <th className={`${CELL} text-left`}>{m.name}</th>
                  <td className={`${CELL} font-mono`}>{formatStat(m.difference)}</td>
                  <td className={`${CELL} font-mono`}>{m.standardError === null ? '' : `± ${formatStat(m.standardError)}`}</td>
                  <td className={`${CELL} text-xs text-slate-500`}>{m.lowerIsBetter ? 'lower is better' : 'higher is better'}</td>
                </tr>
              ))}
            </tbody>
          </table>
          <p className="text-xs text-slate-500">The standard error of a CV difference treats the two estimates as independent; fits scored on the same folds are correlated, so it overstates the uncertainty.</p>
          <h3 className="font-bold">Selected variables</h3>
          {p.selection.length === 0 ? (
            <p className="text-sm">The same terms are kept, with the same signs.</p>
          ) : (
            <table className="border-collapse text-sm">
              <thead>
                <tr className="text-left">
                  <th className={CELL}>Term</th>
                  <th className={CELL}>Change</th>
                  <th className={CELL}>Baseline</th>
                  <th className={CELL}>Other</th>
                  <th className={CELL}>Stability (baseline → other)</th>
                </tr>
              </thead>
              <tbody>
                {p.selection.map((s) => (
                  <tr key={`${s.kind}${s.term}`}>
                    <td className={`${CELL} font-mono`}>{s.term}</td>
                    <td className={CELL}>{SELECTION_CHANGE_LABELS[s.kind]}</td>
                    <td className={`${CELL} font-mono`}>{s.baseline === null ? 'not a term' : formatStat(s.baseline)}</td>
                    <td className={`${CELL} font-mono`}>{s.other === null ? 'not a term' : formatStat(s.other)}</td>
                    <td className={CELL}>
                      {s.baselineStability === null ? '—' : formatShare(s.baselineStability)} → {s.otherStability === null ? '—' : formatShare(s.otherStability)}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
          <h3 className="font-bold">Spec changes</h3>
          {p.specChanges.length === 0 ? <p className="text-sm">Same spec.</p> : (
            <ul className="list-disc pl-5 text-sm">
              {p.specChanges.map((s) => (
                <li key={s.field}>{s.summary}</li>
              ))}
            </ul>
          )}
        </section>
      ))}

      <section aria-labelledby="coefs-heading" className="overflow-x-auto">
        <h2 id="coefs-heading" className="text-base font-bold">
          Coefficients side by side (original scale, each at its chosen lambda)
        </h2>
        <table className="mt-2 border-collapse text-sm">
          <thead>
            <tr className="text-left">
              <th className={CELL}>Term</th>
              {c.fits.map((f, k) => (
                <th key={f.id} className={CELL}>
                  {name(k)}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {c.terms
              .filter((t) => t.values.some((v) => v !== null && v !== 0))
              .map((t) => (
                <tr key={t.term}>
                  <td className={`${CELL} font-mono`}>{t.term}</td>
                  {t.values.map((v, k) => (
                    <td key={k} className={`${CELL} font-mono`}>
                      {v === null ? '—' : v === 0 ? '0' : formatStat(v)}
                      {t.stability[k] !== null && v !== null && <span className="ml-1 text-xs text-slate-500">({formatShare(t.stability[k])})</span>}
                    </td>
                  ))}
                </tr>
              ))}
          </tbody>
        </table>
      </section>
    </div>
  );
}
