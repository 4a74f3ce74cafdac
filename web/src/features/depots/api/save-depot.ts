import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { Depot } from './get-depots';
import { depotKeys } from './depot-keys';
import { queryRoots } from '@/lib/query-keys';

export interface DepotInput {
  name: string;
  address: string | null;
  lat: number;
  lon: number;
}

export function createDepot(body: DepotInput) {
  return api.post<{ depot: Depot }>('/api/depots', body);
}

export function updateDepot(id: number, patch: Partial<DepotInput>) {
  return api.patch<{ depot: Depot }>(`/api/depots/${id}`, patch);
}

/** Adds a depot (`id` undefined) or changes one; the depot list and the map refresh. */
export function useSaveDepot(id: number | undefined) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: DepotInput) => (id === undefined ? createDepot(body) : updateDepot(id, body)),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: depotKeys.all });
      void queryClient.invalidateQueries({ queryKey: queryRoots.map });
    },
  });
}
