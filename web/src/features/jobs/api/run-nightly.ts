import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { jobKeys } from './job-keys';

export const runNightlySchema = z.object({ asOf: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'must be a date like 2026-11-30').optional() }).strict();
export type RunNightlyInput = z.infer<typeof runNightlySchema>;

export function runNightly(input: RunNightlyInput = {}) {
  return api.post<{ runId: number }>('/api/jobs/nightly/run', runNightlySchema.parse(input));
}

export function useRunNightly() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: runNightly,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: jobKeys.all }),
  });
}
