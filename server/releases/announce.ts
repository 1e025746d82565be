/**
 * What happens outside Lariat after a release (or a restore) commits: the consumer area's webhooks
 * (one signed, queued delivery per matching hook). Never turns a committed release into an error answer.
 */
import { onReleasePublished } from '../consumers/webhooks/notify';
import type { AppContext } from '../context';
import { reportUnexpected } from '../http/unexpected';
import type { ReleaseRow } from './data';

export async function announceRelease(ctx: AppContext, release: ReleaseRow): Promise<void> {
  try {
    await onReleasePublished(ctx, release);
  } catch (error) {
    reportUnexpected(error, 'announcing a release');
  }
}
