/** Shared helpers of the datasets API tests: uploads through the real multipart route, row counts. */
import fs from 'node:fs';
import { sql } from 'drizzle-orm';
import type { TestApp } from '../../support/app';
import { withCsrf, type Session } from '../../support/session';

export function uploadUrl(s: Session, ingest?: string): string {
  return `/api/workspaces/${s.workspaceId}/datasets/uploads${ingest ? `?ingest=${ingest}` : ''}`;
}

export function upload(s: Session, content: string | Buffer, fileName: string, fields: Record<string, string> = {}) {
  let req = withCsrf(s.agent.post(uploadUrl(s)), s.csrf);
  for (const [k, v] of Object.entries(fields)) req = req.field(k, v);
  return req.attach('file', Buffer.isBuffer(content) ? content : Buffer.from(content, 'utf8'), fileName);
}

/** Row counts of every datasets table: bad uploads must leave them unchanged. */
export async function tableCounts(t: TestApp): Promise<Record<string, number>> {
  const out: Record<string, number> = {};
  for (const table of ['datasets', 'dataset_uploads', 'dataset_file_chunks', 'dataset_columns', 'dataset_versions']) {
    const r = await t.ctx.db.execute(sql.raw(`SELECT count(*)::int AS n FROM ${table}`));
    out[table] = (r.rows[0] as { n: number }).n;
  }
  return out;
}

export function apiBase(s: Session): string {
  return `/api/workspaces/${s.workspaceId}`;
}

/** Closes the test app and removes its state folder (where uploads are received). */
export async function closeApp(t: TestApp | undefined): Promise<void> {
  if (!t) return;
  await t.close();
  fs.rmSync(t.ctx.config.LARIAT_STATE_DIR, { recursive: true, force: true });
}
