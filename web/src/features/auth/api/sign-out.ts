import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, resetCsrfToken } from '@/lib/api-client';
import { authKeys } from './auth-keys';

export async function signOut(): Promise<void> {
  await api.post<void>('/api/auth/logout');
}

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    meta: { handlesUnauthorized: true },
    onSettled: () => {
      resetCsrfToken();
      queryClient.clear();
      queryClient.setQueryData(authKeys.me(), null);
    },
  });
}
