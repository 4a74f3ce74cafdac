import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { workshopKeys } from './types';

export function useAssignInspection() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...body }: { id: number; assigneeId?: number | null; depotId?: number | null }) => api.patch(`/api/inspections/${id}`, body),
    onSuccess: () => void qc.invalidateQueries({ queryKey: workshopKeys.all }),
  });
}
