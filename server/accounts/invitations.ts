/**
 * Invitations into a workspace with a role. The e-mailed token is random, stored only hashed, valid
 * for INVITATION_DAYS, and used once: acceptance claims it with a conditional UPDATE inside the same
 * transaction that creates the membership (and the account, for a new person).
 */
import { and, asc, eq, gt, isNull, lt, ne } from 'drizzle-orm';
import { passwordProblem, type UserDto } from '../../shared/auth';
import { INVITATION_DAYS, type InvitationDto, type InvitationPreviewDto, type WorkspaceRole } from '../../shared/members';
import { hashPassword } from '../auth/passwords';
import { hashToken, randomToken } from '../auth/tokens';
import type { AppContext } from '../context';
import type { Database } from '../db/client';
import { invitations, users, workspaces } from '../db/schema/auth';
import { badRequest, conflict, forbidden, HttpError, notFound } from '../http/errors';
import { isUniqueViolation } from './executor';
import { invitationMail } from './mail';
import { addMember, listMembers } from './memberships';
import { findUserByEmail, insertUser } from './users';

const DAY_MS = 86_400_000;
const live = () => and(isNull(invitations.acceptedAt), isNull(invitations.revokedAt), gt(invitations.expiresAt, new Date()));

const dtoColumns = {
  id: invitations.id,
  email: invitations.email,
  role: invitations.role,
  invitedByName: users.name,
  createdAt: invitations.createdAt,
  expiresAt: invitations.expiresAt,
};

function toDto(r: { id: string; email: string; role: WorkspaceRole; invitedByName: string | null; createdAt: Date; expiresAt: Date }): InvitationDto {
  return { ...r, createdAt: r.createdAt.toISOString(), expiresAt: r.expiresAt.toISOString() };
}

/**
 * Creates an invitation and queues its e-mail (invitation-mail.ts). An older pending invitation for
 * the same address stays valid until the new one's e-mail has gone out, so a mail relay failure
 * never leaves the person with no working link; the job retries the e-mail until the relay takes it.
 */
export async function invite(ctx: AppContext, workspaceId: string, inviter: UserDto, input: { email: string; role: WorkspaceRole }): Promise<InvitationDto> {
  const members = await listMembers(ctx.db, workspaceId);
  if (members.some((m) => m.email === input.email)) throw conflict(`${input.email} is already a member of this workspace.`, 'email');
  // The token is made when the e-mail is sent (no usable token ever sits in the job table); until
  // then the row holds the hash of a token nobody has.
  const [created] = await ctx.db
    .insert(invitations)
    .values({ workspaceId, email: input.email, role: input.role, tokenHash: hashToken(randomToken()), invitedBy: inviter.id, expiresAt: new Date(Date.now() + INVITATION_DAYS * DAY_MS) })
    .returning();
  await ctx.queue.send(INVITATION_MAIL_JOB, { invitationId: created.id });
  return toDto({ ...created, invitedByName: inviter.name });
}

export const INVITATION_MAIL_JOB = 'invitation-mail';

/**
 * The queued job: a fresh token for a still-pending invitation, its e-mail, and then (only once the
 * relay took the e-mail) the end of older pending invitations to the same address in that workspace.
 * Throws when the relay refuses, so the queue retries.
 */
export async function sendInvitationMail(ctx: AppContext, invitationId: string): Promise<void> {
  const token = randomToken();
  const [row] = await ctx.db
    .update(invitations)
    .set({ tokenHash: hashToken(token) })
    .where(and(eq(invitations.id, invitationId), live()))
    .returning();
  if (!row) return; // withdrawn, accepted or expired since: nothing to send
  const [ws] = await ctx.db.select({ name: workspaces.name }).from(workspaces).where(eq(workspaces.id, row.workspaceId));
  const inviter = row.invitedBy ? await ctx.db.select({ name: users.name }).from(users).where(eq(users.id, row.invitedBy)) : [];
  await ctx.sendMail(
    invitationMail(ctx, { to: row.email, token, workspaceId: row.workspaceId, workspaceName: ws.name, role: row.role, invitedBy: inviter[0]?.name ?? 'An admin' }),
  );
  await ctx.db.transaction(async (tx) => {
    await tx.update(invitations).set({ mailedAt: new Date() }).where(eq(invitations.id, row.id));
    await tx
      .update(invitations)
      .set({ revokedAt: new Date() })
      .where(and(eq(invitations.workspaceId, row.workspaceId), eq(invitations.email, row.email), ne(invitations.id, row.id), lt(invitations.createdAt, row.createdAt), live()));
  });
}

export async function listPendingInvitations(db: Database, workspaceId: string): Promise<InvitationDto[]> {
  const rows = await db
    .select(dtoColumns)
    .from(invitations)
    .leftJoin(users, eq(users.id, invitations.invitedBy))
    .where(and(eq(invitations.workspaceId, workspaceId), live()))
    .orderBy(asc(invitations.createdAt));
  return rows.map(toDto);
}

export async function revokeInvitation(db: Database, workspaceId: string, invitationId: string): Promise<void> {
  const rows = await db
    .update(invitations)
    .set({ revokedAt: new Date() })
    .where(and(eq(invitations.id, invitationId), eq(invitations.workspaceId, workspaceId), live()))
    .returning({ id: invitations.id });
  if (rows.length === 0) throw notFound('No such pending invitation in this workspace.');
}

interface StoredInvitation {
  id: string;
  workspaceId: string;
  workspaceName: string;
  email: string;
  role: WorkspaceRole;
  invitedByName: string | null;
  expiresAt: Date;
}

/** The invitation behind a token, or a clear 4xx: unknown (404), used, withdrawn or expired (410). */
async function usableInvitation(db: Database, token: string): Promise<StoredInvitation> {
  const [row] = await db
    .select({ ...dtoColumns, workspaceId: invitations.workspaceId, workspaceName: workspaces.name, acceptedAt: invitations.acceptedAt, revokedAt: invitations.revokedAt })
    .from(invitations)
    .innerJoin(workspaces, eq(workspaces.id, invitations.workspaceId))
    .leftJoin(users, eq(users.id, invitations.invitedBy))
    .where(eq(invitations.tokenHash, hashToken(token)))
    .limit(1);
  if (!row) throw new HttpError(404, 'This invitation link is not valid. Check that you copied the whole link.', 'token');
  if (row.acceptedAt) throw new HttpError(410, 'This invitation link has already been used. Sign in instead.', 'token');
  if (row.revokedAt) throw new HttpError(410, 'This invitation was withdrawn or replaced by a newer one. Ask an admin of the workspace for a new one.', 'token');
  if (row.expiresAt.getTime() <= Date.now()) throw new HttpError(410, 'This invitation has expired. Ask an admin of the workspace to send a new one.', 'token');
  return row;
}

export async function previewInvitation(db: Database, token: string): Promise<InvitationPreviewDto> {
  const inv = await usableInvitation(db, token);
  const account = await findUserByEmail(db, inv.email);
  return { workspaceName: inv.workspaceName, email: inv.email, role: inv.role, invitedByName: inv.invitedByName, expiresAt: inv.expiresAt.toISOString(), accountExists: account !== null };
}

export interface AcceptResult {
  user: UserDto;
  workspaceId: string;
  role: WorkspaceRole;
  /** True when a new account was created (the route then signs it in). */
  created: boolean;
}

/**
 * Accepts an invitation. Signed in: the account's e-mail must be the invited one. Not signed in: the
 * e-mail must not have an account yet (else: sign in first), and `name` and `password` are required.
 */
export async function acceptInvitation(db: Database, token: string, signedIn: UserDto | null, body: { name?: string; password?: string }): Promise<AcceptResult> {
  const inv = await usableInvitation(db, token);
  let newAccount: { name: string; passwordHash: string } | null = null;
  if (signedIn) {
    if (signedIn.email !== inv.email) throw forbidden(`This invitation is for ${inv.email}, but you are signed in as ${signedIn.email}. Sign out and open the link again.`);
  } else {
    if (await findUserByEmail(db, inv.email)) throw conflict(`${inv.email} already has a Lariat account: sign in, then open the invitation link again.`, 'email');
    if (!body.name) throw badRequest('name: Enter your name.', 'name');
    if (!body.password) throw badRequest('password: Choose a password.', 'password');
    const problem = passwordProblem(body.password, inv.email);
    if (problem) throw badRequest(`password: ${problem}`, 'password');
    newAccount = { name: body.name, passwordHash: await hashPassword(body.password) };
  }
  try {
    return await claimAndJoin(db, inv, signedIn, newAccount);
  } catch (err) {
    if (isUniqueViolation(err)) throw conflict(`${inv.email} already has a Lariat account: sign in, then open the invitation link again.`, 'email');
    throw err;
  }
}

async function claimAndJoin(db: Database, inv: StoredInvitation, signedIn: UserDto | null, newAccount: { name: string; passwordHash: string } | null): Promise<AcceptResult> {
  return db.transaction(async (tx) => {
    const claimed = await tx
      .update(invitations)
      .set({ acceptedAt: new Date() })
      .where(and(eq(invitations.id, inv.id), live()))
      .returning({ id: invitations.id });
    if (claimed.length === 0) throw new HttpError(410, 'This invitation link has already been used. Sign in instead.', 'token');
    const user = newAccount ? await insertUser(tx, { email: inv.email, ...newAccount }) : (signedIn as UserDto);
    await tx.update(invitations).set({ acceptedBy: user.id }).where(eq(invitations.id, inv.id));
    await addMember(tx, inv.workspaceId, user.id, inv.role);
    return { user: { id: user.id, email: user.email, name: user.name }, workspaceId: inv.workspaceId, role: inv.role, created: newAccount !== null };
  });
}
