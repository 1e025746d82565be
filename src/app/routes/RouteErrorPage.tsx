import { isRouteErrorResponse, Link, useRouteError } from 'react-router';
import { DocumentTitle } from '@/components/DocumentTitle';
import { Wordmark } from '@/components/Logo';
import { paths } from '../paths';
import { NotFoundPage } from './NotFoundPage';

/** The router's errorElement: a crash in any page lands here instead of a blank screen. */
export function RouteErrorPage() {
  const error = useRouteError();
  if (isRouteErrorResponse(error) && error.status === 404) return <NotFoundPage />;
  const message = error instanceof Error ? error.message : isRouteErrorResponse(error) ? `${error.status} ${error.statusText}` : String(error);
  return (
    <main className="flex min-h-screen flex-col items-center justify-center gap-6 px-4 text-center">
      <DocumentTitle title="Something went wrong" />
      <Wordmark />
      <div role="alert">
        <h1 className="text-3xl font-bold">Something went wrong</h1>
        <p className="mt-3 max-w-md text-slate-700 dark:text-slate-300">
          This page stopped working. Reloading usually helps; if it keeps happening, tell your admin what you were doing.
        </p>
        <pre className="mt-4 max-w-xl overflow-x-auto rounded-md bg-slate-100 px-3 py-2 text-left text-xs text-slate-800 dark:bg-slate-900 dark:text-slate-200">
          {message}
        </pre>
      </div>
      <div className="flex gap-3">
        <button
          type="button"
          onClick={() => window.location.reload()}
          className="rounded-md bg-lariat-700 px-4 py-2 text-sm font-bold text-white hover:bg-lariat-800 dark:bg-lariat-300 dark:text-lariat-950"
        >
          Reload the page
        </button>
        <Link to={paths.home.getHref()} className="rounded-md border border-slate-300 px-4 py-2 text-sm font-bold dark:border-slate-600">
          Go to your workspaces
        </Link>
      </div>
    </main>
  );
}
