import { QueryClientProvider } from '@tanstack/react-query';
import { RouterProvider } from 'react-router';
import { authKeys } from '@/features/auth/api/auth-keys';
import { createQueryClient } from './query-client';
import { createAppRouter } from './router';
import { signInPath } from './guards';

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

const queryClient = createQueryClient({ onUnauthorized });
const router = createAppRouter(queryClient);

export function App() {
  return (
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>
  );
}
