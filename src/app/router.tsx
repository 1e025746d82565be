import { createBrowserRouter, Navigate, useParams } from 'react-router';
import { FullPageLoading } from '@/components/Loading';
import { workspaceFeatureRoutes } from './feature-routes';
import { paths } from './paths';
import { NotFoundPage } from './routes/NotFoundPage';
import { RouteErrorPage } from './routes/RouteErrorPage';
import { GuestOnly, HomeRedirect, RequireSession } from './routes/SessionGuards';
import { WorkspaceLayout } from './routes/WorkspaceLayout';

function WorkspaceIndex() {
  const { workspaceId = '' } = useParams();
  return <Navigate to={paths.workspace.datasets.getHref(workspaceId)} replace />;
}

// Pages load on first visit (route `lazy`), so the first download stays small as features grow.
const signIn = () => import('@/features/auth/components/SignInPage').then((m) => ({ Component: m.SignInPage }));
const signUp = () => import('@/features/auth/components/SignUpPage').then((m) => ({ Component: m.SignUpPage }));
const finishSignUp = () => import('@/features/auth/components/FinishSignUpPage').then((m) => ({ Component: m.FinishSignUpPage }));
const forgotPassword = () => import('@/features/auth/components/ForgotPasswordPage').then((m) => ({ Component: m.ForgotPasswordPage }));
const resetPassword = () => import('@/features/auth/components/ResetPasswordPage').then((m) => ({ Component: m.ResetPasswordPage }));
const acceptInvitation = () =>
  import('@/features/members/components/AcceptInvitationPage').then((m) => ({ Component: m.AcceptInvitationPage }));
const newWorkspace = () => import('@/features/workspaces/components/NewWorkspacePage').then((m) => ({ Component: m.NewWorkspacePage }));
const members = () => import('@/features/members/components/MembersPage').then((m) => ({ Component: m.MembersPage }));
const compare = () => import('./routes/CompareRoute').then((m) => ({ Component: m.CompareRoute }));
const outbox = () => import('./routes/OutboxRoute').then((m) => ({ Component: m.OutboxRoute }));

export function createAppRouter() {
  return createBrowserRouter([
    {
      errorElement: <RouteErrorPage />,
      hydrateFallbackElement: <FullPageLoading />,
      children: [
        { path: paths.home.path, element: <HomeRedirect /> },
        {
          element: <GuestOnly />,
          children: [
            { path: paths.auth.signIn.path, lazy: signIn },
            { path: paths.auth.signUp.path, lazy: signUp },
            { path: paths.auth.forgotPassword.path, lazy: forgotPassword },
          ],
        },
        { path: paths.auth.finishSignUp.path, lazy: finishSignUp },
        { path: paths.auth.resetPassword.path, lazy: resetPassword },
        { path: paths.auth.acceptInvitation.path, lazy: acceptInvitation },
        {
          element: <RequireSession />,
          children: [
            { path: paths.newWorkspace.path, lazy: newWorkspace },
            {
              path: paths.workspace.root.path,
              element: <WorkspaceLayout />,
              children: [
                { index: true, element: <WorkspaceIndex /> },
                ...workspaceFeatureRoutes,
                { path: paths.workspace.compare.path, lazy: compare },
                { path: paths.workspace.members.path, lazy: members },
                { path: paths.workspace.outbox.path, lazy: outbox },
                { path: '*', element: <NotFoundPage inShell /> },
              ],
            },
          ],
        },
        { path: '*', element: <NotFoundPage /> },
      ],
    },
  ]);
}
