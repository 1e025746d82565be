import { formatWhen } from '@/lib/dates';
import { Button } from '@/components/Button';
import { Loading } from '@/components/Loading';
import { Notice } from '@/components/Notice';
import { useSessions } from '../api/sessions';
import { useSignOutOthers } from '../api/sign-out-others';

const when = formatWhen;

/** Where you are signed in, and a button to end every session but this one. */
export function SessionsPanel() {
  const sessions = useSessions();
  const signOut = useSignOutOthers();
  const others = (sessions.data ?? []).filter((s) => !s.current).length;
  return (
    <section aria-labelledby="sessions-heading" className="space-y-4">
      <h2 id="sessions-heading" className="text-xl font-bold">
        Where you are signed in
      </h2>
      <p className="text-sm text-slate-700 dark:text-slate-300">
        A session ends after an hour without use, and in any case 12 hours after signing in.
      </p>
      {sessions.isPending && <Loading label="Loading your sessions…" />}
      {sessions.isError && <Notice tone="error">{sessions.error.message}</Notice>}
      {sessions.data && (
        <table className="w-full text-left text-sm">
          <caption className="sr-only">Your sessions</caption>
          <thead>
            <tr className="border-b border-slate-300 dark:border-slate-700">
              <th scope="col" className="py-2 pr-4">Browser</th>
              <th scope="col" className="py-2 pr-4">Signed in</th>
              <th scope="col" className="py-2 pr-4">Ends at the latest</th>
            </tr>
          </thead>
          <tbody>
            {sessions.data.map((s) => (
              <tr key={s.id} className="border-b border-slate-200 dark:border-slate-800">
                <td className="py-2 pr-4 break-all">
                  {s.userAgent ?? 'Unknown browser'}
                  {s.current && <span className="ml-2 rounded bg-lariat-100 px-2 py-0.5 text-xs font-bold text-lariat-900">This session</span>}
                </td>
                <td className="py-2 pr-4">{when(s.signedInAt)}</td>
                <td className="py-2 pr-4">{when(s.endsAt)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {signOut.isSuccess && (
        <Notice tone="success">
          {signOut.data.signedOut === 1 ? '1 other session was signed out.' : `${signOut.data.signedOut} other sessions were signed out.`}
        </Notice>
      )}
      {signOut.isError && <Notice tone="error">{signOut.error.message}</Notice>}
      <Button variant="secondary" disabled={others === 0} busy={signOut.isPending} busyLabel="Signing out…" onClick={() => signOut.mutate()}>
        Sign out the other sessions
      </Button>
    </section>
  );
}
