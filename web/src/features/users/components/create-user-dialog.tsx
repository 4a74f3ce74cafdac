import { Dialog } from '@/components/ui/dialog';
import { SelectField, TextField } from '@/components/ui/field';
import { FormActions } from '@/components/ui/form-actions';
import { RequestProblem } from '@/components/ui/request-problem';
import { useSchemaForm } from '@/lib/use-schema-form';
import { ROLES, roleLabels } from '@/lib/roles';
import { createUserSchema, useCreateUser } from '../api/create-user';
import type { UserListItem } from '../api/get-users';

const labels = { name: 'Name', email: 'E-mail', role: 'Role', password: 'First password' };

export function CreateUserDialog({ open, onClose, onCreated }: { open: boolean; onClose: () => void; onCreated: (user: UserListItem) => void }) {
  const form = useSchemaForm(createUserSchema, labels, { name: '', email: '', role: 'driver', password: '' });
  const create = useCreateUser();

  function close() {
    form.reset();
    create.reset();
    onClose();
  }

  const onSubmit = form.handleSubmit((input) =>
    create.mutate(input, {
      onSuccess: (user) => {
        close();
        onCreated(user);
      },
      onError: (err) => form.showServerErrors(err),
    }),
  );

  return (
    <Dialog open={open} onClose={close} title="Add a person" description="They sign in with this e-mail and the first password you set here.">
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
        <RequestProblem request={create} title="Not added" fieldsShownOnForm />
        <TextField label={labels.name} {...form.register('name')} autoComplete="off" error={form.errorOf('name')} autoFocus />
        <TextField label={labels.email} {...form.register('email')} type="email" autoComplete="off" spellCheck={false} error={form.errorOf('email')} />
        <SelectField
          label={labels.role}
          {...form.register('role')}
          error={form.errorOf('role')}
          hint="Managers see and change everything; mechanics see the workshop and vehicles; drivers see their own vehicle."
          options={ROLES.map((r) => ({ value: r, label: roleLabels[r] }))}
        />
        <TextField
          label={labels.password}
          {...form.register('password')}
          type="password"
          autoComplete="new-password"
          hint="At least 10 characters. Give it to them in person; they choose their own password when they first sign in."
          error={form.errorOf('password')}
        />
        <FormActions onCancel={close} busy={create.isPending} className="mt-1">
          Add person
        </FormActions>
      </form>
    </Dialog>
  );
}
