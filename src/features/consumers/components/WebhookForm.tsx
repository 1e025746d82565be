import { useState, type FormEvent } from 'react';
import { createWebhookSchema, type CreatedWebhookDto } from '@shared/consumers';
import { Button } from '@/components/Button';
import { SelectField, TextField } from '@/components/Field';
import { Notice } from '@/components/Notice';
import { isApiError } from '@/lib/api';
import { useCreateWebhook } from '../api/create-webhook';
import { useModelNames } from '../api/model-names';
import { ShownOnce } from './ShownOnce';

/** Admins register an address that is told about every new release (of one model or of all). */
export function WebhookForm({ workspaceId }: { workspaceId: string }) {
  const create = useCreateWebhook(workspaceId);
  const models = useModelNames(workspaceId);
  const [url, setUrl] = useState('');
  const [modelId, setModelId] = useState('');
  const [description, setDescription] = useState('');
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [created, setCreated] = useState<CreatedWebhookDto | null>(null);
  const options = [{ value: '', label: 'Every model' }, ...(models.data ?? []).map((m) => ({ value: m.id, label: m.name }))];

  const onSubmit = async (event: FormEvent) => {
    event.preventDefault();
    const input = { url, modelId: modelId || null, description };
    const parsed = createWebhookSchema.safeParse(input);
    if (!parsed.success) {
      setErrors(Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0] ?? 'root'), i.message])));
      return;
    }
    setErrors({});
    try {
      setCreated(await create.mutateAsync(input));
      setUrl('');
      setDescription('');
    } catch (error) {
      setErrors({ [isApiError(error) && error.field ? error.field : 'root']: error instanceof Error ? error.message : 'Something went wrong.' });
    }
  };

  return (
    <section aria-labelledby="new-webhook" className="rounded-lg border border-slate-200 bg-white p-5 dark:border-slate-800 dark:bg-slate-900">
      <h2 id="new-webhook" className="text-lg font-bold">
        New webhook
      </h2>
      <p className="mt-1 text-sm text-slate-700 dark:text-slate-300">
        Lariat POSTs a short JSON message to this address when a model gets a new release, signed with the webhook’s secret. Failed deliveries are tried
        again with growing pauses.
      </p>
      <form onSubmit={(e) => void onSubmit(e)} noValidate className="mt-4 grid gap-4 sm:grid-cols-2">
        <TextField label="Address (https://…)" value={url} onChange={(e) => setUrl(e.target.value)} error={errors.url} />
        <SelectField label="Releases of" options={options} value={modelId} onChange={(e) => setModelId(e.target.value)} error={errors.modelId} />
        <TextField label="Note (optional)" value={description} onChange={(e) => setDescription(e.target.value)} error={errors.description} />
        <div className="sm:col-span-2">
          <Button type="submit" busy={create.isPending} busyLabel="Saving…">
            Add webhook
          </Button>
        </div>
      </form>
      <div className="mt-3 space-y-2">
        {errors.root && <Notice tone="error">{errors.root}</Notice>}
        {created && <ShownOnce label={`Signing secret for ${created.url}`} value={created.secret} onDone={() => setCreated(null)} />}
      </div>
    </section>
  );
}
