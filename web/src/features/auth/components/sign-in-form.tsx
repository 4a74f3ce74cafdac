import { useId, useRef, useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { isApiError } from '@/lib/api-client';
import { checkedFormValues, type FieldErrors } from '@/lib/form-errors';
import type { SignedInUser } from '@/lib/roles';
import { signInSchema, useSignIn } from '../api/sign-in';

const labels = { email: 'E-mail', password: 'Password' };

function problemText(error: unknown): string {
  if (!isApiError(error)) return 'Something unexpected went wrong. Reload the page and try again.';
  if (error.status === 401) return 'That e-mail and password do not match an active account. Check both and try again.';
  return error.message;
}

/** The sign-in form. Keeps focus where the person needs to act next. */
export function SignInForm({ onSignedIn }: { onSignedIn: (user: SignedInUser) => void }) {
  const formRef = useRef<HTMLFormElement>(null);
  const passwordRef = useRef<HTMLInputElement>(null);
  const problemId = useId();
  const [errors, setErrors] = useState<FieldErrors>({});
  const signIn = useSignIn();

  function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = new FormData(e.currentTarget);
    const input = checkedFormValues(signInSchema, { email: form.get('email'), password: form.get('password') }, labels, formRef.current, setErrors);
    if (!input) return;
    signIn.mutate(input, {
      onSuccess: onSignedIn,
      onError: () => {
        passwordRef.current?.focus();
        passwordRef.current?.select();
      },
    });
  }

  const problem = signIn.isError ? problemText(signIn.error) : null;

  return (
    <form ref={formRef} onSubmit={onSubmit} noValidate aria-label="Sign in" className="flex flex-col gap-4">
      {problem ? (
        <Notice tone="error" id={problemId} title="Not signed in">
          {problem}
        </Notice>
      ) : null}
      <TextField
        label={labels.email}
        name="email"
        type="email"
        autoComplete="username"
        inputMode="email"
        autoCapitalize="none"
        spellCheck={false}
        autoFocus
        required
        error={errors.email}
        aria-describedby={problem ? problemId : undefined}
      />
      <TextField
        ref={passwordRef}
        label={labels.password}
        name="password"
        type="password"
        autoComplete="current-password"
        required
        error={errors.password}
        aria-describedby={problem ? problemId : undefined}
      />
      <Button type="submit" variant="primary" size="lg" busy={signIn.isPending} className="mt-1 w-full">
        {signIn.isPending ? 'Signing in…' : 'Sign in'}
      </Button>
    </form>
  );
}
