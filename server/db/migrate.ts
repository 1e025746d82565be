/** Applies the Drizzle migrations in drizzle/ to DATABASE_URL (idempotent). */
import { fileURLToPath } from 'node:url';
import { migrate } from 'drizzle-orm/node-postgres/migrator';
import { installQueue } from '../queue/queue';
import { connectDatabase } from './client';

export async function applyMigrations(url: string): Promise<void> {
  const handle = connectDatabase(url, 1);
  try {
    await migrate(handle.db, { migrationsFolder: fileURLToPath(new URL('../../drizzle', import.meta.url)) });
  } finally {
    await handle.close();
  }
  // The job queue's own tables (schema pgboss), kept by pg-boss itself.
  await installQueue(url);
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error('DATABASE_URL is not set');
  await applyMigrations(url);
  console.error('[lariat] migrations applied');
}
