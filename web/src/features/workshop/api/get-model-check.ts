import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { workshopKeys } from './types';

export interface ModelCheck {
  points: { inspectionId: number; vehicleId: number; fleetNumber: string; position: string; predictedNsPerM: number; measuredNsPerM: number; nominalNsPerM: number; basis: string | null; date: string | null }[];
  n: number;
  biasNsPerM: number | null;
  spreadNsPerM: number | null;
  biasPctOfNominal: number | null;
  noEstimate: number;
  definitions: string;
}

export const modelCheckQueryOptions = () => queryOptions({ queryKey: workshopKeys.modelCheck(), queryFn: ({ signal }) => api.get<ModelCheck>('/api/model-check', { signal }) });

export const useModelCheck = () => useQuery(modelCheckQueryOptions());
