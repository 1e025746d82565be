/**
 * Start-up checks that need the database. Configuration alone is checked by loadConfig (development
 * session secret, http public URL, development outbox); here: the demo account, whose password is
 * printed in the README, must not exist on a production install.
 */
import { findUserByEmail } from '../accounts/users';
import type { Config } from '../config';
import type { Database } from '../db/client';
import { DEMO_ACCOUNT } from '../seed/demo-account';

export async function productionDatabaseProblems(config: Config, db: Database): Promise<string[]> {
  if (config.NODE_ENV !== 'production') return [];
  const problems: string[] = [];
  if (await findUserByEmail(db, DEMO_ACCOUNT.email)) {
    problems.push(`the demo account ${DEMO_ACCOUNT.email} exists in this database; delete it (its password is public) before running in production`);
  }
  return problems;
}

/** Seeding the demo data is for development and test installs only. */
export function mayHaveDemo(nodeEnv: string | undefined): boolean {
  return nodeEnv === undefined || nodeEnv === 'development' || nodeEnv === 'test';
}
