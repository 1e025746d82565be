/**
 * The fits API under /api/workspaces/:workspaceId (shared/fits.ts FIT_ENDPOINTS). Thin handlers:
 * roles here, everything else in the services. Admins and analysts define models, run fits, cancel
 * them and choose lambda; every member reads. CSRF is checked for every POST by authBase.
 */
import fs from 'node:fs';
import path from 'node:path';
import type { Request } from 'express';
import { Router } from 'express';
import { predictionsQuerySchema } from '../../shared/fits';
import { anyMember, requireWorkspaceRole, sessionUser, workspaceMembership } from '../auth/middleware';
import type { AppContext } from '../context';
import { FileProblem } from '../datasets/parse/errors';
import { contentDisposition } from '../datasets/routes/params';
import { ClientGone, receiveUpload } from '../datasets/routes/receive-upload';
import { fromZod, HttpError, notFound } from '../http/errors';
import { registerFitDependents } from './dependents';
import { cancelFit } from './service/cancel';
import { chooseLambda } from './service/choose';
import { getFitDetail, getProgress, requireFit } from './service/detail';
import { createModel, getModel, listModels } from './service/models';
import { predictCsvFile, predictDatasetVersion, type PredictionsCsv } from './service/predictions';
import { runFit } from './service/run';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

function idParam(req: Request, name: 'modelId' | 'fitId'): string {
  const id = req.params[name];
  if (typeof id !== 'string' || !UUID.test(id)) throw notFound(name === 'modelId' ? 'No such model in this workspace.' : 'No such fit in this workspace.');
  return id;
}

export function fitsRouter(ctx: AppContext): Router {
  registerFitDependents();
  const router = Router();
  const runner = requireWorkspaceRole('admin', 'analyst');
  const base = '/workspaces/:workspaceId';
  const ws = (req: Request) => workspaceMembership(req).workspaceId;

  router.get(`${base}/models`, anyMember, async (req, res) => {
    res.json(await listModels(ctx.db, ws(req)));
  });
  router.post(`${base}/models`, runner, async (req, res) => {
    res.status(201).json(await createModel(ctx.db, ws(req), sessionUser(req).id, req.body));
  });
  router.get(`${base}/models/:modelId`, anyMember, async (req, res) => {
    res.json(await getModel(ctx.db, ws(req), idParam(req, 'modelId')));
  });
  router.post(`${base}/models/:modelId/fits`, runner, async (req, res) => {
    res.status(202).json(await runFit(ctx, ws(req), sessionUser(req).id, idParam(req, 'modelId'), req.body));
  });
  router.get(`${base}/fits/:fitId`, anyMember, async (req, res) => {
    res.json(await getFitDetail(ctx.db, ws(req), idParam(req, 'fitId')));
  });
  router.get(`${base}/fits/:fitId/progress`, anyMember, async (req, res) => {
    res.json(await getProgress(ctx.db, ws(req), idParam(req, 'fitId')));
  });
  router.post(`${base}/fits/:fitId/cancel`, runner, async (req, res) => {
    await cancelFit(ctx.db, ws(req), sessionUser(req).name, idParam(req, 'fitId'));
    res.json(await getFitDetail(ctx.db, ws(req), idParam(req, 'fitId')));
  });
  router.post(`${base}/fits/:fitId/choice`, runner, async (req, res) => {
    await chooseLambda(ctx, ws(req), sessionUser(req).id, idParam(req, 'fitId'), req.body);
    res.json(await getFitDetail(ctx.db, ws(req), idParam(req, 'fitId')));
  });

  const sendCsv = (res: import('express').Response, result: PredictionsCsv) => {
    res.set({
      'Content-Type': 'text/csv; charset=utf-8',
      'Content-Disposition': contentDisposition(result.fileName),
      'X-Lariat-Row-Errors': String(result.rowErrors),
    });
    res.send(result.csv);
  };
  router.get(`${base}/fits/:fitId/predictions`, anyMember, async (req, res) => {
    const query = predictionsQuerySchema.safeParse(req.query);
    if (!query.success) throw fromZod(query.error, 'query');
    sendCsv(res, await predictDatasetVersion(ctx.db, ws(req), idParam(req, 'fitId'), query.data.datasetVersionId));
  });
  router.post(`${base}/fits/:fitId/predictions`, anyMember, async (req, res) => {
    const fitId = idParam(req, 'fitId');
    await requireFit(ctx.db, ws(req), fitId); // 404 before reading a stranger's upload
    const limitBytes = Math.floor(ctx.config.LARIAT_UPLOAD_LIMIT_MB * 1024 * 1024);
    let upload;
    try {
      upload = await receiveUpload(req, { limitBytes, tempDir: path.resolve(ctx.config.LARIAT_STATE_DIR, 'predict') });
    } catch (error) {
      if (error instanceof FileProblem) throw new HttpError(error.status, error.message, error.field);
      if (error instanceof ClientGone) return;
      throw error;
    }
    try {
      const bytes = await fs.promises.readFile(upload.filePath);
      sendCsv(res, await predictCsvFile(ctx.db, ws(req), fitId, bytes, upload.fileName || 'upload.csv'));
    } finally {
      await fs.promises.rm(upload.filePath, { force: true });
    }
  });
  return router;
}
