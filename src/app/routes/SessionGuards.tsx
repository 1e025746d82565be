import { Navigate, Outlet, useLocation, useSearchParams } from 'react-router';
import { FullPageLoading } from '@/components/Loading';
import { safeRedirect } from '@/lib/redirect';
import { useMe } from '@/lib/session';
import { paths } from '../paths';

/** Pages for signed-in people: others go to sign in, and come back here afterwards. */
export function RequireSession() {
  const me = useMe();
  const location = useLocation();
  if (me.isPending) return <FullPageLoading />;
  if (me.isError) throw me.error; // to the route's error page
  if (!me.data) return <Navigate to={paths.auth.signIn.getHref(location.pathname + location.search)} replace />;
  return <Outlet />;
}

/** Sign in / sign up / forgot password: someone already signed in goes on to where they were headed. */
export function GuestOnly() {
  const me = useMe();
  const [search] = useSearchParams();
  if (me.isPending) return <FullPageLoading />;
  if (me.data) return <Navigate to={safeRedirect(search.get('redirectTo'))} replace />;
  return <Outlet />;
}

/** `/`: the first workspace, or a form to start one. */
export function HomeRedirect() {
  const me = useMe();
  if (me.isPending) return <FullPageLoading />;
  if (me.isError) throw me.error;
  if (!me.data) return <Navigate to={paths.auth.signIn.getHref()} replace />;
  const first = me.data.memberships[0];
  return <Navigate to={first ? paths.workspace.datasets.getHref(first.workspaceId) : paths.newWorkspace.getHref()} replace />;
}
