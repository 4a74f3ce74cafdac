import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { RequestProblem } from '@/components/ui/request-problem';
import type { UserListItem } from '../api/get-users';
import { useUpdateUser } from '../api/update-user';

/** Confirms deactivating (or reactivating) a person's sign-in. Their records stay. */
export function SetActiveDialog({ user, onClose, onDone }: { user: UserListItem | null; onClose: () => void; onDone: (message: string) => void }) {
  const update = useUpdateUser();
  const deactivating = user?.active ?? true;

  function close() {
    update.reset();
    onClose();
  }

  function confirm() {
    if (!user) return;
    update.mutate(
      { id: user.id, patch: { active: !user.active } },
      {
        onSuccess: (u) => {
          close();
          onDone(u.active ? `${u.name} can sign in again.` : `${u.name} can no longer sign in. Their records are kept.`);
        },
      },
    );
  }

  return (
    <Dialog
      open={user !== null}
      onClose={close}
      title={user ? `${deactivating ? 'Deactivate' : 'Reactivate'} ${user.name}?` : ''}
      description={
        deactivating
          ? 'They will be signed out and cannot sign in again until reactivated. Their trips, reports and work records stay as they are.'
          : 'They can sign in again with their existing password.'
      }
    >
      <RequestProblem request={update} title="Nothing changed" className="mb-4" />
      <div className="flex justify-end gap-2">
        <Button onClick={close} autoFocus>
          Cancel
        </Button>
        <Button variant={deactivating ? 'danger' : 'primary'} busy={update.isPending} onClick={confirm}>
          {deactivating ? 'Deactivate' : 'Reactivate'}
        </Button>
      </div>
    </Dialog>
  );
}
