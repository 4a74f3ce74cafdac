import { BrandMark } from '@/components/ui/brand-mark';
import type { SignedInUser } from '@/lib/roles';
import { SignInForm } from './sign-in-form';

/** The page people see before they are signed in. */
export function SignInPage({ onSignedIn, notice }: { onSignedIn: (user: SignedInUser) => void; notice?: string }) {
  return (
    <main className="flex min-h-dvh flex-col items-center justify-center px-4 py-10">
      <title>Sign in · Reboundry</title>
      <div className="w-full max-w-sm">
        <BrandMark className="mb-8" />
        <h1 className="text-2xl font-semibold tracking-tight text-ink">Sign in</h1>
        <p className="mt-1 mb-6 text-[0.9375rem] text-slate">
          Damper wear from the roads your fleet drives, and inspections booked before it matters.
        </p>
        {notice ? <p className="mb-4 rounded-md border border-line bg-surface px-3 py-2 text-sm text-ink">{notice}</p> : null}
        <div className="rounded-lg border border-line bg-surface p-5 shadow-[0_1px_0_rgb(30_42_50/0.04)]">
          <SignInForm onSignedIn={onSignedIn} />
        </div>
        <p className="mt-5 text-sm text-slate">Forgotten your password? A fleet manager can set a new one for you.</p>
      </div>
    </main>
  );
}
