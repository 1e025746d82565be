/** Approve, or send back with reasons (required when sending back). */
import { useState } from 'react';
import { Button } from '@/components/Button';
import { TextField } from '@/components/Field';
import { Notice } from '@/components/Notice';
import { useDecideReview } from '../api/decide-review';

export function DecisionForm({ workspaceId, reviewId }: { workspaceId: string; reviewId: string }) {
  const [reasons, setReasons] = useState('');
  const decide = useDecideReview(workspaceId, reviewId);
  return (
    <section aria-labelledby="decide-heading" className="space-y-3 rounded-lg border border-slate-200 bg-white p-4 dark:border-slate-800 dark:bg-slate-900">
      <h2 id="decide-heading" className="text-base font-bold">
        Your decision
      </h2>
      <TextField label="Reasons" hint="Required to send the fit back; optional when approving." value={reasons} onChange={(e) => setReasons(e.target.value)} />
      {decide.error && <Notice tone="error">{decide.error.message}</Notice>}
      <div className="flex gap-3">
        <Button busy={decide.isPending && decide.variables?.decision === 'approve'} onClick={() => decide.mutate({ decision: 'approve', reasons })}>
          Approve
        </Button>
        <Button variant="danger" busy={decide.isPending && decide.variables?.decision === 'send-back'} onClick={() => decide.mutate({ decision: 'send-back', reasons })}>
          Send back
        </Button>
      </div>
    </section>
  );
}
