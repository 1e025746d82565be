/**
 * Reads while large uploads are stored: p50 and p95 latency of a read endpoint (GET the dataset list,
 * which needs the database) while two ~100 MB uploads from two workspaces run through the real HTTP
 * route of one server process. The same endpoint is first measured with the server idle, in this run,
 * as the reference (the server runs with its default ingest cap, LARIAT_INGEST_SLOTS). Target: p95 during the uploads < 250 ms (a page load that still feels immediate;
 * common practice for interactive responses). `BENCH_INGEST_LOAD_ROWS` (default 500,000 rows of
 * about 200 bytes) makes the files smaller.
 */
import fs from 'node:fs';
import path from 'node:path';
import { generateCsv } from './ingest/generate';
import { startServer } from './ingest/server';
import { uploadFile } from './ingest/upload';
import { signUp, type BenchSession } from './ingest/session';

const TARGET_P95_MS = 250;

type Session = BenchSession;


/** Milliseconds of one GET of the dataset list. */
async function timedRead(url: string, s: Session): Promise<number> {
  const started = process.hrtime.bigint();
  const res = await fetch(`${url}/api/workspaces/${s.workspaceId}/datasets`, { headers: { Cookie: s.cookie } });
  await res.arrayBuffer();
  if (res.status !== 200) throw new Error(`read answered ${res.status}`);
  return Number(process.hrtime.bigint() - started) / 1e6;
}

function percentile(values: number[], p: number): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
}

/** Reads one after another (20 ms apart) until `until` settles; returns their latencies. */
async function readWhile(url: string, s: Session, until: Promise<unknown>): Promise<number[]> {
  let done = false;
  void until.finally(() => (done = true));
  const out: number[] = [];
  while (!done) {
    out.push(await timedRead(url, s));
    await new Promise((r) => setTimeout(r, 20));
  }
  return out;
}

const describe = (label: string, ms: number[]) =>
  `${label}: ${ms.length} reads, p50 ${percentile(ms, 50).toFixed(1)} ms, p95 ${percentile(ms, 95).toFixed(1)} ms, max ${Math.max(...ms).toFixed(1)} ms`;

export async function run(): Promise<void> {
  const rows = Number(process.env.BENCH_INGEST_LOAD_ROWS ?? 500_000);
  fs.mkdirSync('bench/out', { recursive: true });
  const filePath = path.resolve(`bench/out/ingest-${rows}x20.csv`);
  const bytes = fs.existsSync(filePath) ? fs.statSync(filePath).size : generateCsv(filePath, rows);
  const mb = bytes / (1024 * 1024);
  console.log(`input: two uploads of ${rows} rows x 20 columns, ${mb.toFixed(1)} MB each (${filePath})`);
  const server = await startServer({ LARIAT_UPLOAD_LIMIT_MB: String(Math.ceil(mb) + 10) });
  try {
    const [a, b, reader] = [await signUp(server.url, server.mailbox, 'a'), await signUp(server.url, server.mailbox, 'b'), await signUp(server.url, server.mailbox, 'reader')];
    for (let i = 0; i < 10; i++) await timedRead(server.url, reader); // warm-up
    const idle: number[] = [];
    for (let i = 0; i < 100; i++) idle.push(await timedRead(server.url, reader));
    const uploads = Promise.all([uploadFile(server.url, a, filePath), uploadFile(server.url, b, filePath)]);
    const loaded = await readWhile(server.url, reader, uploads);
    const results = await uploads;
    for (const r of results) if (r.status !== 201) throw new Error(`upload answered ${r.status}: ${r.body.slice(0, 300)}`);
    console.log(`uploads: ${results.map((r) => `${r.seconds.toFixed(1)} s`).join(' and ')} (HTTP 201 both)`);
    console.log(describe('idle server (reference)', idle));
    console.log(describe('during the two uploads', loaded));
    const p95 = percentile(loaded, 95);
    console.log(`p95 during uploads / idle p95: ${(p95 / percentile(idle, 95)).toFixed(2)}; target p95 < ${TARGET_P95_MS} ms: ratio ${(p95 / TARGET_P95_MS).toFixed(2)}`);
  } finally {
    await server.stop();
  }
}
