/**
 * `npm run worker`: a fit worker process. Run any number of them, on any machine that reaches the
 * same PostgreSQL; they share the queue, and one fit's folds spread over all of them.
 */
import { setPriority } from 'node:os';
import { loadConfig } from '../config';
import { connectDatabase } from '../db/client';
import { startFitWorker } from './start';

const config = loadConfig();
// Before any engine thread starts (threads inherit it): fits yield the CPU to the API on a shared machine.
try {
  setPriority(config.LARIAT_WORKER_NICE);
} catch (error) {
  console.error(`[lariat] could not lower the worker's CPU priority: ${(error as Error).message}`);
}
const database = connectDatabase(config.DATABASE_URL, 4);
const worker = await startFitWorker(config, database.db);
console.log(`[lariat] fit worker ${worker.name} running (${config.LARIAT_WORKER_THREADS} engine thread${config.LARIAT_WORKER_THREADS === 1 ? '' : 's'})`);

let stopping = false;
async function shutdown(): Promise<void> {
  if (stopping) return;
  stopping = true;
  await worker.stop();
  await database.close();
  process.exit(0);
}
process.on('SIGINT', () => void shutdown());
process.on('SIGTERM', () => void shutdown());
