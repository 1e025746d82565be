import type { RouteObject } from 'react-router';
import { paths } from '@/app/paths';

export const releasesRoutes: RouteObject[] = [{ path: paths.workspace.releases.path, lazy: () => import('./components/ReleasesPage').then((m) => ({ Component: m.ReleasesPage })) }];
