import { useState } from 'react';
import type { UseFormReturn } from 'react-hook-form';
import { DEFAULT_PATH_LENGTH, MAX_PATH_DECADES, MIN_PATH_DECADES, type FitRequestInput } from '@shared/fits';
import { parseLambdas } from './fitFormModel';
import { errorAt, FieldError, FormSection, INPUT, optionalNumber } from './fitFormParts';

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
          <input type="radio" checked={kind === 'automatic'} onChange={() => form.setValue('path', { kind: 'automatic', pathLength: DEFAULT_PATH_LENGTH }, { shouldValidate: true })} />
          Automatic path
        </label>
        <label className="flex items-center gap-2">
          <input
            type="radio"
            checked={kind === 'explicit'}
            onChange={() => form.setValue('path', { kind: 'explicit', lambdas: parseLambdas(lambdaText) }, { shouldValidate: true })}
          />
          My own lambdas
        </label>
      </div>
      {kind === 'automatic' ? (
        <div className="grid gap-3 sm:grid-cols-3">
          <label className="space-y-1 text-sm">
            <span className="block font-bold">Number of lambdas</span>
            <input type="number" className={`${INPUT} w-28`} {...form.register('path.pathLength', { setValueAs: optionalNumber })} />
            <FieldError message={err('path.pathLength')} />
          </label>
          <label className="space-y-1 text-sm">
            <span className="block font-bold">Decades below the largest lambda</span>
            <input type="number" step="0.5" placeholder="Lariat's default" className={`${INPUT} w-32`} {...form.register('path.pathDecades', { setValueAs: optionalNumber })} />
            <span className="block text-xs text-slate-600 dark:text-slate-400">
              {MIN_PATH_DECADES} to {MAX_PATH_DECADES}; empty for the default.
            </span>
            <FieldError message={err('path.pathDecades')} />
          </label>
          <label className="space-y-1 text-sm">
            <span className="block font-bold">Stop after this many terms</span>
            <input type="number" placeholder="no limit" className={`${INPUT} w-28`} {...form.register('path.maxTerms', { setValueAs: optionalNumber })} />
            <FieldError message={err('path.maxTerms')} />
          </label>
        </div>
      ) : (
        <label className="block space-y-1 text-sm">
          <span className="block font-bold">Lambdas, largest first</span>
          <input
            className={`${INPUT} w-full`}
            value={lambdaText}
            placeholder="e.g. 1, 0.5, 0.1, 0.05"
            onChange={(e) => {
              setLambdaText(e.target.value);
              form.setValue('path', { kind: 'explicit', lambdas: parseLambdas(e.target.value) }, { shouldValidate: true });
            }}
          />
          <FieldError message={err('path.lambdas') ?? firstLambdaError(errors)} />
        </label>
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
