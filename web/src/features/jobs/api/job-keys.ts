import { queryRoots } from '@/lib/query-keys';

export const jobKeys = {
  all: queryRoots.jobs,
  runs: (page: number) => [...jobKeys.all, 'runs', { page }] as const,
  run: (id: number) => [...jobKeys.all, 'run', id] as const,
};
