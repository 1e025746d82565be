import { useNavigate, useParams } from 'react-router';
import { ROLE_LABELS } from '@shared/members';
import { paths } from '@/app/paths';
import { AuthCard, TextLink } from '@/components/AuthCard';
import { Button } from '@/components/Button';
import { Loading } from '@/components/Loading';
import { Notice } from '@/components/Notice';
import { useMe } from '@/lib/session';
import { useAcceptInvitation } from '../api/accept-invitation';
import { useInvitationPreview } from '../api/invitation-preview';
import { NewAccountForm } from './NewAccountForm';

/** Where the e-mailed invitation link lands: a new person sets a name and password; others just join. */
export function AcceptInvitationPage() {
  const { token = '' } = useParams();
  const navigate = useNavigate();
  const preview = useInvitationPreview(token);
  const me = useMe();
  const accept = useAcceptInvitation(token);

  const goToWorkspace = (workspaceId: string) => navigate(paths.workspace.root.getHref(workspaceId), { replace: true });

  if (preview.isPending || me.isPending) {
    return (
      <AuthCard title="Join a workspace">
        <Loading label="Checking the invitation…" />
      </AuthCard>
    );
  }
  if (preview.isError) {
    return (
      <AuthCard title="This invitation cannot be used">
        <Notice tone="error">{preview.error.message}</Notice>
        <p className="mt-4 text-sm">
          Invitations expire or can be revoked. Ask the workspace admin to send a new one, or{' '}
          <TextLink to={paths.auth.signIn.getHref()}>sign in</TextLink>.
        </p>
      </AuthCard>
    );
  }

  const invite = preview.data;
  const intro = (
    <p>
      {invite.invitedByName ?? 'An admin'} invited <strong>{invite.email}</strong> to <strong>{invite.workspaceName}</strong> as{' '}
      <strong>{ROLE_LABELS[invite.role]}</strong>.
    </p>
  );

  if (invite.accountExists || me.data) {
    const signedInAsInvitee = me.data?.user.email.toLowerCase() === invite.email.toLowerCase();
    return (
      <AuthCard title={`Join ${invite.workspaceName}`} intro={intro}>
        {signedInAsInvitee ? (
          <div className="space-y-4">
            {accept.isError && <Notice tone="error">{accept.error.message}</Notice>}
            <Button
              busy={accept.isPending}
              busyLabel="Joining…"
              onClick={async () => {
                try {
                  goToWorkspace((await accept.mutateAsync({})).workspaceId);
                } catch {
                  // shown above from accept.error
                }
              }}
            >
              Join workspace
            </Button>
          </div>
        ) : me.data ? (
          <Notice>
            You are signed in as {me.data.user.email}, but this invitation is for {invite.email}. Sign out first (the
            button is at the bottom of the side bar), then open the link from the e-mail again.
          </Notice>
        ) : (
          <p className="text-sm">
            <TextLink to={paths.auth.signIn.getHref(paths.auth.acceptInvitation.getHref(token))}>Sign in as {invite.email}</TextLink>{' '}
            to accept this invitation.
          </p>
        )}
      </AuthCard>
    );
  }

  return (
    <AuthCard title={`Join ${invite.workspaceName}`} intro={intro}>
      <NewAccountForm
        email={invite.email}
        onSubmit={async (values) => {
          goToWorkspace((await accept.mutateAsync(values)).workspaceId);
        }}
      />
    </AuthCard>
  );
}
