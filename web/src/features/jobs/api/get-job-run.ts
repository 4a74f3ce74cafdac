import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { JobRun } from './get-job-runs';
import { jobKeys } from './job-keys';

export const jobRunQueryOptions = (id: number) =>
  queryOptions({
    queryKey: jobKeys.run(id),
    queryFn: ({ signal }) => api.get<{ run: JobRun }>(`/api/jobs/runs/${id}`, { signal }).then((b) => b.run),
  });

/** One run, polled every second until it ends (progress can be left and come back to). */
export function useJobRun(id: number | null) {
  return useQuery({
    ...jobRunQueryOptions(id ?? 0),
    enabled: id !== null,
    refetchInterval: (q) => (q.state.data && q.state.data.status !== 'running' ? false : 1000),
  });
}
