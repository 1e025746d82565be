/** The e-mails accounts send: plain text with one link, built from config.publicUrl. */
import type { WorkspaceRole } from '../../shared/members';
import type { AppContext, MailMessage } from '../context';
import { reportUnexpected } from '../http/unexpected';

export function invitationMail(
  ctx: AppContext,
  m: { to: string; token: string; workspaceId: string; workspaceName: string; role: WorkspaceRole; invitedBy: string },
): MailMessage {
  const link = `${ctx.config.publicUrl}/invitations/${m.token}`;
  return {
    to: m.to,
    headers: { 'X-Lariat-Workspace': m.workspaceId },
    subject: `${m.invitedBy} invited you to ${m.workspaceName} on Lariat`,
    text: [
      `${m.invitedBy} invited you to join the workspace "${m.workspaceName}" on Lariat as ${m.role}.`,
      '',
      `Accept the invitation: ${link}`,
      '',
      'The link works once and expires in 7 days. If you did not expect this, ignore this e-mail.',
    ].join('\n'),
  };
}

export function passwordResetMail(ctx: AppContext, m: { to: string; token: string }) {
  const link = `${ctx.config.publicUrl}/reset-password/${m.token}`;
  return {
    to: m.to,
    subject: 'Reset your Lariat password',
    text: [
      'Someone (hopefully you) asked to reset the password of your Lariat account.',
      '',
      `Choose a new password: ${link}`,
      '',
      'The link works once and expires in 1 hour. If you did not ask for this, ignore this e-mail; your password stays as it is.',
    ].join('\n'),
  };
}

/** Sends without making the caller wait or fail: a mail relay hiccup must not reveal or break anything. */
export function sendInBackground(ctx: AppContext, message: MailMessage): void {
  // Logged without the message (its links are credentials) or the relay's full error text.
  ctx.sendMail(message).catch((err: unknown) => reportUnexpected(err, `e-mail "${message.subject}"`));
}

export function passwordChangedMail(ctx: AppContext, m: { to: string; signedOut: number }): MailMessage {
  return {
    to: m.to,
    subject: 'Your Lariat password was changed',
    text: [
      'The password of your Lariat account was just changed from a signed-in session.',
      m.signedOut > 0 ? `Your other sessions (${m.signedOut}) were signed out.` : 'No other session was open.',
      '',
      `If this was not you, reset your password now: ${ctx.config.publicUrl}/forgot-password`,
    ].join('\n'),
  };
}

export function finishSignUpMail(ctx: AppContext, m: { to: string; token: string }): MailMessage {
  const link = `${ctx.config.publicUrl}/sign-up/finish/${m.token}`;
  return {
    to: m.to,
    subject: 'Finish creating your Lariat account',
    text: [
      'Someone (hopefully you) started creating a Lariat account with this e-mail address.',
      '',
      `Finish creating it: ${link}`,
      '',
      'The link works once and expires in 1 hour. If you did not ask for this, ignore this e-mail; no account is created.',
    ].join('\n'),
  };
}

export function accountExistsMail(ctx: AppContext, m: { to: string }): MailMessage {
  return {
    to: m.to,
    subject: 'Someone tried to create a Lariat account with your address',
    text: [
      'Someone (hopefully you) tried to create a Lariat account with this e-mail address, but it already has one.',
      '',
      `Sign in: ${ctx.config.publicUrl}/sign-in`,
      `Forgot your password? Choose a new one: ${ctx.config.publicUrl}/forgot-password`,
      '',
      'If this was not you, you can ignore this e-mail: nothing changed on your account.',
    ].join('\n'),
  };
}
