import type { RouteObject } from 'react-router';
import { paths } from '@/app/paths';

/** The consumers page (API keys and webhooks), loaded on first visit. */
export const consumersRoutes: RouteObject[] = [
  { path: paths.workspace.consumers.path, lazy: () => import('./components/ConsumersPage').then((m) => ({ Component: m.ConsumersPage })) },
];
