/**
 * POST .../datasets/uploads?ingest=<uuid>: multipart upload (fields name, description, datasetId,
 * missing; then the part "file"). The request stays open until the ingest ends and answers 201 (new
 * version), 200 (identical file, nothing stored) or 4xx; meanwhile GET .../ingests/<uuid> reports
 * progress (docs/decisions/0004-upload-progress.md).
 */
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { Router } from 'express';
import { ingestIdSchema, parseMissingMarkers, uploadFieldsSchema } from '../../../shared/datasets';
import { anyMember, requireWorkspaceRole, sessionUser, workspaceMembership } from '../../auth/middleware';
import type { AppContext } from '../../context';
import { fromZod, HttpError, notFound } from '../../http/errors';
import { ingestFile } from '../service/ingest';
import { publicIngestFailure } from '../service/ingest-errors';
import { IngestBusy, RETRY_AFTER_SECONDS, type IngestGate } from '../service/ingest-gate';
import { sweepIngestLeftovers } from '../service/leftovers';
import { readProgress, startProgress } from '../service/progress';
import { ClientGone, receiveUpload } from './receive-upload';

export function uploadsRouter(ctx: AppContext, gate: IngestGate): Router {
  const router = Router();
  const tempDir = path.resolve(ctx.config.LARIAT_STATE_DIR, 'ingest');
  const limitBytes = Math.floor(ctx.config.LARIAT_UPLOAD_LIMIT_MB * 1024 * 1024);
  sweepIngestLeftovers(tempDir); // the router is built once, at start-up

  router.post('/workspaces/:workspaceId/datasets/uploads', requireWorkspaceRole('admin', 'analyst'), async (req, res) => {
    const { workspaceId } = workspaceMembership(req);
    const ingest = ingestIdSchema.safeParse(req.query.ingest ?? randomUUID());
    if (!ingest.success) throw fromZod(ingest.error, 'ingest');
    const progress = startProgress(ingest.data, workspaceId);
    let filePath: string | null = null;
    let release: (() => void) | null = null;
    try {
      if (gate.full()) throw new IngestBusy(); // before the transfer, which would be wasted
      const upload = await receiveUpload(req, { limitBytes, tempDir, onBytes: (b) => progress.receiving(b) });
      filePath = upload.filePath;
      const fields = uploadFieldsSchema.safeParse(upload.fields);
      if (!fields.success) throw fromZod(fields.error, 'fields');
      release = await gate.enter(() => progress.phase('queued', 0));
      const result = await ingestFile(ctx.db, {
        workspaceId,
        userId: sessionUser(req).id,
        datasetId: fields.data.datasetId,
        name: fields.data.name,
        description: fields.data.description,
        filePath: upload.filePath,
        fileName: upload.fileName,
        sha256: upload.sha256,
        sizeBytes: upload.sizeBytes,
        missingMarkers: parseMissingMarkers(fields.data.missing),
        columnLimit: ctx.config.LARIAT_COLUMN_LIMIT,
        headerRow: fields.data.headerRow !== 'no',
        tempDir,
        progress,
      });
      progress.finish(result.message);
      res.status(result.duplicate ? 200 : 201).json(result);
    } catch (error) {
      if (error instanceof ClientGone) {
        progress.fail(error.message);
        return;
      }
      // Only Lariat's own messages reach the uploader and the progress entry (ingest-errors.ts).
      const failure = publicIngestFailure(error);
      progress.fail(failure.message);
      if (failure.status === 413 || failure.status === 429) res.set('Connection', 'close'); // stop receiving the rest
      if (failure.status === 429) res.set('Retry-After', String(RETRY_AFTER_SECONDS));
      throw new HttpError(failure.status, failure.message, failure.field);
    } finally {
      release?.();
      if (filePath) fs.rm(filePath, { force: true }, () => undefined);
    }
  });

  router.get('/workspaces/:workspaceId/ingests/:ingestId', anyMember, (req, res) => {
    const found = readProgress(String(req.params.ingestId), workspaceMembership(req).workspaceId);
    if (!found) throw notFound('No such upload in progress (it may have finished more than ten minutes ago).');
    res.json(found);
  });

  return router;
}
