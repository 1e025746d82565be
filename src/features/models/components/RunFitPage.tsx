/**
 * Set up and run the next version of a model. With `?from=<fitId>` the form starts from that
 * version's spec, so a new version is "the previous one with these changes".
 */
import { Link, useNavigate, useParams, useSearchParams } from 'react-router';
import { FAMILY_LABELS } from '@shared/models';
import { paths } from '@/app/paths';
import { Loading } from '@/components/Loading';
import { Notice } from '@/components/Notice';
import { PageHeader } from '@/components/PageHeader';
import { useCurrentWorkspace } from '@/lib/workspace-context';
import { useLatestVersion } from '../api/dataset-version';
import { useFitSpec } from '../api/fit-spec';
import { useModel } from '../api/model';
import { useModels } from '../api/models';
import { useRunFit } from '../api/run-fit';
import { FitForm } from './FitForm';
import { defaultsFromColumns, defaultsFromSpec } from './fitFormModel';

export function RunFitPage() {
  const { workspaceId, role } = useCurrentWorkspace();
  const { modelId = '' } = useParams();
  const [search] = useSearchParams();
  const from = search.get('from');
  const navigate = useNavigate();
  const model = useModel(workspaceId, modelId);
  const version = useLatestVersion(workspaceId, model.data?.datasetId);
  const previous = useFitSpec(workspaceId, from);
  const run = useRunFit(workspaceId, modelId);
  const models = useModels(workspaceId);
  if (role !== 'admin' && role !== 'analyst') return <Notice tone="error">Only analysts and admins run fits.</Notice>;
  if (model.isPending || version.isPending || models.isPending || (from && previous.isPending)) return <Loading label="Loading the model and its dataset…" />;
  const error = model.error ?? version.error ?? previous.error;
  if (error) return <Notice tone="error">{error.message}</Notice>;
  const m = model.data!;
  const v = version.data!;
  // Another model's outcome on the same dataset is a result too: not a default predictor here.
  const otherOutcomes = (models.data ?? []).filter((x) => x.datasetId === m.datasetId && x.id !== m.id).map((x) => x.outcome);
  const defaults = previous.data ? defaultsFromSpec(previous.data.spec, v.columns) : defaultsFromColumns(v.columns, m.outcome, otherOutcomes);
  const next = (m.versions[0]?.version ?? 0) + 1;
  return (
    <>
      <PageHeader
        title={`${m.name}: run version ${next}`}
        description={
          <>
            Outcome <span className="font-mono">{m.outcome}</span> · {FAMILY_LABELS[m.family]} · {v.datasetName}, version {v.number}.
            {previous.data && ` Starting from version ${previous.data.version}'s settings.`}
          </>
        }
        actions={
          <Link className="text-sm font-bold text-lariat-800 underline dark:text-lariat-200" to={paths.workspace.model.getHref(workspaceId, m.id)}>
            Back to the model
          </Link>
        }
      />
      <FitForm
        version={v}
        outcome={m.outcome}
        family={m.family}
        defaults={defaults}
        otherOutcomes={otherOutcomes}
        onSubmit={async (values) => {
          const fit = await run.mutateAsync({ ...values, datasetVersionId: v.id });
          navigate(paths.workspace.fit.getHref(workspaceId, fit.id));
        }}
      />
    </>
  );
}
