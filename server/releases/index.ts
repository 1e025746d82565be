export { currentRelease, listCurrentReleases, listModelReleases, findRelease, type ReleaseRow } from './data';
