import { OutboxPage } from '@/features/dev/components/OutboxPage';

/** Each person reads the captured e-mail addressed to them (and admins, invitations from their workspace). */
export function OutboxRoute() {
  return <OutboxPage />;
}
