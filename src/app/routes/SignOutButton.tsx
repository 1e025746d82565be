import { useNavigate } from 'react-router';
import { useSignOut } from '@/features/auth/api/sign-out';
import { paths } from '../paths';

export function SignOutButton() {
  const signOut = useSignOut();
  const navigate = useNavigate();
  return (
    <button
      type="button"
      disabled={signOut.isPending}
      onClick={() => signOut.mutate(undefined, { onSettled: () => navigate(paths.auth.signIn.getHref(), { replace: true }) })}
      className="rounded-md px-3 py-1.5 text-sm font-bold underline-offset-2 hover:underline"
    >
      {signOut.isPending ? 'Signing out…' : 'Sign out'}
    </button>
  );
}
