/** Admins and analysts ask for a review of a finished version (at its chosen lambda). */
import { useState } from 'react';
import { Button } from '@/components/Button';
import { SelectField, TextField } from '@/components/Field';
import { Notice } from '@/components/Notice';
import { useModelList, useModelVersions } from '../api/models';
import { useRequestReview } from '../api/request-review';

export function RequestReviewForm({ workspaceId, onDone }: { workspaceId: string; onDone: (reviewId: string) => void }) {
  const models = useModelList(workspaceId);
  const [modelId, setModelId] = useState('');
  const [fitId, setFitId] = useState('');
  const [note, setNote] = useState('');
  const versions = useModelVersions(workspaceId, modelId);
  const request = useRequestReview(workspaceId);
  const finished = (versions.data?.versions ?? []).filter((v) => v.status === 'finished');
  return (
    <form
      aria-labelledby="ask-heading"
      className="space-y-3 rounded-lg border border-slate-200 bg-white p-4 dark:border-slate-800 dark:bg-slate-900"
      onSubmit={(e) => {
        e.preventDefault();
        request.mutate({ fitId, note }, { onSuccess: (r) => onDone(r.id) });
      }}
    >
      <h2 id="ask-heading" className="text-base font-bold">
        Ask for a review
      </h2>
      <p className="text-sm text-slate-600 dark:text-slate-300">The workspace&apos;s reviewers get an e-mail and a notice. The review covers the version&apos;s chosen lambda.</p>
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField
          label="Model"
          value={modelId}
          onChange={(e) => {
            setModelId(e.target.value);
            setFitId('');
          }}
          options={[{ value: '', label: 'Choose a model' }, ...(models.data ?? []).map((m) => ({ value: m.id, label: m.name }))]}
        />
        <SelectField
          label="Version"
          value={fitId}
          onChange={(e) => setFitId(e.target.value)}
          disabled={!modelId}
          options={[{ value: '', label: finished.length ? 'Choose a finished version' : 'No finished version' }, ...finished.map((v) => ({ value: v.id, label: `Version ${v.version}${v.unconverged ? ' (did not converge everywhere)' : ''}` }))]}
        />
      </div>
      <TextField label="Note for the reviewers" hint="What changed, what to look at." value={note} onChange={(e) => setNote(e.target.value)} />
      {request.error && <Notice tone="error">{request.error.message}</Notice>}
      <Button type="submit" disabled={!fitId} busy={request.isPending} busyLabel="Asking…">
        Ask for a review
      </Button>
    </form>
  );
}
