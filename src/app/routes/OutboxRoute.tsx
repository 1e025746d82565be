import { OutboxPage } from '@/features/dev/components/OutboxPage';
import { Notice } from '@/components/Notice';
import { PageHeader } from '@/components/PageHeader';
import { useCurrentWorkspace } from '@/lib/workspace-context';

/** Admins read the captured e-mail; everyone else gets an explanation (the server refuses them too). */
export function OutboxRoute() {
  const { role } = useCurrentWorkspace();
  if (role !== 'admin') {
    return (
      <>
        <PageHeader title="Outbox" />
        <Notice>Only admins can read the captured e-mail.</Notice>
      </>
    );
  }
  return <OutboxPage />;
}
