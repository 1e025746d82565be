/** Release an approved fit (at its approved lambda) with release notes. */
import { useState } from 'react';
import { Button } from '@/components/Button';
import { SelectField, TextField } from '@/components/Field';
import { Notice } from '@/components/Notice';
import { formatStat } from '@/lib/numbers';
import { useApprovedReviews } from '../api/approved-reviews';
import { usePublishRelease } from '../api/publish-release';

export function PublishReleaseForm({ workspaceId }: { workspaceId: string }) {
  const approved = useApprovedReviews(workspaceId);
  const publish = usePublishRelease(workspaceId);
  const [reviewId, setReviewId] = useState('');
  const [notes, setNotes] = useState('');
  const [done, setDone] = useState<string | null>(null);
  const chosen = approved.data?.find((r) => r.id === reviewId);
  return (
    <form
      aria-labelledby="publish-heading"
      className="space-y-3 rounded-lg border border-slate-200 bg-white p-4 dark:border-slate-800 dark:bg-slate-900"
      onSubmit={(e) => {
        e.preventDefault();
        if (!chosen) return;
        publish.mutate(
          { modelId: chosen.modelId, fitId: chosen.fitId, notes },
          {
            onSuccess: (r) => {
              setDone(`${r.modelName}: release ${r.number} is now current.`);
              setNotes('');
              setReviewId('');
            },
          },
        );
      }}
    >
      <h2 id="publish-heading" className="text-base font-bold">
        Release an approved fit
      </h2>
      <SelectField
        label="Approved fit"
        value={reviewId}
        onChange={(e) => setReviewId(e.target.value)}
        options={[
          { value: '', label: approved.data?.length ? 'Choose an approved fit' : 'No approved fit yet' },
          ...(approved.data ?? []).map((r) => ({ value: r.id, label: `${r.modelName}, version ${r.fitVersion} (lambda ${formatStat(r.lambda)}, approved by ${r.decidedBy?.name ?? 'a former member'})` })),
        ]}
      />
      <TextField label="Release notes" hint="What changed for the people who use this model, and why." value={notes} onChange={(e) => setNotes(e.target.value)} />
      {publish.error && <Notice tone="error">{publish.error.message}</Notice>}
      {done && <Notice tone="success">{done}</Notice>}
      <Button type="submit" disabled={!chosen || !notes.trim()} busy={publish.isPending} busyLabel="Releasing…">
        Release
      </Button>
    </form>
  );
}
