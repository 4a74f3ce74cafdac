import { useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { SelectField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { isApiError } from '@/lib/api-client';
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
        {update.isError ? (
          <Notice tone="error" title="Role not changed">
            {isApiError(update.error) ? update.error.message : 'Something unexpected went wrong. Try again.'}
          </Notice>
        ) : null}
        <SelectField
          label="Role"
          value={chosen}
          onChange={(e) => setRole(e.target.value as Role)}
          autoFocus
          options={ROLES.map((r) => ({ value: r, label: roleLabels[r] }))}
        />
        <div className="flex justify-end gap-2">
          <Button onClick={close}>Cancel</Button>
          <Button type="submit" variant="primary" busy={update.isPending}>
            Save role
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
