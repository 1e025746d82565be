import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { PASSWORD_MIN, passwordProblem, personNameSchema } from '@shared/auth';
import { Button } from '@/components/Button';
import { TextField } from '@/components/Field';
import { Notice } from '@/components/Notice';
import { applyServerError } from '@/lib/forms';

interface Values {
  name: string;
  password: string;
}

/** Name and password for someone joining by invitation; the e-mail is the invited one and fixed. */
export function NewAccountForm({ email, onSubmit }: { email: string; onSubmit(values: Values): Promise<void> }) {
  const schema = z.object({ name: personNameSchema, password: z.string() }).superRefine((v, ctx) => {
    const problem = passwordProblem(v.password, email);
    if (problem) ctx.addIssue({ code: 'custom', path: ['password'], message: problem });
  });
  const form = useForm<Values>({ resolver: zodResolver(schema), defaultValues: { name: '', password: '' } });
  const { errors } = form.formState;

  const submit = form.handleSubmit(async (values) => {
    try {
      await onSubmit(values);
    } catch (error) {
      applyServerError(error, form.setError, ['name', 'password']);
    }
  });

  return (
    <form onSubmit={submit} noValidate className="space-y-4">
      {errors.root?.server && <Notice tone="error">{errors.root.server.message}</Notice>}
      <TextField label="E-mail" type="email" value={email} readOnly autoComplete="username" className="bg-slate-100 dark:bg-slate-800" />
      <TextField label="Your name" autoComplete="name" error={errors.name?.message} {...form.register('name')} />
      <TextField
        label="Choose a password"
        type="password"
        autoComplete="new-password"
        hint={`At least ${PASSWORD_MIN} characters.`}
        error={errors.password?.message}
        {...form.register('password')}
      />
      <Button type="submit" busy={form.formState.isSubmitting} busyLabel="Joining…">
        Join workspace
      </Button>
    </form>
  );
}
