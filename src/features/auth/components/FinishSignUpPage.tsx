import { useNavigate, useParams } from 'react-router';
import { paths } from '@/app/paths';
import { AuthCard, TextLink } from '@/components/AuthCard';
import { Button } from '@/components/Button';
import { Notice } from '@/components/Notice';
import { useCompleteSignUp } from '../api/sign-up-complete';

/**
 * The page behind the e-mailed sign-up link. It asks for one click rather than acting on load, so a
 * mail scanner that opens links does not use the link up.
 */
export function FinishSignUpPage() {
  const { token = '' } = useParams();
  const navigate = useNavigate();
  const complete = useCompleteSignUp();

  const finish = async () => {
    try {
      const me = await complete.mutateAsync(token);
      const first = me.memberships[0];
      navigate(first ? paths.workspace.root.getHref(first.workspaceId) : paths.home.getHref(), { replace: true });
    } catch {
      // shown below from complete.error
    }
  };

  return (
    <AuthCard
      title="Finish creating your account"
      intro="Your workspace is created, with you as its admin, as soon as you confirm."
      footer={
        <p>
          Link not working? <TextLink to={paths.auth.signUp.getHref()}>Sign up again</TextLink> or{' '}
          <TextLink to={paths.auth.signIn.getHref()}>sign in</TextLink>
        </p>
      }
    >
      <div className="space-y-4">
        {complete.isError && <Notice tone="error">{complete.error.message}</Notice>}
        <Button onClick={() => void finish()} busy={complete.isPending} busyLabel="Creating…">
          Create my account
        </Button>
      </div>
    </AuthCard>
  );
}
