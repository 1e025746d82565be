import type { UseFormReturn } from 'react-hook-form';
import type { ColumnSchema } from '@shared/datasets';
import type { FitFamily } from '@shared/models';
import {
  CV_METRIC_LABELS,
  CV_METRICS_BY_FAMILY,
  DEFAULT_FOLDS,
  DEFAULT_SEED,
  MAX_HOLDOUT_SHARE,
  MIN_HOLDOUT_SHARE,
  MISSING_POLICIES,
  MISSING_POLICY_LABELS,
  type FitRequestInput,
} from '@shared/fits';
import { FormSection, LabeledField, INPUT, errorAt, optionalNumber, setAndValidate } from './fitFormParts';

interface Props {
  form: UseFormReturn<FitRequestInput>;
  columns: ColumnSchema[];
  family: FitFamily;
  extra: Record<string, string>;
}

/** Cross-validation (folds and seed, or a fold column), the measure, missing values, and a holdout split. */
export function CvSection({ form, columns, family, extra }: Props) {
  const { errors } = form.formState;
  const cv = form.watch('cv');
  const holdout = form.watch('holdout');
  const kind = cv?.kind ?? 'folds';
  const err = (p: string) => errorAt(errors, extra, p);
  const foldColumns = columns.filter((c) => !c.excluded || c.type === 'identifier' || c.type === 'numeric' || c.type === 'categorical');
  const setCv = (next: FitRequestInput['cv']) => {
    setAndValidate(form, 'cv', next);
    if (next?.kind === 'none') setAndValidate(form, 'metric', undefined);
  };
  return (
    <FormSection title="Choosing lambda" hint="Cross-validation fits each fold without its held-out rows and measures the error on them.">
      <div role="radiogroup" aria-label="Cross-validation" className="flex flex-wrap gap-4 text-sm">
        <label className="flex items-center gap-2">
          <input type="radio" checked={kind === 'folds'} onChange={() => setCv({ kind: 'folds', folds: DEFAULT_FOLDS, seed: DEFAULT_SEED })} />
          Random folds
        </label>
        <label className="flex items-center gap-2">
          <input type="radio" checked={kind === 'column'} onChange={() => setCv({ kind: 'column', column: '' })} />
          Folds from a column
        </label>
        <label className="flex items-center gap-2">
          <input type="radio" checked={kind === 'none'} onChange={() => setCv({ kind: 'none' })} />
          No cross-validation
        </label>
      </div>
      {kind === 'folds' && (
        <div className="flex flex-wrap gap-4">
          <LabeledField id="fit-folds" label="Folds" error={err('cv.folds')}>
            {(a) => (
              <>
                <input {...a} type="number" className={`${INPUT} w-24`} {...form.register('cv.folds', { setValueAs: optionalNumber })} />
              </>
            )}
          </LabeledField>
          <LabeledField id="fit-seed" label="Seed" error={err('cv.seed')}>
            {(a) => (
              <>
                <input {...a} type="number" className={`${INPUT} w-32`} {...form.register('cv.seed', { setValueAs: optionalNumber })} />
              </>
            )}
          </LabeledField>
        </div>
      )}
      {kind === 'column' && (
        <LabeledField id="fit-fold-column" label="Fold column" error={err('cv.column')} className="block">
          {(a) => (
            <>
              <select {...a} className={INPUT} {...form.register('cv.column')}>
                <option value="">Choose a column</option>
                {foldColumns.map((c) => (
                  <option key={c.name} value={c.name}>
                    {c.name}
                  </option>
                ))}
              </select>
              <span className="block text-xs text-slate-600 dark:text-slate-400">Whole-number fold ids; the column is not used as a predictor.</span>
            </>
          )}
        </LabeledField>
      )}
      <div className="flex flex-wrap gap-4">
        <LabeledField id="fit-measure" label="Measure" error={err('metric')}>
          {(a) => (
            <>
              <select {...a} className={INPUT} disabled={kind === 'none'} {...form.register('metric', { setValueAs: (v) => (v === '' ? undefined : v) })}>
                <option value="">Default ({CV_METRIC_LABELS[CV_METRICS_BY_FAMILY[family][0]]})</option>
                {CV_METRICS_BY_FAMILY[family].map((m) => (
                  <option key={m} value={m}>
                    {CV_METRIC_LABELS[m]}
                  </option>
                ))}
              </select>
            </>
          )}
        </LabeledField>
        <label className="space-y-1 text-sm">
          <span className="block font-bold">Missing values</span>
          <select className={INPUT} {...form.register('missing')}>
            {MISSING_POLICIES.map((m) => (
              <option key={m} value={m}>
                {MISSING_POLICY_LABELS[m]}
              </option>
            ))}
          </select>
        </label>
      </div>
      <label className="flex items-center gap-2 text-sm">
        <input
          type="checkbox"
          checked={holdout !== undefined}
          onChange={(e) => setAndValidate(form, 'holdout', e.target.checked ? { share: 0.2, seed: DEFAULT_SEED } : undefined)}
        />
        Set rows aside as a holdout and score the chosen fit on them
      </label>
      {holdout !== undefined && (
        <div className="flex flex-wrap gap-4 pl-6">
          <LabeledField id="fit-share-held-out" label="Share held out" error={err('holdout.share')}>
            {(a) => (
              <>
                <input {...a} type="number" step="0.05" className={`${INPUT} w-24`} {...form.register('holdout.share', { setValueAs: optionalNumber })} />
                <span className="block text-xs text-slate-600 dark:text-slate-400">
                  {MIN_HOLDOUT_SHARE} to {MAX_HOLDOUT_SHARE}
                </span>
              </>
            )}
          </LabeledField>
          <LabeledField id="fit-holdout-seed" label="Holdout seed" error={err('holdout.seed')}>
            {(a) => (
              <>
                <input {...a} type="number" className={`${INPUT} w-32`} {...form.register('holdout.seed', { setValueAs: optionalNumber })} />
              </>
            )}
          </LabeledField>
        </div>
      )}
    </FormSection>
  );
}
