import type { RouteObject } from 'react-router';
import { paths } from '@/app/paths';

/** The account page, inside the workspace shell so the navigation stays at hand. */
export const accountRoutes: RouteObject[] = [
  { path: paths.workspace.account.path, lazy: () => import('./components/AccountPage').then((m) => ({ Component: m.AccountPage })) },
];
