import { useState, type FormEvent } from 'react';
import { createKeySchema, DEFAULT_KEY_DAYS, MAX_KEY_DAYS, type CreatedKeyDto } from '@shared/consumers';
import { Button } from '@/components/Button';
import { SelectField, TextField } from '@/components/Field';
import { Notice } from '@/components/Notice';
import { isApiError } from '@/lib/api';
import { useCreateKey } from '../api/create-key';
import { useModelNames } from '../api/model-names';
import { ShownOnce } from './ShownOnce';

const SCOPES = [
  { value: 'workspace', label: 'Every released model of this workspace' },
  { value: 'models', label: 'Only the models I choose' },
];

/** Admins make a key for one consumer: a name, what it may read, and when it stops working. */
export function KeyForm({ workspaceId }: { workspaceId: string }) {
  const create = useCreateKey(workspaceId);
  const models = useModelNames(workspaceId);
  const [name, setName] = useState('');
  const [scope, setScope] = useState<'workspace' | 'models'>('workspace');
  const [modelIds, setModelIds] = useState<string[]>([]);
  const [days, setDays] = useState(String(DEFAULT_KEY_DAYS));
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [created, setCreated] = useState<CreatedKeyDto | null>(null);

  const onSubmit = async (event: FormEvent) => {
    event.preventDefault();
    const input = { name, scope, modelIds: scope === 'models' ? modelIds : [], expiresInDays: Number(days) };
    const parsed = createKeySchema.safeParse(input);
    if (!parsed.success) {
      setErrors(Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0] ?? 'root'), i.message])));
      return;
    }
    setErrors({});
    try {
      setCreated(await create.mutateAsync(input));
      setName('');
      setModelIds([]);
    } catch (error) {
      setErrors({ [isApiError(error) && error.field ? error.field : 'root']: error instanceof Error ? error.message : 'Something went wrong.' });
    }
  };

  return (
    <section aria-labelledby="new-key" className="rounded-lg border border-slate-200 bg-white p-5 dark:border-slate-800 dark:bg-slate-900">
      <h2 id="new-key" className="text-lg font-bold">
        New API key
      </h2>
      <p className="mt-1 text-sm text-slate-700 dark:text-slate-300">One key per consumer (a dashboard, a scoring service), so each can be revoked alone.</p>
      <form onSubmit={(e) => void onSubmit(e)} noValidate className="mt-4 grid gap-4 sm:grid-cols-2">
        <TextField label="Name" value={name} onChange={(e) => setName(e.target.value)} error={errors.name} hint="Who uses it, e.g. “Plant dashboard”." />
        <TextField
          label="Days until it expires"
          type="number"
          min={1}
          max={MAX_KEY_DAYS}
          value={days}
          onChange={(e) => setDays(e.target.value)}
          error={errors.expiresInDays}
        />
        <SelectField label="May read" options={SCOPES} value={scope} onChange={(e) => setScope(e.target.value as 'workspace' | 'models')} error={errors.scope} />
        {scope === 'models' && (
          <fieldset className="sm:col-span-2">
            <legend className="text-sm font-bold">Models</legend>
            {models.data?.length === 0 && <p className="text-sm">This workspace has no models yet.</p>}
            <div className="mt-1 grid gap-1 sm:grid-cols-2">
              {models.data?.map((m) => (
                <label key={m.id} className="flex items-center gap-2 text-sm">
                  <input
                    type="checkbox"
                    checked={modelIds.includes(m.id)}
                    onChange={(e) => setModelIds((ids) => (e.target.checked ? [...ids, m.id] : ids.filter((id) => id !== m.id)))}
                  />
                  {m.name}
                </label>
              ))}
            </div>
            {errors.modelIds && <p className="mt-1 text-sm text-red-700 dark:text-red-300">{errors.modelIds}</p>}
          </fieldset>
        )}
        <div className="sm:col-span-2">
          <Button type="submit" busy={create.isPending} busyLabel="Making the key…">
            Make key
          </Button>
        </div>
      </form>
      <div className="mt-3 space-y-2">
        {errors.root && <Notice tone="error">{errors.root}</Notice>}
        {errors.body && <Notice tone="error">{errors.body}</Notice>}
        {created && <ShownOnce label={`Key “${created.name}”`} value={created.key} onDone={() => setCreated(null)} />}
      </div>
    </section>
  );
}
