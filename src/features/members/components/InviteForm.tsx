import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { INVITATION_DAYS, ROLE_LABELS, WORKSPACE_ROLES, createInvitationSchema, type CreateInvitationInput } from '@shared/members';
import { Button } from '@/components/Button';
import { SelectField, TextField } from '@/components/Field';
import { Notice } from '@/components/Notice';
import { applyServerError } from '@/lib/forms';
import { useCreateInvitation } from '../api/create-invitation';

const ROLE_OPTIONS = WORKSPACE_ROLES.map((r) => ({ value: r, label: ROLE_LABELS[r] }));

/** Admins only: e-mails a link that lets the person join this workspace with the chosen role. */
export function InviteForm({ workspaceId }: { workspaceId: string }) {
  const invite = useCreateInvitation(workspaceId);
  const [sentTo, setSentTo] = useState<string | null>(null);
  const form = useForm<CreateInvitationInput>({ resolver: zodResolver(createInvitationSchema), defaultValues: { email: '', role: 'analyst' } });
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit(async (values) => {
    setSentTo(null);
    try {
      await invite.mutateAsync(values);
      setSentTo(values.email);
      form.reset({ email: '', role: values.role });
    } catch (error) {
      applyServerError(error, form.setError, ['email', 'role']);
    }
  });

  return (
    <section aria-labelledby="invite-heading" className="rounded-lg border border-slate-200 bg-white p-5 dark:border-slate-800 dark:bg-slate-900">
      <h2 id="invite-heading" className="text-lg font-bold">
        Invite a teammate
      </h2>
      <p className="mt-1 text-sm text-slate-700 dark:text-slate-300">
        They get an e-mail with a link to join this workspace. The link works for {INVITATION_DAYS} days.
      </p>
      <form onSubmit={onSubmit} noValidate className="mt-4 grid gap-4 sm:grid-cols-[1fr_12rem_auto] sm:items-start">
        <TextField label="E-mail" type="email" autoComplete="off" error={errors.email?.message} {...form.register('email')} />
        <SelectField label="Role" options={ROLE_OPTIONS} error={errors.role?.message} {...form.register('role')} />
        <Button type="submit" className="sm:mt-6" busy={form.formState.isSubmitting} busyLabel="Sending…">
          Send invitation
        </Button>
      </form>
      <div className="mt-3 space-y-2">
        {errors.root?.server && <Notice tone="error">{errors.root.server.message}</Notice>}
        {sentTo && <Notice tone="success">Invitation sent to {sentTo}.</Notice>}
      </div>
    </section>
  );
}
