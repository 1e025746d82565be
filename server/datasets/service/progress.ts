/**
 * Ingest progress, kept in this process's memory: the upload request runs the whole ingest, and the
 * client polls GET .../ingests/:id meanwhile (docs/decisions/0004-upload-progress.md). Entries are
 * forgotten ten minutes after their last change.
 */
import type { IngestPhase, IngestProgressDto } from '../../../shared/datasets';

interface Entry extends IngestProgressDto {
  workspaceId: string;
  touched: number;
}

const TTL_MS = 10 * 60 * 1000;
const entries = new Map<string, Entry>();

function sweep(now: number): void {
  for (const [id, e] of entries) if (now - e.touched > TTL_MS) entries.delete(id);
}

export interface ProgressHandle {
  receiving(bytes: number): void;
  phase(phase: IngestPhase, fraction: number, rowsParsed?: number): void;
  finish(message: string): void;
  fail(message: string): void;
}

export function startProgress(id: string, workspaceId: string): ProgressHandle {
  const now = Date.now();
  sweep(now);
  const entry: Entry = { id, workspaceId, phase: 'receiving', bytesReceived: 0, fraction: 0, rowsParsed: 0, message: null, touched: now };
  entries.set(id, entry);
  const touch = () => (entry.touched = Date.now());
  return {
    receiving(bytes) {
      entry.bytesReceived = bytes;
      touch();
    },
    phase(phase, fraction, rowsParsed) {
      entry.phase = phase;
      entry.fraction = Math.max(0, Math.min(1, fraction));
      if (rowsParsed !== undefined) entry.rowsParsed = rowsParsed;
      touch();
    },
    finish(message) {
      Object.assign(entry, { phase: 'done', fraction: 1, message });
      touch();
    },
    fail(message) {
      Object.assign(entry, { phase: 'failed', message });
      touch();
    },
  };
}

/** Only members of the workspace that started the ingest see it. */
export function readProgress(id: string, workspaceId: string): IngestProgressDto | null {
  const e = entries.get(id);
  if (!e || e.workspaceId !== workspaceId) return null;
  const { workspaceId: _w, touched: _t, ...dto } = e;
  return dto;
}
