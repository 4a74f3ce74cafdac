import { Dialog } from '@/components/ui/dialog';
import { TextField } from '@/components/ui/field';
import { FormActions } from '@/components/ui/form-actions';
import { RequestProblem } from '@/components/ui/request-problem';
import { useSchemaForm } from '@/lib/use-schema-form';
import { passwordSchema } from '@contracts/users';
import { z } from 'zod';
import type { UserListItem } from '../api/get-users';
import { useUpdateUser } from '../api/update-user';

const labels = { password: 'Temporary password' };
/** The server's password rules (server/contracts/users.ts). */
const schema = z.object({ password: passwordSchema });

/**
 * Sets a password for someone who has forgotten theirs. It is temporary: the server ends their
 * sessions, and at their next sign-in they must choose their own before anything else.
 */
export function SetPasswordDialog({ user, onClose, onDone }: { user: UserListItem | null; onClose: () => void; onDone: (message: string) => void }) {
  const form = useSchemaForm(schema, labels, { password: '' });
  const update = useUpdateUser();

  function close() {
    form.reset();
    update.reset();
    onClose();
  }

  const onSubmit = form.handleSubmit(({ password }) => {
    if (!user) return;
    update.mutate(
      { id: user.id, patch: { password } },
      {
        onSuccess: (u) => {
          close();
          onDone(`${u.name} has a temporary password and is signed out everywhere. They choose their own when they next sign in.`);
        },
        onError: (err) => form.showServerErrors(err),
      },
    );
  });

  return (
    <Dialog
      open={user !== null}
      onClose={close}
      title={user ? `Set temporary password for ${user.name}` : 'Set temporary password'}
      description="They sign in with it once and must then choose a password of their own. Any sessions they have open now end."
    >
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
        <RequestProblem request={update} title="Password not set" fieldsShownOnForm />
        <TextField
          label={labels.password}
          {...form.register('password')}
          type="password"
          autoComplete="new-password"
          autoFocus
          hint="At least 10 characters. Give it to them in person."
          error={form.errorOf('password')}
        />
        <FormActions onCancel={close} busy={update.isPending} className="mt-1">
          Set password
        </FormActions>
      </form>
    </Dialog>
  );
}
