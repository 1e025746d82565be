/**
 * One ingest: a received file (already on disk with its SHA-256) becomes a new dataset or version
 * N+1 of an existing one. A file identical to one already stored (same checksum) stores nothing.
 * Everything is written in one transaction, so a failure leaves no dataset, upload or version.
 */
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import type { UploadResultDto } from '../../../shared/datasets';
import type { Database } from '../../db/client';
import { notFound } from '../../http/errors';
import { findDataset, insertDataset, nextVersionNumber } from '../data/datasets';
import { insertColumn, insertFileChunk, insertUpload } from '../data/uploads';
import { findVersionByChecksum, findVersionRowById, insertVersion } from '../data/versions';
import { inferColumn } from '../parse/infer';
import { parseCsvFile } from '../parse/parse-file';
import { buildReport, columnSchema, encodeColumn } from './build-columns';
import { versionSummary } from './dto';
import type { ProgressHandle } from './progress';

export const FILE_CHUNK_BYTES = 1 << 20;

export interface IngestRequest {
  workspaceId: string;
  userId: string;
  /** Add a version to this dataset; absent: create a dataset named `name`. */
  datasetId?: string;
  name?: string;
  description?: string;
  openKey?: string;
  filePath: string;
  fileName: string;
  sha256: string;
  sizeBytes: number;
  missingMarkers: string[];
  columnLimit: number;
  tempDir: string;
  progress?: Pick<ProgressHandle, 'phase'>;
}

/** LARIAT_INGEST_TIMING=1 prints each phase's wall time on stderr (for the ingest benchmark). */
function phaseTimer(fileName: string): (phase: string, accumulate?: boolean) => void {
  let last = process.hrtime.bigint();
  const sums = new Map<string, number>();
  return (phase, accumulate = false) => {
    if (process.env.LARIAT_INGEST_TIMING !== '1') return;
    const now = process.hrtime.bigint();
    const seconds = Number(now - last) / 1e9;
    last = now;
    if (accumulate) {
      sums.set(phase, (sums.get(phase) ?? 0) + seconds);
      return;
    }
    for (const [p, s] of sums) console.error(`[lariat] ingest ${fileName}: ${p} ${s.toFixed(2)} s`);
    sums.clear();
    console.error(`[lariat] ingest ${fileName}: ${phase} ${seconds.toFixed(2)} s`);
  };
}

export async function ingestFile(db: Database, req: IngestRequest): Promise<UploadResultDto> {
  const dataset = req.datasetId ? await findDataset(db, req.workspaceId, req.datasetId) : null;
  if (req.datasetId && !dataset) throw notFound('No such dataset in this workspace.');

  const same = await findVersionByChecksum(db, req.workspaceId, req.sha256, req.datasetId);
  if (same) {
    const owner = await findDataset(db, req.workspaceId, same.datasetId);
    return {
      datasetId: same.datasetId,
      version: versionSummary(same),
      duplicate: true,
      message: `${req.fileName} is identical to version ${same.number} of "${owner?.name}" (same SHA-256 checksum), so nothing new was stored.`,
    };
  }

  fs.mkdirSync(req.tempDir, { recursive: true });
  const timer = phaseTimer(req.fileName);
  const parsed = await parseCsvFile({
    filePath: req.filePath,
    fileName: req.fileName,
    missingMarkers: req.missingMarkers,
    columnLimit: req.columnLimit,
    spillPath: path.join(req.tempDir, `${randomUUID()}.columns`),
    onProgress: (bytes, rows) => req.progress?.phase('parsing', bytes / Math.max(1, req.sizeBytes), rows),
  });
  timer('parse');
  try {
    const inferences = parsed.profiles.map(inferColumn);
    const report = buildReport(parsed, req.fileName, inferences);
    const versionId = await db.transaction(async (tx) => {
      const datasetId =
        dataset?.id ??
        (await insertDataset(tx, {
          workspaceId: req.workspaceId,
          name: req.name ?? req.fileName.replace(/\.(csv|tsv|txt)$/i, ''),
          description: req.description ?? '',
          openKey: req.openKey ?? null,
          createdBy: req.userId,
        }));
      const number = await nextVersionNumber(tx, datasetId);
      const uploadId = await insertUpload(tx, {
        datasetId,
        fileName: req.fileName,
        sha256: req.sha256,
        sizeBytes: req.sizeBytes,
        rowCount: parsed.rowCount,
        columnCount: parsed.header.length,
        report,
      });
      const chunks = Math.max(1, Math.ceil(req.sizeBytes / FILE_CHUNK_BYTES));
      let seq = 0;
      for await (const chunk of fs.createReadStream(req.filePath, { highWaterMark: FILE_CHUNK_BYTES })) {
        await insertFileChunk(tx, uploadId, seq++, chunk as Buffer);
        req.progress?.phase('storing', (0.3 * seq) / chunks, parsed.rowCount);
      }
      timer('store original');
      const schema = [];
      for (let j = 0; j < parsed.header.length; j++) {
        const stored = encodeColumn(parsed.spill, j, parsed.header[j], inferences[j], parsed.missing);
        timer('  read and encode', true);
        await insertColumn(tx, uploadId, j, stored);
        timer('  insert', true);
        schema.push(columnSchema(stored, j, inferences[j]));
        timer('  summarise', true);
        req.progress?.phase('storing', 0.3 + (0.7 * (j + 1)) / parsed.header.length, parsed.rowCount);
      }
      return insertVersion(tx, {
        datasetId,
        number,
        uploadId,
        origin: req.openKey ? 'open-dataset' : 'upload',
        basedOn: null,
        columns: schema,
        createdBy: req.userId,
      });
    });
    timer('columns (rest)');
    const version = (await findVersionRowById(db, versionId))!;
    const excluded = version.columns.filter((c) => c.excluded).length;
    return {
      datasetId: version.datasetId,
      version: versionSummary(version),
      duplicate: false,
      message:
        `${req.fileName}: stored as version ${version.number} with ${version.rowCount} rows and ${version.columnCount} columns` +
        (excluded > 0 ? `; ${excluded} column(s) left out of modelling (see the parse report).` : '.'),
    };
  } finally {
    parsed.spill.close();
  }
}
