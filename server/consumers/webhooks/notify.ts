/** The hook the release half calls after a release is stored (see deliver.ts). */
export { notifyRelease, type ReleaseNotice } from './deliver';
