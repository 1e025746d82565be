import type { RouteObject } from 'react-router';
import { accountRoutes } from '@/features/account/routes';
import { consumersRoutes } from '@/features/consumers/routes';
import { datasetsRoutes } from '@/features/datasets/routes';
import { fitsRoutes } from '@/features/fits/routes';
import { modelsRoutes } from '@/features/models/routes';
import { releasesRoutes } from '@/features/releases/routes';
import { reviewsRoutes } from '@/features/reviews/routes';

/**
 * Routes that features add inside a workspace (children of /w/:workspaceId, so every page here has
 * the shell, the session and `useCurrentWorkspace()`). A feature adds its routes with one line,
 * e.g. `...datasetsRoutes,` from '@/features/datasets/routes', replacing its placeholder. Prefer
 * `lazy: () => import(...).then((m) => ({ Component: m.Page }))` for pages, as src/app/router.tsx does.
 */
export const workspaceFeatureRoutes: RouteObject[] = [
  ...datasetsRoutes,
  ...modelsRoutes,
  ...fitsRoutes,
  ...reviewsRoutes,
  ...releasesRoutes,
  ...accountRoutes,
  ...consumersRoutes,
];
