import { useMutation } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '@/lib/api-client';

/** `nearest: true` asks for the nearest route however far it is; `withinReach` then says whether a report could be filed there. */
export const snapSchema = z.object({ lat: z.number().min(-90).max(90), lon: z.number().min(-180).max(180), nearest: z.boolean().optional() });

export interface SnapResult {
  segment: { id: number; routeId: number; routeName: string; seq: number; startM: number; endM: number; isoClass: string | null };
  point: { lat: number; lon: number };
  distanceM: number;
  maxDistanceM: number;
  withinReach: boolean;
}

export const snapPosition = (p: z.infer<typeof snapSchema>) => api.post<SnapResult>('/api/ride-reports/snap', snapSchema.parse(p));

export function useSnapPosition() {
  return useMutation({ mutationFn: snapPosition });
}
