import { createBrowserRouter, Navigate, useParams } from 'react-router';
import { ForgotPasswordPage } from '@/features/auth/components/ForgotPasswordPage';
import { ResetPasswordPage } from '@/features/auth/components/ResetPasswordPage';
import { SignInPage } from '@/features/auth/components/SignInPage';
import { SignUpPage } from '@/features/auth/components/SignUpPage';
import { AcceptInvitationPage } from '@/features/members/components/AcceptInvitationPage';
import { MembersPage } from '@/features/members/components/MembersPage';
import { ModelsEmptyPage } from '@/features/models/components/ModelsEmptyPage';
import { ReleasesEmptyPage } from '@/features/releases/components/ReleasesEmptyPage';
import { ReviewsEmptyPage } from '@/features/reviews/components/ReviewsEmptyPage';
import { NewWorkspacePage } from '@/features/workspaces/components/NewWorkspacePage';
import { workspaceFeatureRoutes } from './feature-routes';
import { paths } from './paths';
import { NotFoundPage } from './routes/NotFoundPage';
import { OutboxRoute } from './routes/OutboxRoute';
import { RouteErrorPage } from './routes/RouteErrorPage';
import { GuestOnly, HomeRedirect, RequireSession } from './routes/SessionGuards';
import { WorkspaceLayout } from './routes/WorkspaceLayout';

function WorkspaceIndex() {
  const { workspaceId = '' } = useParams();
  return <Navigate to={paths.workspace.datasets.getHref(workspaceId)} replace />;
}

export function createAppRouter() {
  return createBrowserRouter([
    {
      errorElement: <RouteErrorPage />,
      children: [
        { path: paths.home.path, element: <HomeRedirect /> },
        {
          element: <GuestOnly />,
          children: [
            { path: paths.auth.signIn.path, element: <SignInPage /> },
            { path: paths.auth.signUp.path, element: <SignUpPage /> },
            { path: paths.auth.forgotPassword.path, element: <ForgotPasswordPage /> },
          ],
        },
        { path: paths.auth.resetPassword.path, element: <ResetPasswordPage /> },
        { path: paths.auth.acceptInvitation.path, element: <AcceptInvitationPage /> },
        {
          element: <RequireSession />,
          children: [
            { path: paths.newWorkspace.path, element: <NewWorkspacePage /> },
            {
              path: paths.workspace.root.path,
              element: <WorkspaceLayout />,
              children: [
                { index: true, element: <WorkspaceIndex /> },
                ...workspaceFeatureRoutes,
                { path: paths.workspace.models.path, element: <ModelsEmptyPage /> },
                { path: paths.workspace.reviews.path, element: <ReviewsEmptyPage /> },
                { path: paths.workspace.releases.path, element: <ReleasesEmptyPage /> },
                { path: paths.workspace.members.path, element: <MembersPage /> },
                { path: paths.workspace.outbox.path, element: <OutboxRoute /> },
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
