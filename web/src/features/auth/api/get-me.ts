import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, isApiError } from '@/lib/api-client';
import type { SignedInUser } from '@/lib/roles';
import { authKeys } from './auth-keys';

/** The signed-in user, or `null` when nobody is signed in (a 401 is an answer here, not an error). */
export async function getMe(signal?: AbortSignal): Promise<SignedInUser | null> {
  try {
    const body = await api.get<{ user: SignedInUser }>('/api/auth/me', { signal });
    return body.user;
  } catch (err) {
    if (isApiError(err) && err.status === 401) return null;
    throw err;
  }
}

export const meQueryOptions = () =>
  queryOptions({
    queryKey: authKeys.me(),
    queryFn: ({ signal }) => getMe(signal),
    staleTime: 5 * 60 * 1000,
  });

export function useMe() {
  return useQuery(meQueryOptions());
}
