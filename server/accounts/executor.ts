import type { Database } from '../db/client';

/** A transaction handle; data functions take `Executor` so services can group their writes. */
export type Transaction = Parameters<Parameters<Database['transaction']>[0]>[0];
export type Executor = Database | Transaction;

/** PostgreSQL's unique_violation (SQLSTATE 23505), e.g. two sign-ups racing for one e-mail. */
export function isUniqueViolation(err: unknown): boolean {
  const e = err as { code?: string; cause?: { code?: string } } | null;
  return e?.code === '23505' || e?.cause?.code === '23505';
}
