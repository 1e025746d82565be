import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import * as schema from './schema/index';

export type Database = NodePgDatabase<typeof schema>;

export interface DatabaseHandle {
  db: Database;
  pool: pg.Pool;
  close(): Promise<void>;
}

/**
 * `connectTimeoutMs`: how long a query waits for a free connection (or a new one) before failing,
 * so a saturated pool gives errors rather than requests that hang (pg's default is to wait forever).
 */
export function connectDatabase(url: string, max = 10, connectTimeoutMs = 5000): DatabaseHandle {
  const pool = new pg.Pool({ connectionString: url, max, connectionTimeoutMillis: connectTimeoutMs });
  // An idle client whose server connection ends (a restart, a dropped test database) must not crash
  // the process; the pool replaces it on the next query.
  pool.on('error', (err) => console.error('[lariat] idle database connection lost:', err.message));
  const db = drizzle(pool, { schema });
  return { db, pool, close: () => pool.end() };
}
