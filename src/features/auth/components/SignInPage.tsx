import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { useNavigate, useSearchParams } from 'react-router';
import { signInSchema, type SignInInput } from '@shared/auth';
import { paths } from '@/app/paths';
import { AuthCard, TextLink } from '@/components/AuthCard';
import { Button } from '@/components/Button';
import { TextField } from '@/components/Field';
import { Notice } from '@/components/Notice';
import { applyServerError } from '@/lib/forms';
import { safeRedirect } from '@/lib/redirect';
import { useSignIn } from '../api/sign-in';

export function SignInPage() {
  const [search] = useSearchParams();
  const navigate = useNavigate();
  const signIn = useSignIn();
  const form = useForm<SignInInput>({ resolver: zodResolver(signInSchema), defaultValues: { email: '', password: '' } });
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit(async (values) => {
    try {
      await signIn.mutateAsync(values);
      navigate(safeRedirect(search.get('redirectTo')), { replace: true });
    } catch (error) {
      applyServerError(error, form.setError, ['email', 'password']);
    }
  });

  return (
    <AuthCard
      title="Sign in"
      intro="Welcome back. Sign in to reach your workspaces."
      footer={
        <p>
          New to Lariat? <TextLink to={paths.auth.signUp.getHref()}>Create your workspace</TextLink>
        </p>
      }
    >
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        {errors.root?.server && <Notice tone="error">{errors.root.server.message}</Notice>}
        <TextField label="E-mail" type="email" autoComplete="email" error={errors.email?.message} {...form.register('email')} />
        <TextField label="Password" type="password" autoComplete="current-password" error={errors.password?.message} {...form.register('password')} />
        <div className="flex items-center justify-between gap-4">
          <Button type="submit" busy={form.formState.isSubmitting} busyLabel="Signing in…">
            Sign in
          </Button>
          <TextLink to={paths.auth.forgotPassword.getHref()}>Forgot your password?</TextLink>
        </div>
      </form>
    </AuthCard>
  );
}
