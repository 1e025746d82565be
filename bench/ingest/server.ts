/** A real Lariat server process on a fresh, migrated database, for the ingest benchmark. */
import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import { applyMigrations } from '../../server/db/migrate';
import { startFakeSmtp, type FakeSmtp } from '../../server/mail/fake-smtp';
import { adminQuery, urlFor } from '../../tests/support/databases';

export interface BenchServer {
  url: string;
  pid: number;
  /** The mail the server sends (sign-up links). */
  mailbox: FakeSmtp;
  peakMiB(): number;
  stop(): Promise<void>;
}

export async function startServer(env: Record<string, string>): Promise<BenchServer> {
  const db = `lariat_bench_${randomBytes(4).toString('hex')}`;
  await adminQuery(`CREATE DATABASE ${db}`);
  await applyMigrations(urlFor(db));
  const port = 20000 + Math.floor(Math.random() * 20000);
  const mailbox = await startFakeSmtp(0);
  // node itself (not npx) so the pid we watch is the server's own.
  const child: ChildProcess = spawn(process.execPath, ['--import', 'tsx', 'server/main.ts'], {
    env: {
      ...process.env,
      NODE_ENV: 'development',
      DATABASE_URL: urlFor(db),
      LARIAT_PORT: String(port),
      LARIAT_SMTP_URL: `smtp://127.0.0.1:${mailbox.port}`,
      LARIAT_RATE_LIMIT_FACTOR: '100',
      LARIAT_SERVE_CLIENT: '0',
      LARIAT_INGEST_TIMING: '1',
      LARIAT_STATE_DIR: `.lariat/bench-state/${db}`,
      ...env,
    },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  await new Promise<void>((resolve, reject) => {
    child.stdout!.on('data', (d: Buffer) => {
      if (d.toString().includes('Lariat is running')) resolve();
    });
    child.on('exit', (code) => reject(new Error(`server exited with ${code}`)));
  });
  return {
    url: `http://127.0.0.1:${port}`,
    pid: child.pid!,
    mailbox,
    peakMiB() {
      const m = /VmHWM:\s+(\d+)/.exec(fs.readFileSync(`/proc/${child.pid}/status`, 'utf8'));
      return m ? Number(m[1]) / 1024 : Number.NaN;
    },
    async stop() {
      const exited = new Promise((r) => child.once('exit', r));
      child.kill('SIGTERM');
      await exited;
      await mailbox.close();
      await adminQuery(`DROP DATABASE IF EXISTS ${db} WITH (FORCE)`);
      fs.rmSync(`.lariat/bench-state/${db}`, { recursive: true, force: true });
    },
  };
}
