import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { ROLES } from '@/lib/roles';
import { createUserSchema } from './create-user';
import type { UserListItem } from './get-users';
import { userKeys } from './user-keys';

export const updateUserSchema = z
  .object({
    name: z.string().trim().min(1, 'is required').max(120).optional(),
    role: z.enum(ROLES, 'must be chosen').optional(),
    active: z.boolean().optional(),
    /** A temporary password: the person's sessions end and they choose their own at next sign-in. */
    password: createUserSchema.shape.password.optional(),
  })
  .refine((p) => Object.keys(p).length > 0, 'Change at least one thing.');
export type UpdateUserInput = z.infer<typeof updateUserSchema>;

export async function updateUser({ id, patch }: { id: number; patch: UpdateUserInput }): Promise<UserListItem> {
  const body = await api.patch<{ user: UserListItem }>(`/api/users/${id}`, updateUserSchema.parse(patch));
  return body.user;
}

export function useUpdateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateUser,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: userKeys.lists() }),
  });
}
