/**
 * Session tokens: short-lived JWTs (RFC 7519) signed with HS256 and config.sessionSecret (jose).
 * The token names the user (sub) and the server-side session row (jti); the row makes sign-out
 * effective before the token expires.
 */
import { errors, jwtVerify, SignJWT } from 'jose';

const ISSUER = 'lariat';
const AUDIENCE = 'lariat-session';

export interface SessionClaims {
  userId: string;
  sessionId: string;
  expiresAt: Date;
}

const key = (secret: string) => new TextEncoder().encode(secret);

export async function signSessionToken(secret: string, claims: SessionClaims): Promise<string> {
  return new SignJWT({})
    .setProtectedHeader({ alg: 'HS256' })
    .setIssuer(ISSUER)
    .setAudience(AUDIENCE)
    .setSubject(claims.userId)
    .setJti(claims.sessionId)
    .setIssuedAt()
    .setExpirationTime(Math.floor(claims.expiresAt.getTime() / 1000))
    .sign(key(secret));
}

export type VerifyResult = { ok: true; claims: SessionClaims } | { ok: false; reason: 'expired' | 'invalid' };

export async function verifySessionToken(secret: string, token: string): Promise<VerifyResult> {
  try {
    const { payload } = await jwtVerify(token, key(secret), { algorithms: ['HS256'], issuer: ISSUER, audience: AUDIENCE });
    if (!payload.sub || !payload.jti || !payload.exp) return { ok: false, reason: 'invalid' };
    return { ok: true, claims: { userId: payload.sub, sessionId: payload.jti, expiresAt: new Date(payload.exp * 1000) } };
  } catch (err) {
    return { ok: false, reason: err instanceof errors.JWTExpired ? 'expired' : 'invalid' };
  }
}
