/**
 * Once per e2e run: a fresh database copied from the migrated template, the real server
 * (`npx tsx server/main.ts`, NODE_ENV=test, serving dist/client) on a free port with its fake SMTP
 * server, one fit worker (`npx tsx server/worker/main.ts`), and the base URL handed to the test files through `inject('baseUrl')`.
 */
import { execSync, spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import pg from 'pg';
import type { TestProject } from 'vitest/node';
import { applyMigrations } from '../../server/db/migrate';
import { TEMPLATE_DB, adminQuery, adminUrl, createTestDatabase, urlFor } from './databases';

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
    /** JSON lines of every e-mail the server's fake SMTP server captured (e2e-flows.ts mailTo). */
    mailLog: string;
  }
}

/** A port nobody uses right now: the OS picks one for a throwaway listener, which we then close. */
function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as net.AddressInfo;
      server.close(() => resolve(port));
    });
  });
}

async function templateExists(): Promise<boolean> {
  const client = new pg.Client({ connectionString: adminUrl() });
  await client.connect();
  try {
    const result = await client.query('SELECT 1 FROM pg_database WHERE datname = $1', [TEMPLATE_DB]);
    return (result.rowCount ?? 0) > 0;
  } finally {
    await client.end();
  }
}

async function waitForHealth(baseUrl: string, server: ChildProcess, output: () => string): Promise<void> {
  const deadline = Date.now() + 90_000;
  while (Date.now() < deadline) {
    if (server.exitCode !== null) throw new Error(`The server exited (code ${server.exitCode}) before it was ready:\n${output()}`);
    try {
      const response = await fetch(`${baseUrl}/api/health`);
      if (response.ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`The server did not answer ${baseUrl}/api/health within 90 s:\n${output()}`);
}

function stopServer(server: ChildProcess): Promise<void> {
  if (server.exitCode !== null || server.pid === undefined) return Promise.resolve();
  return new Promise((resolve) => {
    const timer = setTimeout(() => {
      try {
        process.kill(-server.pid!, 'SIGKILL');
      } catch {
        // already gone
      }
    }, 5_000);
    server.once('exit', () => {
      clearTimeout(timer);
      resolve();
    });
    // npx -> tsx -> node: signal the whole process group the server was started in.
    try {
      process.kill(-server.pid!, 'SIGTERM');
    } catch {
      resolve();
    }
  });
}

export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  if (!fs.existsSync('dist/client/index.html')) execSync('npx vite build --logLevel warn', { stdio: 'inherit' });

  const ownTemplate = !(await templateExists());
  if (ownTemplate) await createTemplate();
  // Idempotent: brings a template left by an earlier run up to the current migrations.
  await applyMigrations(urlFor(TEMPLATE_DB));
  const database = await createTestDatabase();

  const [port, smtpPort] = [await freePort(), await freePort()];
  const stateDir = `.lariat/test-state/${database.name}`;
  fs.mkdirSync(stateDir, { recursive: true });
  const mailLog = path.resolve(stateDir, 'mail.jsonl');
  const baseUrl = `http://127.0.0.1:${port}`;
  let log = '';
  const server = spawn('npx', ['tsx', 'server/main.ts'], {
    detached: true,
    stdio: ['ignore', 'pipe', 'pipe'],
    env: {
      ...process.env,
      NODE_ENV: 'test',
      DATABASE_URL: database.url,
      LARIAT_HOST: '127.0.0.1',
      LARIAT_PORT: String(port),
      LARIAT_PUBLIC_URL: baseUrl,
      LARIAT_FAKE_SMTP_PORT: String(smtpPort),
      LARIAT_SERVE_CLIENT: '1',
      // The browser tests follow e-mailed links through the outbox (each person sees their own mail).
      LARIAT_DEV_OUTBOX: '1',
      // Every test file signs up from 127.0.0.1: real limits are tested in tests/api/security.
      LARIAT_RATE_LIMIT_FACTOR: '100',
      LARIAT_STATE_DIR: stateDir,
      LARIAT_FAKE_SMTP_LOG: mailLog,
    },
  });
  const keep = (chunk: Buffer) => {
    log = (log + chunk.toString()).slice(-20_000);
  };
  server.stdout?.on('data', keep);
  server.stderr?.on('data', keep);
  // One fit worker beside the server, as `npm start` runs it.
  const worker = spawn('npx', ['tsx', 'server/worker/main.ts'], {
    detached: true,
    stdio: ['ignore', 'pipe', 'pipe'],
    env: { ...process.env, NODE_ENV: 'test', DATABASE_URL: database.url, LARIAT_QUEUE_POLL_MS: '250', LARIAT_WORKER_NAME: 'e2e-worker' },
  });
  worker.stdout?.on('data', keep);
  worker.stderr?.on('data', keep);

  try {
    await waitForHealth(baseUrl, server, () => log);
  } catch (error) {
    await stopServer(worker);
    await stopServer(server);
    await database.drop();
    throw error;
  }
  project.provide('baseUrl', baseUrl);
  project.provide('mailLog', mailLog);

  return async () => {
    await stopServer(worker);
    await stopServer(server);
    if (process.env.LARIAT_E2E_SERVER_LOG) console.log(log);
    await database.drop();
    if (ownTemplate) await adminQuery(`DROP DATABASE IF EXISTS ${TEMPLATE_DB} WITH (FORCE)`);
    fs.rmSync(`.lariat/test-state/${database.name}`, { recursive: true, force: true });
  };
}

/** The template the API tests use, created the same way as tests/support/api-global-setup.ts. */
async function createTemplate(): Promise<void> {
  const client = new pg.Client({ connectionString: adminUrl() });
  await client.connect();
  try {
    await client.query(`CREATE DATABASE ${TEMPLATE_DB}`);
  } catch (error) {
    // Another run created it in the meantime: fine, migrations below bring it up to date.
    if ((error as { code?: string }).code !== '42P04') throw error;
  } finally {
    await client.end();
  }
}
