import { PageHeader } from '@/components/PageHeader';
import { ChangePasswordForm } from './ChangePasswordForm';
import { SessionsPanel } from './SessionsPanel';

/** The signed-in person's own settings: sessions and password. */
export function AccountPage() {
  return (
    <>
      <PageHeader title="Your account" description="Your sessions and your password. Nothing here is shared with your workspaces." />
      <div className="space-y-10">
        <SessionsPanel />
        <ChangePasswordForm />
      </div>
    </>
  );
}
