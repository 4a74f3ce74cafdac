import { useRef, useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { RequestProblem } from '@/components/ui/request-problem';
import { checkedFormValues, serverFieldErrors, showFieldErrors, type FieldErrors } from '@/lib/form-errors';
import { changePasswordSchema, MIN_PASSWORD_LENGTH, useChangePassword } from '../api/change-password';

const defaultLabels = { currentPassword: 'Current password', newPassword: 'New password', confirmPassword: 'New password again' };

/**
 * Current password, new, and new again. On the Account page it says when it saved; on the page
 * that replaces a temporary password, `onChanged` takes the person on instead.
 */
export function ChangePasswordForm({
  name = 'Change password',
  currentLabel = defaultLabels.currentPassword,
  currentHint,
  submitLabel = 'Change password',
  onChanged,
}: {
  /** The form's accessible name. */
  name?: string;
  currentLabel?: string;
  currentHint?: string;
  submitLabel?: string;
  onChanged?: () => void;
} = {}) {
  const labels = { ...defaultLabels, currentPassword: currentLabel };
  const formRef = useRef<HTMLFormElement>(null);
  const [errors, setErrors] = useState<FieldErrors>({});
  const [done, setDone] = useState(false);
  const change = useChangePassword();

  function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    setDone(false);
    const form = e.currentTarget;
    const data = new FormData(form);
    const values = { currentPassword: data.get('currentPassword'), newPassword: data.get('newPassword'), confirmPassword: data.get('confirmPassword') };
    const input = checkedFormValues(changePasswordSchema, values, labels, formRef.current, setErrors);
    if (!input) return;
    change.mutate(input, {
      onSuccess: () => {
        form.reset();
        if (onChanged) onChanged();
        else setDone(true);
      },
      onError: (err) => showFieldErrors(formRef.current, serverFieldErrors(err, labels), setErrors),
    });
  }

  return (
    <form ref={formRef} onSubmit={onSubmit} noValidate aria-label={name} className="flex max-w-md flex-col gap-4">
      {done ? <Notice tone="ok" title="Password changed">Use the new password the next time you sign in.</Notice> : null}
      <RequestProblem request={change} title="Password not changed" fieldsShownOnForm />
      <TextField
        label={labels.currentPassword}
        name="currentPassword"
        type="password"
        autoComplete="current-password"
        hint={currentHint}
        error={errors.currentPassword}
      />
      <TextField
        label={labels.newPassword}
        name="newPassword"
        type="password"
        autoComplete="new-password"
        hint={`At least ${MIN_PASSWORD_LENGTH} characters. A few unrelated words make a strong password that is easy to type.`}
        error={errors.newPassword}
      />
      <TextField label={labels.confirmPassword} name="confirmPassword" type="password" autoComplete="new-password" error={errors.confirmPassword} />
      <div>
        <Button type="submit" variant="primary" busy={change.isPending}>
          {submitLabel}
        </Button>
      </div>
    </form>
  );
}
