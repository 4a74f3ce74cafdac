import { useState, type FormEvent } from 'react';
import { Dialog } from '@/components/ui/dialog';
import { SelectField } from '@/components/ui/field';
import { FormActions } from '@/components/ui/form-actions';
import { RequestProblem } from '@/components/ui/request-problem';
import { ROLES, roleLabels, type Role } from '@/lib/roles';
import type { UserListItem } from '../api/get-users';
import { useUpdateUser } from '../api/update-user';

export function ChangeRoleDialog({ user, onClose, onDone }: { user: UserListItem | null; onClose: () => void; onDone: (message: string) => void }) {
  const update = useUpdateUser();
  const [role, setRole] = useState<Role | null>(null);
  const chosen = role ?? user?.role ?? 'driver';

  function close() {
    setRole(null);
    update.reset();
    onClose();
  }

  function onSubmit(e: FormEvent) {
    e.preventDefault();
    if (!user) return;
    if (chosen === user.role) return close();
    update.mutate(
      { id: user.id, patch: { role: chosen } },
      {
        onSuccess: (u) => {
          close();
          onDone(`${u.name} is now a ${roleLabels[u.role].toLowerCase()}. The change applies from their next page load.`);
        },
      },
    );
  }

  return (
    <Dialog open={user !== null} onClose={close} title={user ? `Change role for ${user.name}` : 'Change role'}>
      <form onSubmit={onSubmit} className="flex flex-col gap-4">
        <RequestProblem request={update} title="Role not changed" />
        <SelectField
          label="Role"
          value={chosen}
          onChange={(e) => setRole(e.target.value as Role)}
          autoFocus
          options={ROLES.map((r) => ({ value: r, label: roleLabels[r] }))}
        />
        <FormActions onCancel={close} busy={update.isPending}>
          Save role
        </FormActions>
      </form>
    </Dialog>
  );
}
