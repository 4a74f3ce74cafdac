import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api, type ListResponse } from '@/lib/api-client';
import type { JobRunView } from '@contracts/jobs';
import { jobKeys } from './job-keys';

/** A run as the server answers it (server/contracts/jobs.ts). */
export type JobRun = JobRunView;
export type { JobRunStatus } from '@contracts/jobs';

export const jobRunsQueryOptions = (page: number, pageSize = 25) =>
  queryOptions({
    queryKey: jobKeys.runs(page),
    queryFn: ({ signal }) => api.get<ListResponse<JobRun>>('/api/jobs/runs', { query: { page, pageSize }, signal }),
    placeholderData: keepPreviousData,
  });

/** The run history; polls while a run is in progress. */
export function useJobRuns(page: number) {
  return useQuery({
    ...jobRunsQueryOptions(page),
    refetchInterval: (q) => (q.state.data?.items.some((r) => r.status === 'running') ? 1500 : false),
  });
}
