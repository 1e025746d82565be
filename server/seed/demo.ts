/**
 * Seeds the demo workspace (idempotent): the demo account, its workspace, and the invented
 * Harbour Creamery dataset (datasets/demo) with one finished fit (server/fits/demo-fit.ts). Run by
 * `npm start` and `npm run dev` after migrations; skipped when NODE_ENV is production (the server
 * refuses to start with the demo account there).
 */
import { fileURLToPath } from 'node:url';
import { DEMO_CSV_PATH } from '../../datasets/demo/generate';
import { ensureUserWithWorkspace } from '../accounts/accounts';
import { connectDatabase, type Database } from '../db/client';
import { importDatasetFromFile } from '../datasets/index';
import { ensureDemoFit } from '../fits/demo-fit';
import { mayHaveDemo } from '../security/production-checks';
import { DEMO_ACCOUNT } from './demo-account';

export async function seedDemo(db: Database): Promise<{ workspaceId: string; datasetId: string }> {
  const { userId, workspaceId } = await ensureUserWithWorkspace(db, {
    email: DEMO_ACCOUNT.email,
    password: DEMO_ACCOUNT.password,
    name: DEMO_ACCOUNT.name,
    workspaceName: DEMO_ACCOUNT.workspace,
    role: 'admin',
  });
  const { datasetId } = await importDatasetFromFile(db, {
    workspaceId,
    userId,
    name: 'Harbour Creamery vats (invented demo data)',
    description:
      'Invented data: one row per cheese vat of a made-up dairy, with yield (numeric) and top grade (yes/no) ' +
      'outcomes, 44 numeric candidate predictors of which a handful matter, and three categorical ones.',
    filePath: DEMO_CSV_PATH,
  });
  await ensureDemoFit(db, { workspaceId, userId, datasetId });
  return { workspaceId, datasetId };
}

if (process.argv[1] === fileURLToPath(import.meta.url) && !mayHaveDemo(process.env.NODE_ENV)) {
  console.error(`[lariat] no demo workspace in ${process.env.NODE_ENV} (development and test only)`);
} else if (process.argv[1] === fileURLToPath(import.meta.url)) {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error('DATABASE_URL is not set');
  const handle = connectDatabase(url, 2);
  try {
    await seedDemo(handle.db);
    console.error('[lariat] demo workspace ready');
  } finally {
    await handle.close();
  }
}
