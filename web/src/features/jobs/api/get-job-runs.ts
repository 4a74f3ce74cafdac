import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api, type ListResponse } from '@/lib/api-client';
import { jobKeys } from './job-keys';

export type JobRunStatus = 'running' | 'succeeded' | 'completed_with_errors' | 'failed' | 'cancelled';

export interface JobRun {
  id: number;
  job: string;
  status: JobRunStatus;
  trigger: 'schedule' | 'cli' | 'manual' | 'test' | 'seed';
  asOf: string;
  requestedBy: { id: number; name: string } | null;
  startedAt: string;
  endedAt: string | null;
  /** Wall-clock duration [s]. */
  durationS: number | null;
  phase: string | null;
  progressDone: number;
  progressTotal: number;
  counts: Record<string, number>;
  errors: { item: string; message: string }[];
  errorCount: number;
  message: string | null;
}

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
