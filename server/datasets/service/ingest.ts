/**
 * One ingest: a received file (already on disk with its SHA-256) becomes a new dataset or version
 * N+1 of an existing one. A file identical to one already stored (same checksum) stores nothing.
 * Everything is written in one transaction, so a failure leaves no dataset, upload or version (nor
 * any chunk of the original file, which is written while the file is parsed). Parsing, encoding and
 * summaries run on a worker thread for large files (parse-thread.ts).
 */
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import type { UploadResultDto } from '../../../shared/datasets';
import type { Database } from '../../db/client';
import { conflict, notFound } from '../../http/errors';
import { findDataset, insertDataset, nextVersionNumber } from '../data/datasets';
import type { Executor } from '../data/executor';
import { insertColumn, insertFileChunk, insertUpload } from '../data/uploads';
import { findVersionByChecksum, findVersionRowById, insertVersion, lockChecksum } from '../data/versions';
import { versionSummary } from './dto';
import type { ParseOutcome } from './parse-protocol';
import { startParse, type ColumnSource } from './parse-thread';
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
  /** False: the first row is data (columns named column_1, ...); default true. */
  headerRow?: boolean;
  tempDir: string;
  progress?: Pick<ProgressHandle, 'phase'>;
}

/** LARIAT_INGEST_TIMING=1 prints each phase's wall time on stderr (for the ingest benchmark). */
type Timer = (phase: string, accumulate?: boolean) => void;

function phaseTimer(fileName: string): Timer {
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
  // The original file is written while the parser reads it: PostgreSQL works on the other core.
  // The chunks' foreign key to the upload is checked at commit (migration 0004), as the upload row
  // needs the parse's counts and report.
  const uploadId = randomUUID();
  const thread = startParse(
    {
      filePath: req.filePath,
      fileName: req.fileName,
      missingMarkers: req.missingMarkers,
      columnLimit: req.columnLimit,
      headerRow: req.headerRow,
      spillPath: path.join(req.tempDir, `${randomUUID()}.columns`),
    },
    req.sizeBytes,
    (bytes, rows) => req.progress?.phase('parsing', bytes / Math.max(1, req.sizeBytes), rows),
  );
  let versionId: string;
  try {
    versionId = await db.transaction(async (tx) => {
      const stop = { requested: false };
      const storing = storeOriginal(tx, uploadId, req.filePath, stop);
      storing.catch(() => undefined); // awaited below; this only marks a failure as handled meanwhile
      let parsed: ParseOutcome;
      try {
        parsed = await thread.parsed;
      } catch (error) {
        stop.requested = true;
        await storing.catch(() => undefined);
        throw error;
      }
      timer('parse');
      await storing;
      timer('finish storing the original');
      return await storeParsed(tx, req, dataset?.id ?? null, uploadId, parsed, thread, timer);
    });
  } finally {
    await thread.close();
  }
  timer('commit');
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
}

/** The original file in 1 MB chunks, one statement at a time; stops early when asked. */
async function storeOriginal(tx: Executor, uploadId: string, filePath: string, stop: { requested: boolean }): Promise<void> {
  let seq = 0;
  for await (const chunk of fs.createReadStream(filePath, { highWaterMark: FILE_CHUNK_BYTES })) {
    if (stop.requested) return;
    await insertFileChunk(tx, uploadId, seq++, chunk as Buffer);
  }
}

/**
 * Dataset (if new), upload, columns and version rows for a parsed file. Returns the version id.
 * Column j + 1 is asked of the worker before column j is inserted, so the two overlap.
 */
async function storeParsed(tx: Executor, req: IngestRequest, existingDatasetId: string | null, uploadId: string, parsed: ParseOutcome, thread: ColumnSource, timer: Timer): Promise<string> {
  const columnCount = parsed.header.length;
  // Another upload of the same file may have been stored while this one was parsed: checked again
  // under a lock, it is a conflict (409) rather than a unique-constraint failure.
  await lockChecksum(tx, req.workspaceId, req.sha256);
  const same = await findVersionByChecksum(tx, req.workspaceId, req.sha256, req.datasetId);
  if (same) {
    const where = req.datasetId ? 'this dataset' : 'a dataset in this workspace';
    throw conflict(`${req.fileName} is identical to version ${same.number} of ${where}, which another upload stored a moment ago; nothing new was stored.`, 'file');
  }
  let next = thread.column(0);
  const datasetId =
    existingDatasetId ??
    (await insertDataset(tx, {
      workspaceId: req.workspaceId,
      name: req.name ?? req.fileName.replace(/\.(csv|tsv|txt)$/i, ''),
      description: req.description ?? '',
      openKey: req.openKey ?? null,
      createdBy: req.userId,
    }));
  const number = await nextVersionNumber(tx, datasetId);
  await insertUpload(tx, {
    id: uploadId,
    datasetId,
    fileName: req.fileName,
    sha256: req.sha256,
    sizeBytes: req.sizeBytes,
    rowCount: parsed.rowCount,
    columnCount,
    report: parsed.report,
  });
  const schema = [];
  for (let j = 0; j < columnCount; j++) {
    const column = await next;
    timer('  encode and summarise (waited for)', true);
    if (j + 1 < columnCount) next = thread.column(j + 1);
    await insertColumn(tx, uploadId, j, column.stored);
    timer('  insert', true);
    schema.push(column.schema);
    req.progress?.phase('storing', (j + 1) / columnCount, parsed.rowCount);
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
}
