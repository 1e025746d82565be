import { useState } from 'react';
import type { UseFormReturn } from 'react-hook-form';
import type { FitRequestInput } from '@shared/fits';
import { formatWeights, parseWeights } from './fitFormModel';
import { FormSection, LabeledField, INPUT, firstErrorUnder, optionalNumber, setAndValidate } from './fitFormParts';

/** Penalty weights per predictor ("column = weight"; 0 keeps it always in), and the solver's stopping settings. */
export function WeightsSection({ form }: { form: UseFormReturn<FitRequestInput> }) {
  const { errors } = form.formState;
  const [text, setText] = useState(() => formatWeights(form.getValues('penaltyWeights')));
  const [badLine, setBadLine] = useState<string | null>(null);
  return (
    <FormSection title="Penalty weights and solver" hint="Weights multiply each predictor's penalty: 1 is the default, 2 penalizes twice as hard, 0 keeps the predictor in every fit.">
      <LabeledField id="fit-penalty-weights" label="Penalty weights (one “column = weight” per line)" error={badLine ? `Cannot read “${badLine}”: write column = weight.` : firstErrorUnder(errors, 'penaltyWeights')} className="block">
        {(a) => (
          <>
            <textarea {...a}
              rows={3}
              className={`${INPUT} w-full font-mono`}
              value={text}
              placeholder={'milk_fat_pct = 0\nshift = 2'}
              onChange={(e) => {
                setText(e.target.value);
                const { weights, badLine: bad } = parseWeights(e.target.value);
                setBadLine(bad);
                setAndValidate(form, 'penaltyWeights', Object.keys(weights).length ? weights : undefined);
              }}
            />
          </>
        )}
      </LabeledField>
      <div className="flex flex-wrap gap-4">
        <LabeledField id="fit-tolerance" label="Tolerance (relative duality gap)" error={errors.tolerance?.message}>
          {(a) => (
            <>
              <input {...a} type="number" step="any" placeholder="Lariat's default" className={`${INPUT} w-36`} {...form.register('tolerance', { setValueAs: optionalNumber })} />
            </>
          )}
        </LabeledField>
        <LabeledField id="fit-iteration-limit-per-lambda" label="Iteration limit per lambda" error={errors.maxIterations?.message}>
          {(a) => (
            <>
              <input {...a} type="number" placeholder="Lariat's default" className={`${INPUT} w-36`} {...form.register('maxIterations', { setValueAs: optionalNumber })} />
            </>
          )}
        </LabeledField>
      </div>
    </FormSection>
  );
}
