import type { RouteObject } from 'react-router';
import { paths } from '@/app/paths';

/** The models pages, loaded on first visit. */
export const modelsRoutes: RouteObject[] = [
  { path: paths.workspace.models.path, lazy: () => import('./components/ModelsPage').then((m) => ({ Component: m.ModelsPage })) },
  { path: paths.workspace.newModel.path, lazy: () => import('./components/NewModelPage').then((m) => ({ Component: m.NewModelPage })) },
  { path: paths.workspace.model.path, lazy: () => import('./components/ModelPage').then((m) => ({ Component: m.ModelPage })) },
  { path: paths.workspace.runFit.path, lazy: () => import('./components/RunFitPage').then((m) => ({ Component: m.RunFitPage })) },
];
