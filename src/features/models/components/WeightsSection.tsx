import { useState } from 'react';
import type { UseFormReturn } from 'react-hook-form';
import type { FitRequestInput } from '@shared/fits';
import { formatWeights, parseWeights } from './fitFormModel';
import { FieldError, firstErrorUnder, FormSection, INPUT, optionalNumber } from './fitFormParts';

/** Penalty weights per predictor ("column = weight"; 0 keeps it always in), and the solver's stopping settings. */
export function WeightsSection({ form }: { form: UseFormReturn<FitRequestInput> }) {
  const { errors } = form.formState;
  const [text, setText] = useState(() => formatWeights(form.getValues('penaltyWeights')));
  const [badLine, setBadLine] = useState<string | null>(null);
  return (
    <FormSection title="Penalty weights and solver" hint="Weights multiply each predictor's penalty: 1 is the default, 2 penalizes twice as hard, 0 keeps the predictor in every fit.">
      <label className="block space-y-1 text-sm">
        <span className="block font-bold">Penalty weights (one “column = weight” per line)</span>
        <textarea
          rows={3}
          className={`${INPUT} w-full font-mono`}
          value={text}
          placeholder={'milk_fat_pct = 0\nshift = 2'}
          onChange={(e) => {
            setText(e.target.value);
            const { weights, badLine: bad } = parseWeights(e.target.value);
            setBadLine(bad);
            form.setValue('penaltyWeights', Object.keys(weights).length ? weights : undefined, { shouldValidate: true });
          }}
        />
        <FieldError message={badLine ? `Cannot read “${badLine}”: write column = weight.` : firstErrorUnder(errors, 'penaltyWeights')} />
      </label>
      <div className="flex flex-wrap gap-4">
        <label className="space-y-1 text-sm">
          <span className="block font-bold">Tolerance (relative duality gap)</span>
          <input type="number" step="any" placeholder="Lariat's default" className={`${INPUT} w-36`} {...form.register('tolerance', { setValueAs: optionalNumber })} />
          <FieldError message={errors.tolerance?.message} />
        </label>
        <label className="space-y-1 text-sm">
          <span className="block font-bold">Iteration limit per lambda</span>
          <input type="number" placeholder="Lariat's default" className={`${INPUT} w-36`} {...form.register('maxIterations', { setValueAs: optionalNumber })} />
          <FieldError message={errors.maxIterations?.message} />
        </label>
      </div>
    </FormSection>
  );
}
