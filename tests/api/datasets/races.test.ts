/**
 * Uploads that run at the same time: identical files (one is stored, the other answers 409, never a
 * 500 from a unique constraint), different files to one dataset (consecutive version numbers), and
 * an unexpected server fault whose text must not reach the uploader or the progress entry.
 */
import { createHash, randomUUID } from 'node:crypto';
import { sql } from 'drizzle-orm';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import type { UploadResultDto } from '../../../shared/datasets';
import { startTestApp, type TestApp } from '../../support/app';
import { signUp, withCsrf, type Session } from '../../support/session';
import { apiBase, closeApp, tableCounts, upload, uploadUrl } from './support';

let t: TestApp;
let alice: Session;

beforeAll(async () => {
  // Two ingests at once in one process (with one slot they only race across server processes).
  t = await startTestApp({ LARIAT_INGEST_SLOTS: '2' });
  alice = await signUp(t.app);
});
afterAll(async () => closeApp(t));

/** About 0.7 MB of numbers. */
function table(seed: number): string {
  const lines = ['x,y,z'];
  for (let i = 0; i < 60_000; i++) lines.push(`${i},${(i * seed) % 997},${(i * 7 + seed) % 13}`);
  return `${lines.join('\n')}\n`;
}

/**
 * Runs `both` while this test holds the lock that ingests of `file` take before their final check,
 * and lets go only once two ingests wait for it: both have passed the first "already stored?" check,
 * so the race happens every time, however the machine schedules the two requests.
 */
async function overlapped<T>(file: string, both: () => Promise<T>): Promise<T> {
  const sha = createHash('sha256').update(file).digest('hex');
  const key = `lariat-checksum:${alice.workspaceId}:${sha}`;
  const holder = new pg.Client({ connectionString: t.ctx.config.DATABASE_URL });
  await holder.connect();
  try {
    await holder.query('SELECT pg_advisory_lock(hashtextextended($1, 0))', [key]);
    const running = both();
    for (let i = 0; ; i++) {
      const r = await holder.query<{ n: number }>("SELECT count(*)::int AS n FROM pg_locks WHERE locktype = 'advisory' AND NOT granted AND database = (SELECT oid FROM pg_database WHERE datname = current_database())");
      if (r.rows[0].n === 2) break;
      if (i > 500) throw new Error('the two ingests never both waited for the checksum lock');
      await new Promise((res) => setTimeout(res, 20));
    }
    await holder.query('SELECT pg_advisory_unlock(hashtextextended($1, 0))', [key]);
    return await running;
  } finally {
    await holder.end();
  }
}

async function datasetWithVersion1(name: string, seed: number): Promise<string> {
  const res = await upload(alice, table(seed), `${name}.csv`, { name });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return (res.body as UploadResultDto).datasetId;
}

describe('uploads at the same time', () => {
  it('two identical files to one dataset: one new version, the other 409 naming it', async () => {
    const datasetId = await datasetWithVersion1('same-file', 1);
    const before = await tableCounts(t);
    const file = table(2);
    const [a, b] = await overlapped(file, () => Promise.all([upload(alice, file, 'v2.csv', { datasetId }), upload(alice, file, 'v2.csv', { datasetId })]));
    const statuses = [a.status, b.status].sort();
    expect(statuses, JSON.stringify([a.body, b.body])).toEqual([201, 409]);
    const refused = a.status === 409 ? a : b;
    expect(refused.body.error).toEqual({
      message: 'v2.csv is identical to version 2 of this dataset, which another upload stored a moment ago; nothing new was stored.',
      field: 'file',
    });
    const after = await tableCounts(t);
    expect(after.dataset_versions - before.dataset_versions).toBe(1);
    expect(after.dataset_uploads - before.dataset_uploads).toBe(1);
    const detail = await alice.agent.get(`${apiBase(alice)}/datasets/${datasetId}`);
    expect(detail.body.versions.map((v: { number: number }) => v.number)).toEqual([1, 2]);
  });

  it('two identical files as new datasets: one dataset, the other 409', async () => {
    const before = await tableCounts(t);
    const file = table(3);
    const [a, b] = await overlapped(file, () => Promise.all([upload(alice, file, 'new.csv', { name: 'New A' }), upload(alice, file, 'new.csv', { name: 'New B' })]));
    expect([a.status, b.status].sort(), JSON.stringify([a.body, b.body])).toEqual([201, 409]);
    const after = await tableCounts(t);
    expect(after.datasets - before.datasets).toBe(1);
    expect(after.dataset_versions - before.dataset_versions).toBe(1);
  });

  it('two different files to one dataset: versions 2 and 3, both stored', async () => {
    const datasetId = await datasetWithVersion1('two-files', 11);
    const [a, b] = await Promise.all([upload(alice, table(4), 'a.csv', { datasetId }), upload(alice, table(5), 'b.csv', { datasetId })]);
    expect([a.status, b.status], JSON.stringify([a.body, b.body])).toEqual([201, 201]);
    expect([a.body.version.number, b.body.version.number].sort()).toEqual([2, 3]);
  });

  it('an unexpected fault: a generic message with an id, the same in the answer, the progress entry and the log', async () => {
    // A database fault whose text quotes a value of the failed statement (here, the file name).
    await t.ctx.db.execute(sql.raw(`CREATE FUNCTION lariat_test_fault() RETURNS trigger AS $$
      BEGIN IF NEW.file_name LIKE 'secret-%' THEN RAISE EXCEPTION 'fault on %', NEW.file_name; END IF; RETURN NEW; END $$ LANGUAGE plpgsql`));
    await t.ctx.db.execute(sql.raw('CREATE TRIGGER lariat_test_fault BEFORE INSERT ON dataset_uploads FOR EACH ROW EXECUTE FUNCTION lariat_test_fault()'));
    const logged: string[] = [];
    const spy = vi.spyOn(console, 'error').mockImplementation((...args: unknown[]) => void logged.push(args.map(String).join(' ')));
    try {
      const before = await tableCounts(t);
      const ingest = randomUUID();
      const res = await withCsrf(alice.agent.post(uploadUrl(alice, ingest)), alice.csrf).attach('file', Buffer.from('a,b\n1,2\n3,4\n'), 'secret-params.csv');
      expect(res.status).toBe(500);
      const message: string = res.body.error.message;
      const id = /\(error ([0-9a-f]{12})\)/.exec(message)?.[1];
      expect(id, message).toBeDefined();
      expect(message).toBe(
        `The upload failed and nothing was stored. Something went wrong on the server (error ${id}). The error was logged; quote this id when you report it.`,
      );
      const progress = await alice.agent.get(`${apiBase(alice)}/ingests/${ingest}`);
      expect(progress.body).toMatchObject({ phase: 'failed', message });
      const line = logged.find((l) => l.includes(`error ${id} in ingest`));
      expect(line, logged.join('\n')).toBeDefined();
      expect(line).toContain('code=P0001');
      expect(logged.join('\n')).not.toContain('secret-params');
      expect(await tableCounts(t)).toEqual(before);
    } finally {
      spy.mockRestore();
      await t.ctx.db.execute(sql.raw('DROP TRIGGER lariat_test_fault ON dataset_uploads; DROP FUNCTION lariat_test_fault()'));
    }
  });
});
