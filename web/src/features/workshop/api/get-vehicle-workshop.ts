import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { workshopKeys, type CornerState, type WorkRecord } from './types';

export interface VehicleWorkshop {
  vehicleId: number;
  corners: CornerState[];
  /** The spec's life model the corners' life used is measured against. */
  life: { specId: number; source: 'prior' | 'fleet'; failures: number; classStepFactor: number; shape: number; text: string };
  comparisons: { inspectionId: number; position: string; adhesionPct: number | null; predictedNsPerM: number | null; measuredNsPerM: number | null; nominalNsPerM: number; note: string | null; verdict: string; at: string | null; basis: string | null; plateAmplitudeMm: number; phaseDeg: number | null; estimateMethod: 'adhesion' | 'phase' | null }[];
  workRecords: WorkRecord[];
}

export const vehicleWorkshopQueryOptions = (id: number) =>
  queryOptions({ queryKey: workshopKeys.vehicle(id), queryFn: ({ signal }) => api.get<VehicleWorkshop>(`/api/vehicles/${id}/workshop`, { signal }) });

export const useVehicleWorkshop = (id: number) => useQuery(vehicleWorkshopQueryOptions(id));
