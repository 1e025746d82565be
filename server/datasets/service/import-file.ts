/**
 * Imports a CSV file from disk (the demo seed, the open datasets): idempotent by checksum, so a
 * second call with the same file returns the existing dataset and version.
 */
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { DEFAULT_MISSING_MARKERS } from '../../../shared/datasets';
import type { Database } from '../../db/client';
import { ingestFile } from './ingest';
import { importTempDir } from './leftovers';

async function sha256Of(filePath: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of fs.createReadStream(filePath)) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

export interface ImportFileInput {
  workspaceId: string;
  userId: string;
  name: string;
  filePath: string;
  description?: string;
  /** Set when the file is one of the bundled open datasets. */
  openKey?: string;
  columnLimit?: number;
}

export async function importDatasetFromFile(db: Database, input: ImportFileInput): Promise<{ datasetId: string; versionId: string; duplicate: boolean }> {
  const result = await ingestFile(db, {
    workspaceId: input.workspaceId,
    userId: input.userId,
    name: input.name,
    description: input.description,
    openKey: input.openKey,
    filePath: input.filePath,
    fileName: path.basename(input.filePath),
    sha256: await sha256Of(input.filePath),
    sizeBytes: fs.statSync(input.filePath).size,
    missingMarkers: [...DEFAULT_MISSING_MARKERS],
    columnLimit: input.columnLimit ?? 5000,
    tempDir: importTempDir(),
  });
  return { datasetId: result.datasetId, versionId: result.version.id, duplicate: result.duplicate };
}
