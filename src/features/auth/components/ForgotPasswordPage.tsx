import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { passwordResetRequestSchema } from '@shared/auth';
import { paths } from '@/app/paths';
import { AuthCard, TextLink } from '@/components/AuthCard';
import { Button } from '@/components/Button';
import { TextField } from '@/components/Field';
import { Notice } from '@/components/Notice';
import { applyServerError } from '@/lib/forms';
import { useRequestPasswordReset, type PasswordResetRequestInput } from '../api/password-reset-request';

export function ForgotPasswordPage() {
  const request = useRequestPasswordReset();
  const form = useForm<PasswordResetRequestInput>({ resolver: zodResolver(passwordResetRequestSchema), defaultValues: { email: '' } });
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit(async (values) => {
    try {
      await request.mutateAsync(values);
    } catch (error) {
      applyServerError(error, form.setError, ['email']);
    }
  });

  return (
    <AuthCard
      title="Reset your password"
      intro="Enter the e-mail address of your account and we will send you a link to choose a new password."
      footer={
        <p>
          Remembered it? <TextLink to={paths.auth.signIn.getHref()}>Back to sign in</TextLink>
        </p>
      }
    >
      {request.isSuccess ? (
        <Notice tone="success">
          If an account uses <strong>{form.getValues('email')}</strong>, a reset link is on its way. The link works for a
          limited time and only once.
        </Notice>
      ) : (
        <form onSubmit={onSubmit} noValidate className="space-y-4">
          {errors.root?.server && <Notice tone="error">{errors.root.server.message}</Notice>}
          <TextField label="E-mail" type="email" autoComplete="email" error={errors.email?.message} {...form.register('email')} />
          <Button type="submit" busy={form.formState.isSubmitting} busyLabel="Sending…">
            Send reset link
          </Button>
        </form>
      )}
    </AuthCard>
  );
}
