/**
 * The hook the release half calls once a release (or a restore) has committed:
 *   import { onReleasePublished } from '../consumers/webhooks/notify';
 *   await onReleasePublished(ctx, releaseRow);
 * It records one delivery per matching webhook and queues it; it never throws (see deliver.ts).
 */
export { notifyRelease, notifyRelease as onReleasePublished, type ReleaseNotice } from './deliver';
