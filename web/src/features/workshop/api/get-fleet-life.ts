import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { workshopKeys } from './types';

export interface Fit {
  shape: number;
  scale: number;
  b10: number;
  mean: number;
  failures: number;
  suspensions: number;
  bounds: { level: number; method: string; shape: [number, number]; scale: [number, number]; b10: [number, number] } | null;
}
export interface FitView {
  fit: Fit | null;
  reason: string | null;
  unit: string;
  points: { life: number; unreliability: number }[];
  curve: { life: number; survival: number }[];
  excluded: number;
}
export interface FleetLife {
  specId: number;
  specName: string;
  km: FitView;
  energy: FitView;
  blend: { used: boolean; weight: number; failures: number; minRemovals: number; k: number; fleetMeanKm: number | null; axles: { axleIndex: number; ratedKm: number; usedKm: number }[]; rule: string };
}

export const fleetLifeQueryOptions = (specId: number) =>
  queryOptions({ queryKey: workshopKeys.fleetLife(specId), queryFn: ({ signal }) => api.get<FleetLife>('/api/fleet-life', { query: { specId }, signal }), enabled: specId > 0 });

export const useFleetLife = (specId: number) => useQuery(fleetLifeQueryOptions(specId));
