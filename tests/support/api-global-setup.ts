import { applyMigrations } from '../../server/db/migrate';
import { TEMPLATE_DB, adminQuery, urlFor } from './databases';

/** Once per run: a freshly migrated template database that each API test file copies. */
export default async function setup(): Promise<() => Promise<void>> {
  await adminQuery(`DROP DATABASE IF EXISTS ${TEMPLATE_DB} WITH (FORCE)`);
  await adminQuery(`CREATE DATABASE ${TEMPLATE_DB}`);
  await applyMigrations(urlFor(TEMPLATE_DB));
  return () => adminQuery(`DROP DATABASE IF EXISTS ${TEMPLATE_DB} WITH (FORCE)`);
}
