import { useMutation, useQueryClient } from '@tanstack/react-query';
// zod's small build: the sign-in page is the first thing a phone downloads.
import * as z from 'zod/mini';
import { api, resetCsrfToken } from '@/lib/api-client';
import type { SignedInUser } from '@/lib/roles';
import { authKeys } from './auth-keys';

export const signInSchema = z.object({
  email: z.pipe(z.string().check(z.trim(), z.minLength(1, 'is required')), z.email('does not look like an e-mail address')),
  password: z.string().check(z.minLength(1, 'is required')),
});
export type SignInInput = z.infer<typeof signInSchema>;

export async function signIn(input: SignInInput): Promise<SignedInUser> {
  // A stale token from before sign-in may belong to an old session.
  resetCsrfToken();
  const body = await api.post<{ user: SignedInUser }>('/api/auth/login', input);
  // The session changed, so the next state-changing request needs a fresh token.
  resetCsrfToken();
  return body.user;
}

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    meta: { handlesUnauthorized: true },
    onSuccess: (user) => {
      // Drop anything cached for a previous user before showing this one's data.
      queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== authKeys.all[0] });
      queryClient.setQueryData(authKeys.me(), user);
    },
  });
}
