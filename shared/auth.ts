/**
 * Accounts: sign-up, sign-in, password reset and invitation acceptance. One zod schema per request
 * body, with its limits, parsed by the client forms and by the Express handlers (STYLE.md 3). The
 * server adds only the checks that need the database (e.g. "the password is not your e-mail" when the
 * e-mail comes from an invitation or a reset link).
 */
import { z } from 'zod';
import type { WorkspaceRole } from './members';
import { singleLine } from './text';
import { workspaceNameSchema } from './workspaces';

export const EMAIL_MAX = 254;
export const NAME_MAX = 100;
export const PASSWORD_MIN = 12;
/** argon2 accepts longer, but an upper bound keeps a single request's hashing cost predictable. */
export const PASSWORD_MAX = 200;
/** Weak-password rule (common practice, our own threshold): at least this many different characters. */
export const PASSWORD_MIN_DISTINCT = 5;

export const emailSchema = singleLine(
  z
    .string({ error: 'Enter an e-mail address.' })
    .trim()
    .toLowerCase()
    .max(EMAIL_MAX, `An e-mail address has at most ${EMAIL_MAX} characters.`),
).pipe(z.email({ error: 'Enter a valid e-mail address, like name@example.com.' }));

export const personNameSchema = singleLine(
  z
    .string({ error: 'Enter your name.' })
    .trim()
    .min(1, 'Enter your name.')
    .max(NAME_MAX, `A name has at most ${NAME_MAX} characters.`),
);

/**
 * Why a password is too weak, or null. Length first, then "not trivially weak": too few different
 * characters (e.g. "aaaaaaaaaaaa", "abababababab"), a straight run ("123456789012", "abcdefghijkl"),
 * or the e-mail address (or its part before the @).
 */
export function passwordProblem(password: string, email?: string): string | null {
  if (password.length < PASSWORD_MIN) return `A password needs at least ${PASSWORD_MIN} characters.`;
  if (password.length > PASSWORD_MAX) return `A password has at most ${PASSWORD_MAX} characters.`;
  if (new Set(password).size < PASSWORD_MIN_DISTINCT) {
    return `This password repeats too few characters; use at least ${PASSWORD_MIN_DISTINCT} different ones.`;
  }
  if (isStraightRun(password.toLowerCase())) return 'This password is a simple run of characters; choose something less guessable.';
  if (email) {
    const lower = password.toLowerCase();
    const address = email.trim().toLowerCase();
    const local = address.split('@')[0];
    if (lower === address || lower === local || lower.includes(address)) {
      return 'A password cannot be your e-mail address.';
    }
  }
  return null;
}

/** Every character one up (or one down) from the last; digits wrap 9 -> 0 as on a keyboard row. */
function isStraightRun(s: string): boolean {
  const next = (a: string, b: string, step: number) =>
    b.charCodeAt(0) - a.charCodeAt(0) === step || (step === 1 ? a === '9' && b === '0' : a === '0' && b === '9');
  for (const step of [1, -1]) {
    let run = true;
    for (let i = 1; i < s.length && run; i++) run = next(s[i - 1], s[i], step);
    if (run) return true;
  }
  return false;
}

export const passwordSchema = z
  .string({ error: 'Enter a password.' })
  .superRefine((value, ctx) => {
    const problem = passwordProblem(value);
    if (problem) ctx.addIssue({ code: 'custom', message: problem });
  });

/** Adds the "not your e-mail" rule to a body that carries both `email` and `password`. */
function passwordNotEmail(body: { email: string; password: string }, ctx: z.RefinementCtx): void {
  const problem = passwordProblem(body.password, body.email);
  if (problem) ctx.addIssue({ code: 'custom', path: ['password'], message: problem });
}

/** POST /api/auth/sign-up: every sign-up gets a new workspace of its own, as its admin. */
export const signUpSchema = z
  .strictObject({
    email: emailSchema,
    password: passwordSchema,
    name: personNameSchema,
    workspaceName: workspaceNameSchema.optional(),
  })
  .superRefine(passwordNotEmail);
export type SignUpInput = z.input<typeof signUpSchema>;

/** The answer to every valid sign-up: the e-mailed link creates the account (or tells its owner it exists). */
export const SIGN_UP_ACCEPTED = 'Check your inbox: we sent you a link to finish creating your account. It works for 1 hour.';

/** POST /api/auth/sign-in: no strength rules here, only bounds. */
export const signInSchema = z.strictObject({
  email: emailSchema,
  password: z.string({ error: 'Enter your password.' }).min(1, 'Enter your password.').max(PASSWORD_MAX, `A password has at most ${PASSWORD_MAX} characters.`),
});
export type SignInInput = z.input<typeof signInSchema>;

/** POST /api/auth/password-reset/request: always answered 202, whether or not the account exists. */
export const passwordResetRequestSchema = z.strictObject({ email: emailSchema });

export const TOKEN_MAX = 200;
export const tokenSchema = singleLine(z.string({ error: 'The link is missing its token.' }).min(1, 'The link is missing its token.').max(TOKEN_MAX, 'This link is not valid.'));

/** POST /api/auth/sign-up/complete: the token from the e-mailed link. */
export const completeSignUpSchema = z.strictObject({ token: tokenSchema });

/** POST /api/auth/password-reset/complete */
export const passwordResetCompleteSchema = z.strictObject({ token: tokenSchema, password: passwordSchema });

/** POST /api/invitations/:token/accept: name and password for a new account; nothing when signed in. */
export const acceptInvitationSchema = z.strictObject({
  name: personNameSchema.optional(),
  password: passwordSchema.optional(),
});

export interface UserDto {
  id: string;
  email: string;
  name: string;
}

export interface MembershipSummaryDto {
  workspaceId: string;
  workspaceName: string;
  role: WorkspaceRole;
}

/** GET /api/auth/me; also the answer to sign-up and sign-in. */
export interface MeDto {
  user: UserDto;
  memberships: MembershipSummaryDto[];
  /** Echo this in the X-Lariat-CSRF header on every state-changing request. */
  csrfToken: string;
  /** Whether GET /api/dev/outbox exists on this server (so the client asks for it only then). */
  devOutbox: boolean;
}

/** GET /api/auth/sessions: one signed-in browser of the person. */
export interface SessionDto {
  /** A public name for the session (not its secret id). */
  id: string;
  signedInAt: string;
  /** When it ends if unused (sliding). */
  expiresAt: string;
  /** When it ends however active (absolute). */
  endsAt: string;
  userAgent: string | null;
  /** The session this request came from. */
  current: boolean;
}

/** POST /api/auth/password: change the password, knowing the current one. */
export const changePasswordSchema = z.strictObject({
  currentPassword: z.string({ error: 'Enter your current password.' }).min(1, 'Enter your current password.').max(PASSWORD_MAX, `A password has at most ${PASSWORD_MAX} characters.`),
  newPassword: passwordSchema,
});
export type ChangePasswordInput = z.input<typeof changePasswordSchema>;

/** Over http the cookie is `lariat_csrf`; over https `__Host-lariat_csrf` (server/auth/cookies.ts). */
export const CSRF_COOKIE = 'lariat_csrf';
export const CSRF_HEADER = 'X-Lariat-CSRF';
