import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { ROLES } from '@/lib/roles';
import type { UserListItem } from './get-users';
import { userKeys } from './user-keys';

export const createUserSchema = z.object({
  name: z.string().trim().min(1, 'is required').max(120, 'must be at most 120 characters'),
  email: z.string().trim().min(1, 'is required').pipe(z.email('does not look like an e-mail address')),
  role: z.enum(ROLES, 'must be chosen'),
  password: z.string().min(10, 'must be at least 10 characters').refine((p) => new TextEncoder().encode(p).length <= 72, 'must be at most 72 bytes (72 plain letters or digits; accented letters take more)'),
});
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
