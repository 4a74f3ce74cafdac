import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { invalidateRoots, staleAfter } from '@/lib/query-keys';

export interface SpeedEdit {
  seq: number;
  /** km/h; null goes back to the route's typical speed. */
  speedKmh: number | null;
}

export function setSpeeds(routeId: number, segments: SpeedEdit[]) {
  return api.put<{ updated: number }>(`/api/routes/${routeId}/speeds`, { segments });
}

/** Saves speeds for several segments at once: all are saved or none. */
export function useSetSpeeds(routeId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (segments: SpeedEdit[]) => setSpeeds(routeId, segments),
    onSuccess: () => {
      void invalidateRoots(qc, staleAfter.roadData);
    },
  });
}
