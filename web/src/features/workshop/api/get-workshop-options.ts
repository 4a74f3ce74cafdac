import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { workshopKeys, type WorkshopOptions } from './types';

export const workshopOptionsQueryOptions = () =>
  queryOptions({ queryKey: workshopKeys.options(), queryFn: ({ signal }) => api.get<WorkshopOptions>('/api/workshop/options', { signal }), staleTime: Infinity });

export const useWorkshopOptions = () => useQuery(workshopOptionsQueryOptions());
