import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { changePasswordSchema, PASSWORD_MIN } from '@shared/auth';
import { Button } from '@/components/Button';
import { TextField } from '@/components/Field';
import { Notice } from '@/components/Notice';
import { applyServerError } from '@/lib/forms';
import { useChangePassword } from '../api/change-password';

// The new password is typed twice: it cannot be seen.
const formSchema = changePasswordSchema
  .extend({ confirm: z.string() })
  .refine((v) => v.newPassword === v.confirm, { path: ['confirm'], message: 'The two passwords differ.' });
type FormValues = z.input<typeof formSchema>;

export function ChangePasswordForm() {
  const change = useChangePassword();
  const form = useForm<FormValues>({ resolver: zodResolver(formSchema), defaultValues: { currentPassword: '', newPassword: '', confirm: '' } });
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit(async ({ currentPassword, newPassword }) => {
    try {
      await change.mutateAsync({ currentPassword, newPassword });
      form.reset();
    } catch (error) {
      applyServerError(error, form.setError, ['currentPassword', 'newPassword']);
    }
  });

  return (
    <section aria-labelledby="password-heading" className="space-y-4">
      <h2 id="password-heading" className="text-xl font-bold">
        Change your password
      </h2>
      <p className="text-sm text-slate-700 dark:text-slate-300">Your other sessions are signed out, and you get an e-mail about the change.</p>
      <form onSubmit={onSubmit} noValidate className="max-w-md space-y-4">
        {errors.root?.server && <Notice tone="error">{errors.root.server.message}</Notice>}
        {change.isSuccess && <Notice tone="success">{change.data.message}</Notice>}
        <TextField label="Current password" type="password" autoComplete="current-password" error={errors.currentPassword?.message} {...form.register('currentPassword')} />
        <TextField
          label="New password"
          type="password"
          autoComplete="new-password"
          hint={`At least ${PASSWORD_MIN} characters.`}
          error={errors.newPassword?.message}
          {...form.register('newPassword')}
        />
        <TextField label="New password, again" type="password" autoComplete="new-password" error={errors.confirm?.message} {...form.register('confirm')} />
        <Button type="submit" busy={form.formState.isSubmitting} busyLabel="Saving…">
          Change password
        </Button>
      </form>
    </section>
  );
}
