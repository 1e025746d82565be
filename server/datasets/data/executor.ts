import type { Database } from '../../db/client';

/** The database or a transaction: data functions take either so services can group writes. */
export type Executor = Database | Parameters<Parameters<Database['transaction']>[0]>[0];
