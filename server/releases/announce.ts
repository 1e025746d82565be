/**
 * What happens outside Lariat after a release commits: the consumer side's webhooks.
 * Kept in one place so the release service doesn't depend on the consumer area's internals.
 */
import type { AppContext } from '../context';
import { reportUnexpected } from '../http/unexpected';
import type { ReleaseRow } from './data';

type Announcer = (ctx: AppContext, release: ReleaseRow) => Promise<void>;
const announcers: Announcer[] = [];

/** The consumer area registers its webhook sender here (once per process). */
export function onReleasePublished(announcer: Announcer): void {
  if (!announcers.includes(announcer)) announcers.push(announcer);
}

export async function announceRelease(ctx: AppContext, release: ReleaseRow): Promise<void> {
  for (const announce of announcers) {
    try {
      await announce(ctx, release);
    } catch (error) {
      // The release is committed; a webhook queueing failure must not turn it into an error answer.
      reportUnexpected(error, 'announcing a release');
    }
  }
}
