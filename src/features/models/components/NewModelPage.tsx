/**
 * Create a model: a name, the dataset, the outcome column and the family. The outcome list comes from
 * the dataset's latest version; the family follows the outcome's type and a mismatch is explained
 * beside the field before anything is sent.
 */
import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { useNavigate } from 'react-router';
import { COLUMN_TYPE_LABELS } from '@shared/datasets';
import { FAMILIES, FAMILY_LABELS, createModelSchema, type CreateModelInput } from '@shared/models';
import { paths } from '@/app/paths';
import { Button } from '@/components/Button';
import { SelectField, TextField } from '@/components/Field';
import { Loading } from '@/components/Loading';
import { Notice } from '@/components/Notice';
import { PageHeader } from '@/components/PageHeader';
import { applyServerError } from '@/lib/forms';
import { useCurrentWorkspace } from '@/lib/workspace-context';
import { useCreateModel } from '../api/create-model';
import { useLatestVersion } from '../api/dataset-version';
import { useDatasetOptions } from '../api/datasets';

const FAMILY_OPTIONS = FAMILIES.map((f) => ({ value: f, label: FAMILY_LABELS[f] }));

export function NewModelPage() {
  const { workspaceId } = useCurrentWorkspace();
  const navigate = useNavigate();
  const datasets = useDatasetOptions(workspaceId);
  const create = useCreateModel(workspaceId);
  const form = useForm<CreateModelInput>({ resolver: zodResolver(createModelSchema), defaultValues: { name: '', description: '', datasetId: '', outcome: '', family: 'gaussian' } });
  const { errors } = form.formState;
  const datasetId = form.watch('datasetId');
  const outcome = form.watch('outcome');
  const family = form.watch('family');
  const version = useLatestVersion(workspaceId, datasetId || undefined);
  const outcomeColumns = (version.data?.columns ?? []).filter((c) => c.type === 'numeric' || c.type === 'binary' || c.type === 'categorical');
  const chosen = outcomeColumns.find((c) => c.name === outcome);
  const familyProblem =
    chosen && family === 'binomial' && chosen.summary.distinct !== null && chosen.summary.distinct > 2
      ? `A yes/no model needs an outcome with two values; "${chosen.name}" has ${chosen.summary.distinct}.`
      : chosen && family === 'gaussian' && chosen.type !== 'numeric'
        ? `"${chosen.name}" is not a number (${COLUMN_TYPE_LABELS[chosen.type]}); choose the yes/no family.`
        : undefined;

  const onSubmit = form.handleSubmit(async (values) => {
    if (familyProblem) return;
    try {
      const model = await create.mutateAsync(values);
      navigate(paths.workspace.runFit.getHref(workspaceId, model.id));
    } catch (error) {
      applyServerError(error, form.setError, ['name', 'description', 'datasetId', 'outcome', 'family']);
    }
  });

  if (datasets.isPending) return <Loading label="Loading datasets…" />;
  if (datasets.error) return <Notice tone="error">{datasets.error.message}</Notice>;
  const datasetOptions = [{ value: '', label: 'Choose a dataset' }, ...datasets.data.datasets.map((d) => ({ value: d.id, label: `${d.name} (version ${d.latest.number})` }))];
  const outcomeOptions = [{ value: '', label: datasetId ? 'Choose the outcome' : 'Choose a dataset first' }, ...outcomeColumns.map((c) => ({ value: c.name, label: `${c.name} (${COLUMN_TYPE_LABELS[c.type]})` }))];

  return (
    <>
      <PageHeader title="New model" description="Name the question: which dataset, which outcome, and whether the outcome is a number or a yes/no." />
      <form onSubmit={onSubmit} noValidate className="max-w-xl space-y-4 rounded-lg border border-slate-200 bg-white p-5 dark:border-slate-800 dark:bg-slate-900">
        <TextField label="Model name" error={errors.name?.message} {...form.register('name')} />
        <TextField label="Description (optional)" error={errors.description?.message} {...form.register('description')} />
        <SelectField
          label="Dataset"
          options={datasetOptions}
          error={errors.datasetId?.message}
          hint={datasets.data.datasets.length === 0 ? 'Upload a dataset first (Datasets).' : 'Fits use its latest version.'}
          {...form.register('datasetId', { onChange: () => form.setValue('outcome', '') })}
        />
        {version.isFetching && datasetId && <Loading label="Reading the columns…" />}
        <SelectField
          label="Outcome"
          options={outcomeOptions}
          disabled={!datasetId}
          error={errors.outcome?.message}
          hint="The column the model explains."
          {...form.register('outcome', {
            onChange: (e: { target: { value: string } }) => {
              const c = outcomeColumns.find((x) => x.name === e.target.value);
              if (c) form.setValue('family', c.type === 'numeric' && (c.summary.distinct === null || c.summary.distinct > 2) ? 'gaussian' : 'binomial');
            },
          })}
        />
        <SelectField label="Family" options={FAMILY_OPTIONS} error={errors.family?.message ?? familyProblem} hint="Set from the outcome's type; change it if the guess is wrong." {...form.register('family')} />
        {errors.root?.server && <Notice tone="error">{errors.root.server.message}</Notice>}
        <Button type="submit" busy={form.formState.isSubmitting} busyLabel="Creating…" disabled={Boolean(familyProblem)}>
          Create model and set up the first fit
        </Button>
      </form>
    </>
  );
}
