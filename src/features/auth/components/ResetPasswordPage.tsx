import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { useParams } from 'react-router';
import { z } from 'zod';
import { PASSWORD_MIN, passwordSchema } from '@shared/auth';
import { paths } from '@/app/paths';
import { AuthCard, TextLink } from '@/components/AuthCard';
import { Button } from '@/components/Button';
import { TextField } from '@/components/Field';
import { Notice } from '@/components/Notice';
import { applyServerError } from '@/lib/forms';
import { useCompletePasswordReset } from '../api/password-reset-complete';

// The token comes from the link, so the form only asks for the password (typed twice: it cannot be seen).
const formSchema = z
  .object({ password: passwordSchema, confirm: z.string() })
  .refine((v) => v.password === v.confirm, { path: ['confirm'], message: 'The two passwords differ.' });
type FormValues = z.input<typeof formSchema>;

export function ResetPasswordPage() {
  const { token = '' } = useParams();
  const complete = useCompletePasswordReset();
  const form = useForm<FormValues>({ resolver: zodResolver(formSchema), defaultValues: { password: '', confirm: '' } });
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit(async ({ password }) => {
    try {
      await complete.mutateAsync({ token, password });
    } catch (error) {
      applyServerError(error, form.setError, ['password']);
    }
  });

  if (complete.isSuccess) {
    return (
      <AuthCard title="Password changed">
        <Notice tone="success">Your new password is set.</Notice>
        <p className="mt-4 text-sm">
          <TextLink to={paths.auth.signIn.getHref()}>Sign in with your new password</TextLink>
        </p>
      </AuthCard>
    );
  }

  return (
    <AuthCard
      title="Choose a new password"
      footer={
        <p>
          Link not working? <TextLink to={paths.auth.forgotPassword.getHref()}>Ask for a new one</TextLink>
        </p>
      }
    >
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        {errors.root?.server && <Notice tone="error">{errors.root.server.message}</Notice>}
        <TextField
          label="New password"
          type="password"
          autoComplete="new-password"
          hint={`At least ${PASSWORD_MIN} characters.`}
          error={errors.password?.message}
          {...form.register('password')}
        />
        <TextField label="New password, again" type="password" autoComplete="new-password" error={errors.confirm?.message} {...form.register('confirm')} />
        <Button type="submit" busy={form.formState.isSubmitting} busyLabel="Saving…">
          Set new password
        </Button>
      </form>
    </AuthCard>
  );
}
