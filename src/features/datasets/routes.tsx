import type { RouteObject } from 'react-router';
import { paths } from '@/app/paths';

/** The datasets pages, loaded on first visit. */
export const datasetsRoutes: RouteObject[] = [
  { path: paths.workspace.datasets.path, lazy: () => import('./components/DatasetsPage').then((m) => ({ Component: m.DatasetsPage })) },
  { path: paths.workspace.dataset.path, lazy: () => import('./components/DatasetPage').then((m) => ({ Component: m.DatasetPage })) },
  { path: paths.workspace.datasetVersion.path, lazy: () => import('./components/VersionPage').then((m) => ({ Component: m.VersionPage })) },
];
