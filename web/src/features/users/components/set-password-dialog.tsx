import { useRef, useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { isApiError } from '@/lib/api-client';
import { focusFirstError, serverFieldErrors, zodFieldErrors, type FieldErrors } from '@/lib/form-errors';
import { createUserSchema } from '../api/create-user';
import type { UserListItem } from '../api/get-users';
import { useUpdateUser } from '../api/update-user';

const labels = { password: 'Temporary password' };
const schema = createUserSchema.pick({ password: true });

/**
 * Sets a password for someone who has forgotten theirs. It is temporary: the server ends their
 * sessions, and at their next sign-in they must choose their own before anything else.
 */
export function SetPasswordDialog({ user, onClose, onDone }: { user: UserListItem | null; onClose: () => void; onDone: (message: string) => void }) {
  const formRef = useRef<HTMLFormElement>(null);
  const [errors, setErrors] = useState<FieldErrors>({});
  const update = useUpdateUser();

  function close() {
    setErrors({});
    update.reset();
    onClose();
  }

  function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    if (!user) return;
    const parsed = schema.safeParse({ password: new FormData(e.currentTarget).get('password') });
    if (!parsed.success) {
      const next = zodFieldErrors(parsed.error, labels);
      setErrors(next);
      focusFirstError(formRef.current, next);
      return;
    }
    setErrors({});
    update.mutate(
      { id: user.id, patch: { password: parsed.data.password } },
      {
        onSuccess: (u) => {
          close();
          onDone(`${u.name} has a temporary password and is signed out everywhere. They choose their own when they next sign in.`);
        },
        onError: (err) => {
          const next = serverFieldErrors(err, labels);
          setErrors(next);
          focusFirstError(formRef.current, next);
        },
      },
    );
  }

  const otherProblem = update.isError && !(isApiError(update.error) && Object.keys(update.error.fields).length > 0);

  return (
    <Dialog
      open={user !== null}
      onClose={close}
      title={user ? `Set temporary password for ${user.name}` : 'Set temporary password'}
      description="They sign in with it once and must then choose a password of their own. Any sessions they have open now end."
    >
      <form ref={formRef} onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
        {otherProblem ? (
          <Notice tone="error" title="Password not set">
            {isApiError(update.error) ? update.error.message : 'Something unexpected went wrong. Try again.'}
          </Notice>
        ) : null}
        <TextField
          label={labels.password}
          name="password"
          type="password"
          autoComplete="new-password"
          autoFocus
          hint="At least 10 characters. Give it to them in person."
          error={errors.password}
        />
        <div className="mt-1 flex justify-end gap-2">
          <Button onClick={close}>Cancel</Button>
          <Button type="submit" variant="primary" busy={update.isPending}>
            Set password
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
