import { useRef, useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { SelectField, TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { isApiError } from '@/lib/api-client';
import { focusFirstError, serverFieldErrors, zodFieldErrors, type FieldErrors } from '@/lib/form-errors';
import { ROLES, roleLabels } from '@/lib/roles';
import { createUserSchema, useCreateUser } from '../api/create-user';
import type { UserListItem } from '../api/get-users';

const labels = { name: 'Name', email: 'E-mail', role: 'Role', password: 'First password' };

export function CreateUserDialog({ open, onClose, onCreated }: { open: boolean; onClose: () => void; onCreated: (user: UserListItem) => void }) {
  const formRef = useRef<HTMLFormElement>(null);
  const [errors, setErrors] = useState<FieldErrors>({});
  const create = useCreateUser();

  function close() {
    setErrors({});
    create.reset();
    onClose();
  }

  function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const data = new FormData(e.currentTarget);
    const parsed = createUserSchema.safeParse(Object.fromEntries(data));
    if (!parsed.success) {
      const next = zodFieldErrors(parsed.error, labels);
      setErrors(next);
      focusFirstError(formRef.current, next);
      return;
    }
    setErrors({});
    create.mutate(parsed.data, {
      onSuccess: (user) => {
        close();
        onCreated(user);
      },
      onError: (err) => {
        const next = serverFieldErrors(err, labels);
        setErrors(next);
        focusFirstError(formRef.current, next);
      },
    });
  }

  const otherProblem = create.isError && !(isApiError(create.error) && Object.keys(create.error.fields).length > 0);

  return (
    <Dialog open={open} onClose={close} title="Add a person" description="They sign in with this e-mail and the first password you set here.">
      <form ref={formRef} onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
        {otherProblem ? (
          <Notice tone="error" title="Not added">
            {isApiError(create.error) ? create.error.message : 'Something unexpected went wrong. Try again.'}
          </Notice>
        ) : null}
        <TextField label={labels.name} name="name" autoComplete="off" error={errors.name} autoFocus />
        <TextField label={labels.email} name="email" type="email" autoComplete="off" spellCheck={false} error={errors.email} />
        <SelectField
          label={labels.role}
          name="role"
          defaultValue="driver"
          error={errors.role}
          hint="Managers see and change everything; mechanics see the workshop and vehicles; drivers see their own vehicle."
          options={ROLES.map((r) => ({ value: r, label: roleLabels[r] }))}
        />
        <TextField
          label={labels.password}
          name="password"
          type="password"
          autoComplete="new-password"
          hint="At least 10 characters. Give it to them in person; they choose their own password when they first sign in."
          error={errors.password}
        />
        <div className="mt-1 flex justify-end gap-2">
          <Button onClick={close}>Cancel</Button>
          <Button type="submit" variant="primary" busy={create.isPending}>
            Add person
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
