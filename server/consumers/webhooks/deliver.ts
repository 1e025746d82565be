/**
 * Announcing releases to webhooks. `notifyRelease` (called by the release half once a release is
 * stored) records one pending delivery per matching webhook and queues a job for each; the job
 * (`deliverWebhook`) POSTs the signed JSON and appends the try to the delivery's history. A failed
 * try throws, so pg-boss retries it with doubling delays; after WEBHOOK_MAX_ATTEMPTS tries the
 * delivery is marked failed and no longer retried. The job data is only the delivery id (no secret
 * sits in the queue's tables).
 */
import http from 'node:http';
import https from 'node:https';
import { and, eq, isNull, or, sql } from 'drizzle-orm';
import { WEBHOOK_DELIVERY_HEADER, WEBHOOK_SIGNATURE_HEADER, WEBHOOK_TIMESTAMP_HEADER, type ReleaseEventDto } from '../../../shared/consumers';
import type { AppContext } from '../../context';
import { fits, models, webhookDeliveries, webhooks, type DeliveryAttempt } from '../../db/schema/index';
import { reportUnexpected } from '../../http/unexpected';
import { guardedLookup, webhookUrlProblem } from './address-check';
import { signWebhook } from './signature';

export const WEBHOOK_JOB = 'webhook-delivery';
export const WEBHOOK_MAX_ATTEMPTS = 6;
const TIMEOUT_MS = 10_000;

export interface ReleaseNotice {
  id: string;
  workspaceId: string;
  modelId: string;
  fitId: string;
  number: number;
  releasedAt?: Date;
}

/** Never throws into the caller (a release is stored whatever happens to its announcements). */
export async function notifyRelease(ctx: AppContext, release: ReleaseNotice): Promise<number> {
  try {
    const hooks = await ctx.db
      .select({ id: webhooks.id })
      .from(webhooks)
      .where(and(eq(webhooks.workspaceId, release.workspaceId), isNull(webhooks.removedAt), or(isNull(webhooks.modelId), eq(webhooks.modelId, release.modelId))));
    if (hooks.length === 0) return 0;
    const [model] = await ctx.db.select({ name: models.name }).from(models).where(eq(models.id, release.modelId));
    const [fit] = await ctx.db.select({ version: fits.version }).from(fits).where(eq(fits.id, release.fitId));
    for (const hook of hooks) {
      const [delivery] = await ctx.db
        .insert(webhookDeliveries)
        .values({ webhookId: hook.id, workspaceId: release.workspaceId, releaseId: release.id, event: 'release.published', payload: {} })
        .returning({ id: webhookDeliveries.id });
      const payload: ReleaseEventDto = {
        event: 'release.published',
        deliveryId: delivery.id,
        workspaceId: release.workspaceId,
        model: { id: release.modelId, name: model?.name ?? '' },
        release: { id: release.id, number: release.number, fitId: release.fitId, fitVersion: fit?.version ?? 0, releasedAt: (release.releasedAt ?? new Date()).toISOString() },
        url: `${ctx.config.publicUrl}/api/v1/models/${release.modelId}/release`,
      };
      await ctx.db.update(webhookDeliveries).set({ payload: payload as unknown as Record<string, unknown> }).where(eq(webhookDeliveries.id, delivery.id));
      await ctx.queue.send(WEBHOOK_JOB, { deliveryId: delivery.id });
    }
    return hooks.length;
  } catch (error) {
    reportUnexpected(error, 'webhook notify');
    return 0;
  }
}

function post(ctx: AppContext, url: URL, body: string, headers: Record<string, string>): Promise<number> {
  const client = url.protocol === 'https:' ? https : http;
  return new Promise((resolve, reject) => {
    const req = client.request(
      url,
      { method: 'POST', headers: { ...headers, 'Content-Length': String(Buffer.byteLength(body)) }, lookup: guardedLookup(ctx.config), timeout: TIMEOUT_MS },
      (res) => {
        res.resume(); // the answer's body is not read nor kept
        res.on('end', () => resolve(res.statusCode ?? 0));
        res.on('error', reject);
      },
    );
    req.on('timeout', () => req.destroy(new Error(`no answer within ${TIMEOUT_MS / 1000} s`)));
    req.on('error', reject);
    req.end(body);
  });
}

export async function deliverWebhook(ctx: AppContext, deliveryId: string): Promise<void> {
  const [row] = await ctx.db
    .select({ delivery: webhookDeliveries, url: webhooks.url, secret: webhooks.secret, removedAt: webhooks.removedAt })
    .from(webhookDeliveries)
    .innerJoin(webhooks, eq(webhooks.id, webhookDeliveries.webhookId))
    .where(eq(webhookDeliveries.id, deliveryId));
  if (!row || row.delivery.state !== 'pending') return;
  if (row.removedAt) {
    await ctx.db.update(webhookDeliveries).set({ state: 'failed' }).where(eq(webhookDeliveries.id, deliveryId));
    return;
  }
  const body = JSON.stringify(row.delivery.payload);
  const timestamp = Math.floor(Date.now() / 1000);
  const started = Date.now();
  let status: number | null = null;
  let error: string | null = null;
  const problem = await webhookUrlProblem(ctx.config, row.url);
  if (problem) error = problem;
  else {
    try {
      status = await post(ctx, new URL(row.url), body, {
        'Content-Type': 'application/json',
        'User-Agent': 'Lariat-Webhooks/1',
        [WEBHOOK_DELIVERY_HEADER]: deliveryId,
        [WEBHOOK_TIMESTAMP_HEADER]: String(timestamp),
        [WEBHOOK_SIGNATURE_HEADER]: signWebhook(row.secret, timestamp, body),
      });
      if (status < 200 || status >= 300) error = `the receiver answered HTTP ${status}`;
    } catch (e) {
      error = e instanceof Error ? e.message.slice(0, 300) : 'the request failed';
    }
  }
  const attempt: DeliveryAttempt = { at: new Date(started).toISOString(), status, error, ms: Date.now() - started };
  const attemptCount = row.delivery.attemptCount + 1;
  const state = error === null ? 'delivered' : attemptCount >= WEBHOOK_MAX_ATTEMPTS ? 'failed' : 'pending';
  await ctx.db
    .update(webhookDeliveries)
    .set({
      attemptCount,
      attempts: sql`${webhookDeliveries.attempts} || ${JSON.stringify([attempt])}::jsonb`,
      state,
      deliveredAt: error === null ? new Date() : null,
    })
    .where(eq(webhookDeliveries.id, deliveryId));
  // Thrown so pg-boss schedules the next try (its log line carries no URL nor secret).
  if (state === 'pending') throw new Error(`webhook delivery attempt ${attemptCount} failed`);
}

export async function startWebhookWorker(ctx: AppContext): Promise<void> {
  await ctx.queue.work<{ deliveryId: string }>(WEBHOOK_JOB, (data) => deliverWebhook(ctx, data.deliveryId), {
    retryLimit: WEBHOOK_MAX_ATTEMPTS - 1,
    retryDelaySeconds: ctx.config.LARIAT_WEBHOOK_RETRY_SECONDS,
    retryBackoff: true,
  });
}
