import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import type { SignedInUser } from '@/lib/roles';
import { authKeys } from './auth-keys';

export const MIN_PASSWORD_LENGTH = 10;

export const changePasswordSchema = z
  .object({
    currentPassword: z.string().min(1, 'is required'),
    newPassword: z.string().min(MIN_PASSWORD_LENGTH, `must be at least ${MIN_PASSWORD_LENGTH} characters`).refine((p) => new TextEncoder().encode(p).length <= 72, 'must be at most 72 bytes (72 plain letters or digits; accented letters take more)'),
    confirmPassword: z.string().min(1, 'is required'),
  })
  .refine((v) => v.newPassword === v.confirmPassword, { path: ['confirmPassword'], message: 'does not match the new password' })
  .refine((v) => v.newPassword !== v.currentPassword, { path: ['newPassword'], message: 'must differ from the current password' });
export type ChangePasswordInput = z.infer<typeof changePasswordSchema>;

export function changePassword({ currentPassword, newPassword }: ChangePasswordInput): Promise<void> {
  return api.post<void>('/api/auth/password', { currentPassword, newPassword });
}

export function useChangePassword() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: changePassword,
    // the password is now the person's own, so a temporary one no longer holds them back
    onSuccess: () => queryClient.setQueryData<SignedInUser | null>(authKeys.me(), (u) => (u ? { ...u, mustChangePassword: false } : u)),
  });
}
