import type { RouteObject } from 'react-router';
import { paths } from '@/app/paths';

/** The fit page (progress, then the results workspace), loaded on first visit. */
export const fitsRoutes: RouteObject[] = [{ path: paths.workspace.fit.path, lazy: () => import('./components/FitPage').then((m) => ({ Component: m.FitPage })) }];
