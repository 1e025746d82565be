/**
 * Work that must not change how long a request takes (or whether it fails): runs after the current
 * request's answer is on its way, with any error logged the safe way (unexpected.ts). Used where
 * the answer has to be the same whatever the work finds, e.g. whether an e-mail has an account.
 */
import { reportUnexpected } from './unexpected';

export function afterResponse(where: string, work: () => Promise<void>): void {
  setImmediate(() => {
    work().catch((error: unknown) => {
      reportUnexpected(error, where);
    });
  });
}
