import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { useNavigate } from 'react-router';
import { createWorkspaceSchema, type CreateWorkspaceInput } from '@shared/workspaces';
import { paths } from '@/app/paths';
import { AuthCard, TextLink } from '@/components/AuthCard';
import { Button } from '@/components/Button';
import { TextField } from '@/components/Field';
import { Notice } from '@/components/Notice';
import { applyServerError } from '@/lib/forms';
import { useCreateWorkspace } from '../api/create-workspace';

export function NewWorkspacePage() {
  const navigate = useNavigate();
  const create = useCreateWorkspace();
  const form = useForm<CreateWorkspaceInput>({ resolver: zodResolver(createWorkspaceSchema), defaultValues: { name: '' } });
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit(async (values) => {
    try {
      const workspace = await create.mutateAsync(values);
      navigate(paths.workspace.root.getHref(workspace.id));
    } catch (error) {
      applyServerError(error, form.setError, ['name']);
    }
  });

  return (
    <AuthCard
      title="Start a new workspace"
      intro="You will be its admin. Nothing is shared between workspaces."
      footer={<TextLink to={paths.home.getHref()}>Back to your workspaces</TextLink>}
    >
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        {errors.root?.server && <Notice tone="error">{errors.root.server.message}</Notice>}
        <TextField label="Workspace name" error={errors.name?.message} {...form.register('name')} />
        <Button type="submit" busy={form.formState.isSubmitting} busyLabel="Creating…">
          Create workspace
        </Button>
      </form>
    </AuthCard>
  );
}
