import type { RouteObject } from 'react-router';
import { paths } from '@/app/paths';

/** The reviews list and one review (the compare page is composed at the app level, with the fits' charts). */
export const reviewsRoutes: RouteObject[] = [
  { path: paths.workspace.reviews.path, lazy: () => import('./components/ReviewsPage').then((m) => ({ Component: m.ReviewsPage })) },
  { path: paths.workspace.review.path, lazy: () => import('./components/ReviewPage').then((m) => ({ Component: m.ReviewPage })) },
];
