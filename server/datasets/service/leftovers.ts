/**
 * Start-up sweep of what an ingest leaves on disk when the process dies mid-way (received files
 * `*.upload`, column spill files `*.columns`): nothing else removes them, and they can be as large as
 * the upload limit. The upload folder belongs to one server (LARIAT_STATE_DIR), so everything in it
 * is stale at start-up. Imports from disk (the demo seed, open datasets) work in a folder per process
 * under the system's temporary folder, swept when that process no longer runs.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

const LEFTOVER = /\.(upload|columns)$/;
const IMPORT_PREFIX = 'lariat-ingest-';

/** The folder this process's imports from disk work in. */
export function importTempDir(): string {
  return path.join(os.tmpdir(), `${IMPORT_PREFIX}${process.pid}`);
}

function running(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    return (error as NodeJS.ErrnoException).code === 'EPERM'; // exists, owned by someone else
  }
}

/** Removes stale ingest files; returns how many files or folders went. */
export function sweepIngestLeftovers(uploadDir: string, systemTemp = os.tmpdir()): number {
  let removed = 0;
  if (fs.existsSync(uploadDir)) {
    for (const name of fs.readdirSync(uploadDir)) {
      if (!LEFTOVER.test(name)) continue;
      fs.rmSync(path.join(uploadDir, name), { force: true });
      removed++;
    }
  }
  for (const name of fs.existsSync(systemTemp) ? fs.readdirSync(systemTemp) : []) {
    const pid = name.startsWith(IMPORT_PREFIX) ? Number(name.slice(IMPORT_PREFIX.length)) : Number.NaN;
    if (!Number.isInteger(pid) || pid === process.pid || running(pid)) continue;
    fs.rmSync(path.join(systemTemp, name), { recursive: true, force: true });
    removed++;
  }
  if (removed > 0) console.log(`[lariat] removed ${removed} leftover ingest file(s) from an earlier run`);
  return removed;
}
