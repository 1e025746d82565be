/**
 * Ingest, end to end: a 1,000,000-row x 20-column CSV (~200 MB) uploaded through the real HTTP
 * multipart route to a server process, timed until the 201 answer (receive, parse, infer, store in
 * PostgreSQL). Reports MB/s and the server's peak memory (VmHWM) against the targets: >= 20 MB/s,
 * < 1 GB. `BENCH_INGEST_ROWS` makes it smaller.
 */
import fs from 'node:fs';
import path from 'node:path';
import { generateCsv } from './ingest/generate';
import { startServer } from './ingest/server';
import { uploadFile } from './ingest/upload';
import { signUp } from './ingest/session';

const TARGET_MB_S = 20;
const TARGET_PEAK_MIB = 1024;


export async function run(): Promise<void> {
  const rows = Number(process.env.BENCH_INGEST_ROWS ?? 1_000_000);
  fs.mkdirSync('bench/out', { recursive: true });
  const filePath = path.resolve(`bench/out/ingest-${rows}x20.csv`);
  const t0 = Date.now();
  const bytes = fs.existsSync(filePath) ? fs.statSync(filePath).size : generateCsv(filePath, rows);
  const mb = bytes / (1024 * 1024);
  console.log(`input: ${rows} rows x 20 columns, ${mb.toFixed(1)} MB (${filePath}; ready in ${((Date.now() - t0) / 1000).toFixed(1)} s)`);
  const server = await startServer({ LARIAT_UPLOAD_LIMIT_MB: String(Math.ceil(mb) + 10) });
  try {
    const session = await signUp(server.url, server.mailbox);
    const idleMiB = server.peakMiB();
    const started = process.hrtime.bigint();
    const res = await uploadFile(server.url, session, filePath);
    const seconds = Number(process.hrtime.bigint() - started) / 1e9;
    if (res.status !== 201) throw new Error(`upload answered ${res.status}: ${res.body.slice(0, 500)}`);
    const peak = server.peakMiB();
    const rate = mb / seconds;
    console.log(`ingest (upload + parse + store): ${seconds.toFixed(1)} s, ${rate.toFixed(1)} MB/s; target >= ${TARGET_MB_S} MB/s: ratio ${(rate / TARGET_MB_S).toFixed(2)}`);
    console.log(`server peak memory (VmHWM): ${peak.toFixed(0)} MiB (after start: ${idleMiB.toFixed(0)} MiB); target < ${TARGET_PEAK_MIB} MiB: ratio ${(peak / TARGET_PEAK_MIB).toFixed(2)}`);
    console.log(`answer: ${JSON.parse(res.body).message}`);
  } finally {
    await server.stop();
  }
}
