import { useState } from 'react';
import type { UseFormReturn } from 'react-hook-form';
import type { ColumnSchema } from '@shared/datasets';
import { PENALTIES, PENALTY_LABELS, type FitRequestInput } from '@shared/fits';
import { categoricalGroups } from './fitFormModel';
import { errorAt, FieldError, firstErrorUnder, FormSection, INPUT, optionalNumber } from './fitFormParts';

const HINTS = {
  lasso: 'Sets small effects exactly to zero: a short list of predictors.',
  'elastic-net': 'Mixes the lasso with a ridge penalty: correlated predictors enter together.',
  'group-lasso': 'Keeps or drops whole groups (e.g. all levels of a category) together.',
} as const;

/** Penalty, the elastic-net L1 share, the group-lasso groups, and standardization. */
export function PenaltySection({ form, columns, extra }: { form: UseFormReturn<FitRequestInput>; columns: ColumnSchema[]; extra: Record<string, string> }) {
  const { errors } = form.formState;
  const penalty = form.watch('penalty');
  const l1Error = errorAt(errors, extra, 'l1Share');
  // One registration for the radio group: react-hook-form keeps one set of options per field name.
  const penaltyField = form.register('penalty', {
    onChange: (e: { target: { value: string } }) => {
      const p = e.target.value;
      // Fields of the other penalties do not apply: clear them so the schema does not object.
      if (p !== 'elastic-net') form.setValue('l1Share', undefined);
      if (p !== 'group-lasso') form.setValue('groups', undefined);
      else form.setValue('groups', categoricalGroups(columns, form.getValues('predictors')));
      void form.trigger(['l1Share', 'groups']);
    },
  });
  return (
    <FormSection title="Penalty">
      <div role="radiogroup" aria-label="Penalty" className="grid gap-2 sm:grid-cols-3">
        {PENALTIES.map((p) => (
          <label key={p} className="flex gap-2 rounded-md border border-slate-200 p-3 text-sm has-[:checked]:border-lariat-600 has-[:checked]:bg-lariat-50 dark:border-slate-700 dark:has-[:checked]:bg-lariat-950">
            <input type="radio" value={p} {...penaltyField} />
            <span>
              <span className="font-bold">{PENALTY_LABELS[p]}</span>
              <span className="block text-xs text-slate-600 dark:text-slate-400">{HINTS[p]}</span>
            </span>
          </label>
        ))}
      </div>
      {penalty === 'elastic-net' && (
        <div className="space-y-1">
          <label className="flex flex-wrap items-center gap-2 text-sm">
            <span className="font-bold">L1 share</span>
            <input type="number" step="0.05" min="0" max="1" className={`${INPUT} w-24`} aria-invalid={l1Error ? true : undefined} aria-describedby="l1-hint" {...form.register('l1Share', { setValueAs: optionalNumber })} />
          </label>
          <p id="l1-hint" className="text-xs text-slate-600 dark:text-slate-400">
            Between 0 and 1: 1 is the lasso; smaller values give more weight to the ridge part. Required for elastic net.
          </p>
          <FieldError message={l1Error} />
        </div>
      )}
      {penalty !== 'elastic-net' && <FieldError message={l1Error} />}
      {penalty === 'group-lasso' && <GroupsEditor form={form} />}
      {penalty !== 'group-lasso' && <FieldError message={firstErrorUnder(errors, 'groups')} />}
      <label className="flex items-center gap-2 text-sm">
        <input type="checkbox" {...form.register('standardize')} />
        Standardize predictors before fitting (the penalty then treats every predictor alike; results are reported on both scales)
      </label>
    </FormSection>
  );
}

/** One line per group: its name and its columns (comma-separated). Starts from the categorical predictors. */
function GroupsEditor({ form }: { form: UseFormReturn<FitRequestInput> }) {
  const groups = form.watch('groups') ?? {};
  const [draftName, setDraftName] = useState('');
  const entries = Object.entries(groups);
  const set = (next: Record<string, string[]>) => form.setValue('groups', next, { shouldValidate: true });
  const error = firstErrorUnder(form.formState.errors, 'groups');
  return (
    <div className="space-y-2">
      <p className="text-sm font-bold">Groups</p>
      <p className="text-xs text-slate-600 dark:text-slate-400">Each categorical predictor starts as its own group. Predictors in no group form groups of their own.</p>
      <ul className="space-y-1">
        {entries.map(([name, cols]) => (
          <li key={name} className="flex flex-wrap items-center gap-2 text-sm">
            <span className="w-32 truncate font-bold" title={name}>
              {name}
            </span>
            <input
              aria-label={`Columns in group ${name}`}
              className={`${INPUT} min-w-64 flex-1`}
              defaultValue={cols.join(', ')}
              onBlur={(e) => set({ ...groups, [name]: e.target.value.split(',').map((s) => s.trim()).filter(Boolean) })}
            />
            <button
              type="button"
              className="text-xs font-bold text-red-700 underline dark:text-red-300"
              onClick={() => set(Object.fromEntries(entries.filter(([n]) => n !== name)))}
            >
              Remove {name}
            </button>
          </li>
        ))}
      </ul>
      <div className="flex items-center gap-2 text-sm">
        <input aria-label="New group name" placeholder="new group name" className={`${INPUT} w-40`} value={draftName} onChange={(e) => setDraftName(e.target.value)} />
        <button
          type="button"
          className="rounded border border-slate-300 px-2 py-1 text-xs font-bold dark:border-slate-600"
          disabled={!draftName.trim() || draftName.trim() in groups}
          onClick={() => {
            set({ ...groups, [draftName.trim()]: [] });
            setDraftName('');
          }}
        >
          Add group
        </button>
      </div>
      <FieldError message={error} />
    </div>
  );
}
