import { formatDay } from '@/lib/dates';
import { ROLE_LABELS } from '@shared/members';
import { Button } from '@/components/Button';
import { Loading } from '@/components/Loading';
import { Notice } from '@/components/Notice';
import { useInvitations } from '../api/invitations';
import { useRevokeInvitation } from '../api/revoke-invitation';

/** Admins only: invitations not yet accepted; revoking one makes its link stop working. */
export function PendingInvitations({ workspaceId }: { workspaceId: string }) {
  const invitations = useInvitations(workspaceId);
  const revoke = useRevokeInvitation(workspaceId);

  return (
    <section aria-labelledby="pending-heading">
      <h2 id="pending-heading" className="mb-3 text-lg font-bold">
        Pending invitations
      </h2>
      {invitations.isPending && <Loading label="Loading invitations…" />}
      {invitations.isError && <Notice tone="error">Could not load the invitations: {invitations.error.message}</Notice>}
      {revoke.isError && <Notice tone="error">{revoke.error.message}</Notice>}
      {invitations.data && invitations.data.length === 0 && (
        <p className="text-sm text-slate-700 dark:text-slate-300">No invitations are waiting for an answer.</p>
      )}
      {invitations.data && invitations.data.length > 0 && (
        <ul className="divide-y divide-slate-200 rounded-lg border border-slate-200 bg-white dark:divide-slate-800 dark:border-slate-800 dark:bg-slate-900">
          {invitations.data.map((inv) => (
            <li key={inv.id} className="flex flex-wrap items-center justify-between gap-3 px-4 py-3 text-sm">
              <span>
                <strong className="font-bold">{inv.email}</strong> as {ROLE_LABELS[inv.role]}
                <span className="block text-xs text-slate-600 dark:text-slate-400">
                  {inv.invitedByName ? `Invited by ${inv.invitedByName}, ` : ''}
                  link valid until {formatDay(inv.expiresAt)}
                </span>
              </span>
              <Button
                variant="secondary"
                onClick={() => revoke.mutate(inv.id)}
                busy={revoke.isPending && revoke.variables === inv.id}
                busyLabel="Revoking…"
                aria-label={`Revoke the invitation for ${inv.email}`}
              >
                Revoke
              </Button>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
