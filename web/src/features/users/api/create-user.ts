import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { api } from '@/lib/api-client';
import { createUserBody } from '@contracts/users';
import type { UserListItem } from './get-users';
import { userKeys } from './user-keys';

/** The server's own rules for a new person (server/contracts/users.ts), without the depot (not asked here). */
export const createUserSchema = createUserBody.omit({ depotId: true });
export type CreateUserInput = z.infer<typeof createUserSchema>;

export async function createUser(input: CreateUserInput): Promise<UserListItem> {
  const body = await api.post<{ user: UserListItem }>('/api/users', input);
  return body.user;
}

export function useCreateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createUser,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: userKeys.lists() }),
  });
}
