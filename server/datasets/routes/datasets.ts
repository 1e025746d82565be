/** Reading, deleting, column settings, downloads and open-dataset imports under /api/workspaces/:workspaceId. */
import { Router } from 'express';
import { columnSettingsSchema } from '../../../shared/datasets';
import { anyMember, requireWorkspaceRole, sessionUser, workspaceMembership } from '../../auth/middleware';
import type { AppContext } from '../../context';
import { fromZod } from '../../http/errors';
import { changeColumnSettings } from '../service/column-settings';
import { deleteDataset, getDataset, getVersion, listDatasets, requireVersion } from '../service/datasets';
import { prepareCleanedCsv } from '../service/export';
import { originalChunks } from '../service/original';
import { IngestBusy, RETRY_AFTER_SECONDS, type IngestGate } from '../service/ingest-gate';
import { importOpenDataset, listOpenDatasets } from '../service/open-datasets';
import { previewRows } from '../service/preview';
import { contentDisposition, datasetIdParam, intQuery, versionParam } from './params';
import { sendStream } from './send-stream';

export function datasetsRouter(ctx: AppContext, gate: IngestGate): Router {
  const router = Router();
  const editor = requireWorkspaceRole('admin', 'analyst');
  const base = '/workspaces/:workspaceId/datasets';
  const version = `${base}/:datasetId/versions/:number`;
  const scope = (req: Parameters<typeof datasetIdParam>[0]) => ({
    workspaceId: workspaceMembership(req).workspaceId,
    datasetId: datasetIdParam(req),
    number: versionParam(req),
  });

  router.get(base, anyMember, async (req, res) => {
    const datasets = await listDatasets(ctx.db, workspaceMembership(req).workspaceId);
    res.json({ datasets, uploadLimitBytes: Math.floor(ctx.config.LARIAT_UPLOAD_LIMIT_MB * 1024 * 1024), columnLimit: ctx.config.LARIAT_COLUMN_LIMIT });
  });

  router.get(`${base}/:datasetId`, anyMember, async (req, res) => {
    res.json(await getDataset(ctx.db, workspaceMembership(req).workspaceId, datasetIdParam(req)));
  });

  router.delete(`${base}/:datasetId`, editor, async (req, res) => {
    await deleteDataset(ctx.db, workspaceMembership(req).workspaceId, datasetIdParam(req));
    res.status(204).end();
  });

  router.get(version, anyMember, async (req, res) => {
    const s = scope(req);
    res.json(await getVersion(ctx.db, s.workspaceId, s.datasetId, s.number));
  });

  router.get(`${version}/rows`, anyMember, async (req, res) => {
    res.json(await previewRows(ctx.db, scope(req), intQuery(req, 'offset', 0), intQuery(req, 'limit', 500)));
  });

  router.post(`${version}/column-settings`, editor, async (req, res) => {
    const body = columnSettingsSchema.safeParse(req.body);
    if (!body.success) throw fromZod(body.error);
    res.status(201).json(await changeColumnSettings(ctx.db, { ...scope(req), userId: sessionUser(req).id }, body.data));
  });

  router.get(`${version}/original`, anyMember, async (req, res) => {
    const s = scope(req);
    const { version: v } = await requireVersion(ctx.db, s.workspaceId, s.datasetId, s.number);
    res.set({ 'Content-Type': 'text/csv; charset=utf-8', 'Content-Length': String(v.sizeBytes), 'Content-Disposition': contentDisposition(v.fileName) });
    await sendStream(res, originalChunks(ctx.db, v.uploadId));
  });

  router.get(`${version}/cleaned.csv`, anyMember, async (req, res) => {
    const csv = await prepareCleanedCsv(ctx.db, scope(req));
    res.set({ 'Content-Type': 'text/csv; charset=utf-8', 'Content-Disposition': contentDisposition(csv.fileName) });
    await sendStream(res, csv.chunks());
  });

  router.get('/workspaces/:workspaceId/open-datasets', anyMember, async (req, res) => {
    res.json({ openDatasets: await listOpenDatasets(ctx.db, workspaceMembership(req).workspaceId) });
  });

  router.post('/workspaces/:workspaceId/open-datasets/:key/import', editor, async (req, res) => {
    const release = await gate.enter().catch((error: unknown) => {
      if (error instanceof IngestBusy) res.set('Retry-After', String(RETRY_AFTER_SECONDS));
      throw error;
    });
    let result;
    try {
      result = await importOpenDataset(ctx.db, workspaceMembership(req).workspaceId, sessionUser(req).id, String(req.params.key));
    } finally {
      release();
    }
    res.status(result.duplicate ? 200 : 201).json(result);
  });

  return router;
}
