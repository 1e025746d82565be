import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { PASSWORD_MIN, signUpSchema, type SignUpInput } from '@shared/auth';
import { paths } from '@/app/paths';
import { AuthCard, TextLink } from '@/components/AuthCard';
import { Button } from '@/components/Button';
import { TextField } from '@/components/Field';
import { Notice } from '@/components/Notice';
import { applyServerError } from '@/lib/forms';
import { useSignUp } from '../api/sign-up';

const FIELDS = ['name', 'email', 'password', 'workspaceName'] as const;

/** A new account always starts a new workspace, with its creator as the admin. */
export function SignUpPage() {
  const signUp = useSignUp();
  const form = useForm<SignUpInput>({
    resolver: zodResolver(signUpSchema),
    defaultValues: { name: '', email: '', password: '', workspaceName: '' },
  });
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit(async (values) => {
    try {
      await signUp.mutateAsync(values);
    } catch (error) {
      applyServerError(error, form.setError, FIELDS);
    }
  });

  if (signUp.isSuccess) {
    return (
      <AuthCard title="Check your inbox">
        <Notice tone="success">{signUp.data.message}</Notice>
        <p className="mt-4 text-sm">
          Sent to <strong>{signUp.variables.email}</strong>. Nothing arrived? Check the address, or{' '}
          <TextLink to={paths.auth.signIn.getHref()}>sign in</TextLink> if you already have an account.
        </p>
      </AuthCard>
    );
  }

  return (
    <AuthCard
      title="Create your workspace"
      intro="A workspace holds your team's datasets, models and fits. You will be its admin and can invite teammates next."
      footer={
        <p>
          Already have an account? <TextLink to={paths.auth.signIn.getHref()}>Sign in</TextLink>
        </p>
      }
    >
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        {errors.root?.server && <Notice tone="error">{errors.root.server.message}</Notice>}
        <TextField label="Your name" autoComplete="name" error={errors.name?.message} {...form.register('name')} />
        <TextField label="E-mail" type="email" autoComplete="email" error={errors.email?.message} {...form.register('email')} />
        <TextField
          label="Password"
          type="password"
          autoComplete="new-password"
          hint={`At least ${PASSWORD_MIN} characters. A short sentence is easy to remember.`}
          error={errors.password?.message}
          {...form.register('password')}
        />
        <TextField
          label="Workspace name"
          hint="Usually your team or project, e.g. “Churn study”."
          error={errors.workspaceName?.message}
          {...form.register('workspaceName')}
        />
        <Button type="submit" busy={form.formState.isSubmitting} busyLabel="Creating…">
          Create workspace
        </Button>
      </form>
    </AuthCard>
  );
}
