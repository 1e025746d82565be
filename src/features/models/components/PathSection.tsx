import { useState } from 'react';
import type { UseFormReturn } from 'react-hook-form';
import { DEFAULT_PATH_LENGTH, MAX_PATH_DECADES, MIN_PATH_DECADES, type FitRequestInput } from '@shared/fits';
import { parseLambdas } from './fitFormModel';
import { FormSection, LabeledField, INPUT, errorAt, optionalNumber, setAndValidate } from './fitFormParts';

/** The lambda path: Lariat's automatic log-spaced path (length, decades, term limit) or the analyst's own list. */
export function PathSection({ form, extra }: { form: UseFormReturn<FitRequestInput>; extra: Record<string, string> }) {
  const { errors } = form.formState;
  const path = form.watch('path');
  const kind = path?.kind ?? 'automatic';
  const [lambdaText, setLambdaText] = useState(path?.kind === 'explicit' ? path.lambdas.join(', ') : '');
  const err = (p: string) => errorAt(errors, extra, p);
  return (
    <FormSection title="Lambda path" hint="Fits run from the strongest penalty (no predictors) towards the weakest; cross-validation then compares them.">
      <div role="radiogroup" aria-label="How the lambdas are laid out" className="flex flex-wrap gap-4 text-sm">
        <label className="flex items-center gap-2">
          <input type="radio" checked={kind === 'automatic'} onChange={() => setAndValidate(form, 'path', { kind: 'automatic', pathLength: DEFAULT_PATH_LENGTH })} />
          Automatic path
        </label>
        <label className="flex items-center gap-2">
          <input
            type="radio"
            checked={kind === 'explicit'}
            onChange={() => setAndValidate(form, 'path', { kind: 'explicit', lambdas: parseLambdas(lambdaText) })}
          />
          My own lambdas
        </label>
      </div>
      {kind === 'automatic' ? (
        <div className="grid gap-3 sm:grid-cols-3">
          <LabeledField id="fit-number-of-lambdas" label="Number of lambdas" error={err('path.pathLength')}>
            {(a) => (
              <>
                <input {...a} type="number" className={`${INPUT} w-28`} {...form.register('path.pathLength', { setValueAs: optionalNumber })} />
              </>
            )}
          </LabeledField>
          <LabeledField id="fit-decades-below-the-largest-lambda" label="Decades below the largest lambda" error={err('path.pathDecades')}>
            {(a) => (
              <>
                <input {...a} type="number" step="0.5" placeholder="Lariat's default" className={`${INPUT} w-32`} {...form.register('path.pathDecades', { setValueAs: optionalNumber })} />
                <span className="block text-xs text-slate-600 dark:text-slate-400">
                  {MIN_PATH_DECADES} to {MAX_PATH_DECADES}; empty for the default.
                </span>
              </>
            )}
          </LabeledField>
          <LabeledField id="fit-stop-after-this-many-terms" label="Stop after this many terms" error={err('path.maxTerms')}>
            {(a) => (
              <>
                <input {...a} type="number" placeholder="no limit" className={`${INPUT} w-28`} {...form.register('path.maxTerms', { setValueAs: optionalNumber })} />
              </>
            )}
          </LabeledField>
        </div>
      ) : (
        <LabeledField id="fit-lambdas-largest-first" label="Lambdas, largest first" error={err('path.lambdas') ?? firstLambdaError(errors)} className="block">
          {(a) => (
            <>
              <input {...a}
                className={`${INPUT} w-full`}
                value={lambdaText}
                placeholder="e.g. 1, 0.5, 0.1, 0.05"
                onChange={(e) => {
                  setLambdaText(e.target.value);
                  setAndValidate(form, 'path', { kind: 'explicit', lambdas: parseLambdas(e.target.value) });
                }}
              />
            </>
          )}
        </LabeledField>
      )}
    </FormSection>
  );
}

/** An issue on one list entry (e.g. "path.lambdas.2") names the entry. */
function firstLambdaError(errors: UseFormReturn<FitRequestInput>['formState']['errors']): string | undefined {
  const list = (errors.path as { lambdas?: Record<string, { message?: string }> } | undefined)?.lambdas;
  if (!list) return undefined;
  for (const [i, e] of Object.entries(list)) if (/^\d+$/.test(i) && e?.message) return `Lambda ${Number(i) + 1}: ${e.message === 'Invalid input: expected number, received NaN' ? 'not a number.' : e.message}`;
  return undefined;
}
