import { useMutation, useQueryClient } from '@tanstack/react-query';
import { workBody, type WorkBody } from '@contracts/workshop';
import { api, checked } from '@/lib/api-client';
import type { WorkRecord } from './types';
import { invalidateRoots, staleAfter } from '@/lib/query-keys';

export type WorkInput = WorkBody;

export function useRecordWork() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: WorkInput) => api.post<WorkRecord>('/api/work-records', checked(workBody, body, '/api/work-records')),
    onSuccess: () => void invalidateRoots(qc, staleAfter.workshop),
  });
}
