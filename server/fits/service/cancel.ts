/** Cancelling a waiting or running fit: workers see the status and stop (jobs of an ended fit do nothing). */
import { and, eq, inArray, sql } from 'drizzle-orm';
import type { Database } from '../../db/client';
import { fits } from '../../db/schema/index';
import { conflict } from '../../http/errors';
import { requireFit } from './detail';

export async function cancelFit(db: Database, workspaceId: string, userName: string, fitId: string): Promise<void> {
  const fit = await requireFit(db, workspaceId, fitId);
  const updated = await db
    .update(fits)
    .set({ status: 'cancelled', message: `This fit was cancelled by ${userName}.`, finishedAt: sql`now()` })
    .where(and(eq(fits.id, fit.id), inArray(fits.status, ['waiting', 'running'])))
    .returning({ id: fits.id });
  if (updated.length === 0) throw conflict(`This fit has already ended (${fit.status}); only a waiting or running fit can be cancelled.`, 'status');
}
