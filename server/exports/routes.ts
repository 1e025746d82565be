/**
 * Exports of any finished fit, for every member of its workspace (GET only, so no CSRF token):
 *   GET /api/workspaces/:workspaceId/fits/:fitId/exports/coefficients.csv[?index=L]
 *   GET .../exports/fit.json            the fit detail as the app shows it, with the cautions
 *   GET .../exports/model.pmml[?index=L] PMML 4.4 at the chosen lambda (or lambda position L)
 *   GET .../exports/bundle.json          the reproducibility bundle
 * Every export carries the statistical cautions (shared/cautions.ts).
 */
import type { Request, Response } from 'express';
import { Router } from 'express';
import { z } from 'zod';
import { eq } from 'drizzle-orm';
import { CAUTION_LINES } from '../../shared/cautions';
import { anyMember, workspaceMembership } from '../auth/middleware';
import type { AppContext } from '../context';
import type { Database } from '../db/client';
import { models } from '../db/schema/index';
import { contentDisposition } from '../datasets/routes/params';
import { fromZod, notFound } from '../http/errors';
import { getFitDetail } from '../fits/service/detail';
import { reproBundle } from './bundle';
import { loadChosenModel, type ChosenModel } from './chosen-model';
import { coefficientsCsv } from './coefficients-csv';
import { fitToPmml } from './pmml';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const indexQuery = z.strictObject({ index: z.coerce.number().int('index: a whole lambda position.').min(0, 'index: a lambda position from 0.').optional() });

async function chosen(ctx: AppContext, req: Request): Promise<{ model: ChosenModel; name: string }> {
  const fitId = req.params.fitId;
  if (typeof fitId !== 'string' || !UUID.test(fitId)) throw notFound('No such fit in this workspace.');
  const query = indexQuery.safeParse(req.query);
  if (!query.success) throw fromZod(query.error, 'query');
  const model = await loadChosenModel(ctx.db, workspaceMembership(req).workspaceId, fitId, query.data.index);
  return { model, name: await modelName(ctx.db, model.fit.modelId) };
}

async function modelName(db: Database, modelId: string): Promise<string> {
  const [row] = await db.select({ name: models.name }).from(models).where(eq(models.id, modelId));
  return row?.name ?? 'model';
}

function download(res: Response, type: string, fileName: string, body: string): void {
  res.set({ 'Content-Type': type, 'Content-Disposition': contentDisposition(fileName), 'Cache-Control': 'no-store' });
  res.send(body);
}

export function exportsRouter(ctx: AppContext): Router {
  const router = Router();
  const base = '/workspaces/:workspaceId/fits/:fitId/exports';
  router.get(`${base}/coefficients.csv`, anyMember, async (req, res) => {
    const { model, name } = await chosen(ctx, req);
    download(res, 'text/csv; charset=utf-8', `fit-v${model.fit.version}-coefficients.csv`, coefficientsCsv(model, name));
  });
  router.get(`${base}/model.pmml`, anyMember, async (req, res) => {
    const { model, name } = await chosen(ctx, req);
    download(res, 'application/xml; charset=utf-8', `fit-v${model.fit.version}.pmml`, fitToPmml(model, name));
  });
  router.get(`${base}/bundle.json`, anyMember, async (req, res) => {
    const { model, name } = await chosen(ctx, req);
    download(res, 'application/json; charset=utf-8', `fit-v${model.fit.version}-bundle.json`, JSON.stringify(reproBundle(model, name), null, 2));
  });
  router.get(`${base}/fit.json`, anyMember, async (req, res) => {
    const { model } = await chosen(ctx, req); // refuses an unfinished fit like the other exports
    const detail = await getFitDetail(ctx.db, workspaceMembership(req).workspaceId, model.fit.id);
    const body = { format: 'lariat-fit', formatVersion: 1, exportedAt: new Date().toISOString(), standardization: model.results.standardization ?? null, fit: detail, cautions: CAUTION_LINES };
    download(res, 'application/json; charset=utf-8', `fit-v${model.fit.version}.json`, JSON.stringify(body, null, 2));
  });
  return router;
}
