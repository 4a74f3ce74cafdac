import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { workshopKeys, type WorkRecord } from './types';

export const workRecordQueryOptions = (id: number) =>
  queryOptions({ queryKey: workshopKeys.workRecord(id), queryFn: ({ signal }) => api.get<WorkRecord>(`/api/work-records/${id}`, { signal }) });

export const useWorkRecord = (id: number) => useQuery(workRecordQueryOptions(id));
