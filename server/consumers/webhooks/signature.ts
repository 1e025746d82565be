/**
 * Webhook signatures: `X-Lariat-Signature: v1=<hex HMAC-SHA256(secret, "<timestamp>.<body>")>` with
 * `X-Lariat-Timestamp: <unix seconds>`. Signing the timestamp with the body lets a receiver refuse a
 * replayed delivery (older than WEBHOOK_TOLERANCE_SECONDS) without being able to forge a fresh one.
 * `verifyWebhookSignature` is what a receiver runs (the tests' receiver uses it; docs show it).
 */
import { createHmac, timingSafeEqual } from 'node:crypto';
import { WEBHOOK_TOLERANCE_SECONDS } from '../../../shared/consumers';

export function signWebhook(secret: string, timestamp: number, body: string): string {
  return `v1=${createHmac('sha256', secret).update(`${timestamp}.${body}`, 'utf8').digest('hex')}`;
}

export function verifyWebhookSignature(
  secret: string,
  headers: { signature: string | undefined; timestamp: string | undefined },
  body: string,
  nowSeconds = Math.floor(Date.now() / 1000),
): { ok: true } | { ok: false; reason: string } {
  const t = Number(headers.timestamp);
  if (!headers.timestamp || !Number.isInteger(t)) return { ok: false, reason: 'no timestamp' };
  if (Math.abs(nowSeconds - t) > WEBHOOK_TOLERANCE_SECONDS) return { ok: false, reason: 'timestamp outside the tolerance (replay?)' };
  const expected = Buffer.from(signWebhook(secret, t, body));
  const given = Buffer.from(headers.signature ?? '');
  if (given.length !== expected.length || !timingSafeEqual(given, expected)) return { ok: false, reason: 'signature does not match' };
  return { ok: true };
}
