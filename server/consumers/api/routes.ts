/**
 * The consumer API under /api/v1, authenticated by API key only (keys/authenticate.ts). Mounted in
 * server/app.ts before the /api JSON parser so scoring gets its own body limit; no route here reads
 * cookies, so CSRF does not apply (see server/auth/csrf.ts).
 *   GET  /api/v1/openapi.json                 the OpenAPI 3.1 document (no key needed)
 *   GET  /api/v1/models                       released models visible to the key
 *   GET  /api/v1/models/:modelId/release      the current release document
 *   POST /api/v1/models/:modelId/score        JSON {rows:[...]} or text/csv -> one result per row
 */
import { inArray } from 'drizzle-orm';
import express, { Router, type Request } from 'express';
import { MAX_SCORE_BYTES } from '../../../shared/consumers';
import type { AppContext } from '../../context';
import { models } from '../../db/schema/index';
import { HttpError, notFound } from '../../http/errors';
import { currentRelease, listCurrentReleases, type ReleaseRow } from '../../releases/index';
import { HIDDEN_MODEL, requestKey, requireApiKey, requireModelInScope, scopedModelIds } from '../keys/authenticate';
import { releasedModel } from './model-cache';
import { openApiDocument } from './openapi';
import { perKeyLimit, refusedKeyLimit } from './rate-limit';
import { releaseDocument } from './release-doc';
import { neededColumns, rowsFromCsv, rowsFromJson, scoreTable } from './score';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

async function visibleRelease(ctx: AppContext, req: Request): Promise<ReleaseRow> {
  const key = requestKey(req);
  const modelId = req.params.modelId;
  if (typeof modelId !== 'string' || !UUID.test(modelId)) throw notFound(HIDDEN_MODEL);
  await requireModelInScope(ctx, key, modelId);
  // The key's own workspace only: a model of another workspace is simply not found.
  const release = await currentRelease(ctx.db, key.workspaceId, modelId);
  if (!release) throw notFound(HIDDEN_MODEL);
  return release;
}

export function consumerApiRouter(ctx: AppContext): Router {
  const router = Router();
  // Start of the server's work on a request, for the Server-Timing header of scoring answers.
  router.use((_req, res, next) => {
    res.locals.startedAt = performance.now();
    next();
  });
  router.get('/openapi.json', (_req, res) => {
    res.json(openApiDocument(ctx.config.publicUrl));
  });
  const authenticate = requireApiKey(ctx);
  const refused = refusedKeyLimit(ctx.config);
  const perKey = perKeyLimit(ctx.config);
  // Refused keys counted per address first; then the key; then its own request budget.
  const key = Router().use(refused, authenticate, perKey);
  router.get('/models', key, async (req, res) => {
    const k = requestKey(req);
    const scope = await scopedModelIds(ctx, k);
    const releases = (await listCurrentReleases(ctx.db, k.workspaceId)).filter((r) => !scope || scope.has(r.modelId));
    const rows = releases.length > 0 ? await ctx.db.select({ id: models.id, outcome: models.outcome, family: models.family }).from(models).where(inArray(models.id, releases.map((r) => r.modelId))) : [];
    res.json({
      models: releases.map((r) => {
        const m = rows.find((x) => x.id === r.modelId)!;
        return { id: r.modelId, name: r.modelName, outcome: m.outcome, family: m.family, release: { id: r.id, number: r.number, fitId: r.fitId, fitVersion: r.fitVersion, releasedAt: r.releasedAt.toISOString() } };
      }),
    });
  });
  router.get('/models/:modelId/release', key, async (req, res) => {
    res.json(await releaseDocument(ctx.db, await visibleRelease(ctx, req)));
  });
  router.post(
    '/models/:modelId/score',
    key,
    express.json({ limit: MAX_SCORE_BYTES, strict: true }),
    express.raw({ type: ['text/csv', 'application/csv'], limit: MAX_SCORE_BYTES }),
    async (req, res) => {
      const release = await visibleRelease(ctx, req);
      const model = await releasedModel(ctx.db, release.workspaceId, release.fitId, release.lambdaIndex);
      const needed = neededColumns(model);
      let answer;
      if (req.is('application/json')) {
        const { table, absent } = rowsFromJson(req.body, needed);
        answer = scoreTable(model, release, table, absent);
      } else if (req.is(['text/csv', 'application/csv'])) {
        if (!Buffer.isBuffer(req.body) || req.body.length === 0) throw new HttpError(400, 'The CSV body is empty.', 'body');
        answer = scoreTable(model, release, rowsFromCsv(req.body, needed));
      } else {
        throw new HttpError(415, 'Send the rows as application/json ({"rows": [...]}) or as text/csv.', 'Content-Type');
      }
      const text = JSON.stringify(answer);
      // W3C Server Timing: the server's own time, from the request's arrival to the answer's text.
      res.set('Server-Timing', `app;dur=${(performance.now() - (res.locals.startedAt as number)).toFixed(1)}`);
      res.type('application/json').send(text);
    },
  );
  return router;
}
