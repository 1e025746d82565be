import { Link } from 'react-router';
import { DocumentTitle } from '@/components/DocumentTitle';
import { Wordmark } from '@/components/Logo';
import { paths } from '../paths';

interface NotFoundProps {
  message?: string;
  /** Inside the app shell (an unknown address within a workspace): no second frame, no second <main>. */
  inShell?: boolean;
}

/**
 * Unknown addresses, and workspaces the person does not belong to: both read "not found", so a URL
 * never reveals whether someone else's workspace exists.
 */
export function NotFoundPage({ message = 'There is no page at this address, or you do not have access to it.', inShell = false }: NotFoundProps) {
  const body = (
    <>
      <DocumentTitle title="Page not found" />
      {!inShell && <Wordmark />}
      <div>
        <p className="text-sm font-bold uppercase tracking-widest text-lariat-700 dark:text-saffron-400">404</p>
        <h1 className="mt-2 text-3xl font-bold">Page not found</h1>
        <p className="mt-3 max-w-md text-slate-700 dark:text-slate-300">{message}</p>
      </div>
      <Link
        to={paths.home.getHref()}
        className="rounded-md bg-lariat-700 px-4 py-2 text-sm font-bold text-white hover:bg-lariat-800 dark:bg-lariat-300 dark:text-lariat-950"
      >
        Go to your workspaces
      </Link>
    </>
  );
  if (inShell) return <section className="flex flex-col items-center gap-6 py-16 text-center">{body}</section>;
  return <main className="flex min-h-screen flex-col items-center justify-center gap-6 px-4 text-center">{body}</main>;
}
