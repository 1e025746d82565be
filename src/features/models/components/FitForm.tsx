/**
 * The fit form: react-hook-form with the shared zod schema (fitRequestSchema), validated as the analyst
 * types so an invalid combination is explained beside its field before anything is sent. Checks that
 * need the dataset (rows for the folds, the fold column) come from fitFormModel.
 */
import { zodResolver } from '@hookform/resolvers/zod';
import { useMemo } from 'react';
import { useForm, type Path } from 'react-hook-form';
import type { VersionDetailDto } from '@shared/datasets';
import { fitRequestSchema, type FitRequestInput } from '@shared/fits';
import type { FitFamily } from '@shared/models';
import { Button } from '@/components/Button';
import { ColumnTable } from '@/components/columns/ColumnTable';
import { Notice } from '@/components/Notice';
import { applyServerError } from '@/lib/forms';
import { countFormat } from '@/lib/numbers';
import { CvSection } from './CvSection';
import { datasetIssues, defaultLeftOut, unavailableReason } from './fitFormModel';
import { FieldError, FormSection, errorAt, setAndValidate } from './fitFormParts';
import { PathSection } from './PathSection';
import { PenaltySection } from './PenaltySection';
import { PredictorRowsNote } from './PredictorRowsNote';
import { WeightsSection } from './WeightsSection';

const SERVER_FIELDS = ['predictors', 'penalty', 'l1Share', 'groups', 'standardize', 'path', 'path.lambdas', 'path.pathLength', 'path.pathDecades', 'path.maxTerms', 'penaltyWeights', 'cv', 'cv.folds', 'cv.seed', 'cv.column', 'metric', 'missing', 'holdout', 'holdout.share', 'tolerance', 'maxIterations'] as const;

interface Props {
  version: VersionDetailDto;
  outcome: string;
  family: FitFamily;
  defaults: FitRequestInput;
  /** Outcomes of the workspace's other models on this dataset (left unticked by default). */
  otherOutcomes?: string[];
  onSubmit: (values: FitRequestInput) => Promise<unknown>;
}

export function FitForm({ version, outcome, family, defaults, otherOutcomes = [], onSubmit }: Props) {
  const form = useForm<FitRequestInput>({ resolver: zodResolver(fitRequestSchema) as never, defaultValues: defaults, mode: 'onChange' });
  const { errors } = form.formState;
  const values = form.watch();
  const columns = version.columns;
  const extra = datasetIssues(values, columns, version.rowCount);
  const foldColumn = values.cv?.kind === 'column' ? values.cv.column : null;
  const selected = useMemo(() => new Set(values.predictors ?? []), [values.predictors]);

  const submit = form.handleSubmit(async (v) => {
    if (Object.keys(extra).length > 0) return;
    try {
      await onSubmit(v);
    } catch (error) {
      applyServerError(error, form.setError, SERVER_FIELDS as unknown as Path<FitRequestInput>[]);
    }
  });

  return (
    <form onSubmit={submit} noValidate className="space-y-5">
      <FormSection
        title="Predictors"
        hint={`Columns of ${version.datasetName}, version ${version.number} (${countFormat.format(version.rowCount)} rows). Find columns by name or a pattern like x_*, filter by type, then add or remove the shown ones.`}
      >
        <ColumnTable
          columns={columns}
          label="Predictor candidates"
          height={360}
          selection={{
            selected,
            onChange: (next) => setAndValidate(form, 'predictors', columns.filter((c) => next.has(c.name)).map((c) => c.name)),
            unavailable: (c) => unavailableReason(c, outcome, foldColumn),
            checkboxLabel: (name) => `Use ${name} as a predictor`,
          }}
        />
        <FieldError message={errorAt(errors, extra, 'predictors')} />
        <PredictorRowsNote
          columns={columns}
          outcome={outcome}
          predictors={values.predictors ?? []}
          missing={values.missing}
          rowCount={version.rowCount}
          leftOut={defaultLeftOut(columns, outcome, otherOutcomes)}
        />
      </FormSection>
      <PenaltySection form={form} columns={columns} extra={extra} />
      <PathSection form={form} extra={extra} />
      <CvSection form={form} columns={columns} family={family} extra={extra} />
      <WeightsSection form={form} />
      {errors.root?.server && <Notice tone="error">{errors.root.server.message}</Notice>}
      <div className="flex items-center gap-3">
        <Button type="submit" busy={form.formState.isSubmitting} busyLabel="Queueing…">
          Run the fit
        </Button>
        {!form.formState.isValid && form.formState.isDirty && <span className="text-sm text-red-700 dark:text-red-300">Fix the fields marked above first.</span>}
      </div>
    </form>
  );
}
