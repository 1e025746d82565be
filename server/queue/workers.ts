/** Every feature's queue workers, registered once per process (server/main.ts, tests' apps). Each area adds one line. */
import { INVITATION_MAIL_JOB, sendInvitationMail } from '../accounts/invitations';
import type { AppContext } from '../context';
import { NOTICE_MAIL_JOB, sendNoticeMails } from '../notices/notify';
import { startWebhookWorker } from '../consumers/webhooks/deliver';

export async function startWorkers(ctx: AppContext): Promise<void> {
  // Relay hiccups: retried after 2, 4, 8... seconds, up to 8 times (about 8 minutes in all).
  await ctx.queue.work<{ invitationId: string }>(INVITATION_MAIL_JOB, (data) => sendInvitationMail(ctx, data.invitationId), { retryLimit: 8, retryDelaySeconds: 2 });
  await startWebhookWorker(ctx);
  // Review and release notices: the same retry rule as invitations.
  await ctx.queue.work<{ noticeIds: string[] }>(NOTICE_MAIL_JOB, (data) => sendNoticeMails(ctx, data.noticeIds), { retryLimit: 8, retryDelaySeconds: 2 });
}
