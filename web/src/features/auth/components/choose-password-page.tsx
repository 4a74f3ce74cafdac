import { useEffect, useRef } from 'react';
import { BrandMark } from '@/components/ui/brand-mark';
import { Button } from '@/components/ui/button';
import type { SignedInUser } from '@/lib/roles';
import { useSignOut } from '../api/sign-out';
import { ChangePasswordForm } from './change-password-form';

/**
 * What someone sees, instead of the app, while their password is one a fleet manager set (a new
 * account or a reset): they choose their own before anything else, or sign out. Focus starts on
 * the heading, so a screen reader announces why this page is here.
 */
export function ChoosePasswordPage({ user, onChosen, onSignedOut }: { user: SignedInUser; onChosen: () => void; onSignedOut: () => void }) {
  const headingRef = useRef<HTMLHeadingElement>(null);
  const signOut = useSignOut();

  useEffect(() => headingRef.current?.focus(), []);

  return (
    <main className="flex min-h-dvh flex-col items-center justify-center px-4 py-10">
      <title>Choose a new password · Reboundry</title>
      <div className="w-full max-w-sm">
        <BrandMark className="mb-8" />
        <h1 ref={headingRef} tabIndex={-1} className="text-2xl font-semibold tracking-tight text-ink outline-none">
          Choose a new password
        </h1>
        <p className="mt-1 mb-6 text-[0.9375rem] text-slate">
          A fleet manager set your password, so it is only for signing in this once. Choose one of your own to carry on; nobody
          else will know it.
        </p>
        <div className="rounded-lg border border-line bg-surface p-5 shadow-[0_1px_0_rgb(30_42_50/0.04)]">
          <ChangePasswordForm
            name="Choose a new password"
            currentLabel="Temporary password"
            currentHint="The one your fleet manager gave you."
            submitLabel="Save new password"
            onChanged={onChosen}
          />
        </div>
        <p className="mt-5 flex flex-wrap items-center gap-x-3 gap-y-2 text-sm text-slate">
          <span>
            Signed in as {user.name} ({user.email}).
          </span>
          <Button size="sm" variant="secondary" busy={signOut.isPending} onClick={() => signOut.mutate(undefined, { onSettled: onSignedOut })}>
            Sign out
          </Button>
        </p>
      </div>
    </main>
  );
}
