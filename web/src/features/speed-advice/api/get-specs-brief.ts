import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, type ListResponse } from '@/lib/api-client';
import { queryRoots } from '@/lib/query-keys';

/** Suspension specs to choose from (managers and mechanics may list them; drivers get their own vehicle's). */
export const specChoicesQueryOptions = () =>
  queryOptions({ queryKey: [...queryRoots.speedAdvice, 'specs'], queryFn: ({ signal }) => api.get<ListResponse<{ id: number; name: string }>>('/api/specs', { query: { pageSize: 100 }, signal }), staleTime: 5 * 60_000 });

export function useSpecChoices(enabled: boolean) {
  return useQuery({ ...specChoicesQueryOptions(), enabled });
}
