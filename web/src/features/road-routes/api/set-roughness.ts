import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { invalidateRoots, staleAfter } from '@/lib/query-keys';

export function useSetRoughness(routeId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (b: { seqFrom: number; seqTo: number; isoClass?: string | null; iri?: number | null; observedOn: string; note?: string }) => api.post<{ updated: number }>(`/api/routes/${routeId}/roughness`, b),
    onSuccess: () => {
      void invalidateRoots(qc, staleAfter.roadData);
    },
  });
}
