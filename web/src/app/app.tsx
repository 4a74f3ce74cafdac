import { QueryClientProvider } from '@tanstack/react-query';
import { RouterProvider } from 'react-router';
import { authKeys } from '@/features/auth/api/auth-keys';
import type { SignedInUser } from '@/lib/roles';
import { createQueryClient } from './query-client';
import { createAppRouter } from './router';
import { signInPath } from './guards';
import { choosePasswordPath } from './navigation';

let redirecting = false;

/** Sends the person to sign-in when the session has gone, keeping where they were. */
function onUnauthorized() {
  if (redirecting || window.location.pathname === '/sign-in') return;
  redirecting = true;
  queryClient.clear();
  queryClient.setQueryData(authKeys.me(), null);
  void router
    .navigate(signInPath(window.location.href), {
      replace: true,
      state: { notice: 'Your session has ended. Sign in again to carry on where you were.' },
    })
    .finally(() => {
      redirecting = false;
    });
}

/**
 * Shows the page to choose a new password when the server refuses a request until the temporary
 * one is replaced (a fleet manager set it while this page was open, or the cached account is old).
 */
function onPasswordChangeRequired() {
  if (window.location.pathname === choosePasswordPath) return;
  queryClient.setQueryData<SignedInUser | null>(authKeys.me(), (u) => (u ? { ...u, mustChangePassword: true } : u));
  void router.navigate(choosePasswordPath, { replace: true });
}

const queryClient = createQueryClient({ onUnauthorized, onPasswordChangeRequired });
const router = createAppRouter(queryClient);

export function App() {
  return (
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>
  );
}
