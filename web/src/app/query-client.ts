import { MutationCache, QueryCache, QueryClient } from '@tanstack/react-query';
import { isApiError } from '@/lib/api-client';

declare module '@tanstack/react-query' {
  interface Register {
    mutationMeta: {
      /** The mutation shows its own 401 (e.g. a wrong password at sign-in); do not send to sign-in. */
      handlesUnauthorized?: boolean;
    };
  }
}

/** Client errors other than a timeout or rate limit will not change on retry. */
function shouldRetry(failureCount: number, error: unknown) {
  if (isApiError(error) && error.status >= 400 && error.status < 500 && error.status !== 408 && error.status !== 429) return false;
  return failureCount < 2;
}

/** The server's answer while the signed-in person's password is a temporary one (set by a fleet manager). */
export const isPasswordChangeRequired = (error: unknown) => isApiError(error) && error.status === 403 && error.code === 'password_change_required';

/**
 * One QueryClient per app (and per test). Any request that finds the session gone calls
 * `onUnauthorized`, which sends the person back to sign-in; any that is refused until a temporary
 * password is replaced calls `onPasswordChangeRequired`, which shows the page to choose one.
 */
export function createQueryClient({ onUnauthorized, onPasswordChangeRequired }: { onUnauthorized: () => void; onPasswordChangeRequired: () => void }) {
  return new QueryClient({
    queryCache: new QueryCache({
      onError: (error) => {
        if (isApiError(error) && error.status === 401) onUnauthorized();
        else if (isPasswordChangeRequired(error)) onPasswordChangeRequired();
      },
    }),
    mutationCache: new MutationCache({
      onError: (error, _vars, _ctx, mutation) => {
        if (isApiError(error) && error.status === 401 && !mutation.meta?.handlesUnauthorized) onUnauthorized();
        else if (isPasswordChangeRequired(error)) onPasswordChangeRequired();
      },
    }),
    defaultOptions: {
      queries: { staleTime: 30_000, retry: shouldRetry, refetchOnWindowFocus: true },
      mutations: { retry: false },
    },
  });
}
