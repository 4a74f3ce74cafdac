import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { queryRoots } from '@/lib/query-keys';

export interface NotificationPrefs {
  inspectionDigest: boolean;
  rideReports: boolean;
  assignments: boolean;
}

export const notificationKeys = { prefs: () => [...queryRoots.account, 'notifications'] as const };

export const notificationPrefsQueryOptions = () =>
  queryOptions({
    queryKey: notificationKeys.prefs(),
    queryFn: ({ signal }) => api.get<{ preferences: NotificationPrefs }>('/api/account/notifications', { signal }).then((b) => b.preferences),
  });

export function useNotificationPrefs() {
  return useQuery(notificationPrefsQueryOptions());
}

export const notificationPatchSchema = z
  .object({ inspectionDigest: z.boolean().optional(), rideReports: z.boolean().optional(), assignments: z.boolean().optional() })
  .refine((p) => Object.keys(p).length > 0, 'Change at least one setting.');

export function useUpdateNotificationPrefs() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (patch: z.infer<typeof notificationPatchSchema>) =>
      api.patch<{ preferences: NotificationPrefs }>('/api/account/notifications', notificationPatchSchema.parse(patch)).then((b) => b.preferences),
    onSuccess: (prefs) => queryClient.setQueryData(notificationKeys.prefs(), prefs),
  });
}
