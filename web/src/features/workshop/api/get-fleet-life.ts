import { queryOptions, useQuery } from '@tanstack/react-query';
import type { WeibullFit } from '@contracts/workshop';
import { api } from '@/lib/api-client';
import { workshopKeys } from './types';

/** The spec's life model: ln(life / rated km) = beta0 − roadSensitivity·ln(severity) + Weibull scatter of `shape`. */
export interface LifeModelView {
  beta0: number;
  roadSensitivity: number;
  shape: number;
  /** How many times shorter the life is one ISO 8608 class step rougher. */
  classStepFactor: number;
  /** 'fleet' = fitted to the removals; 'prior' = the trade's prior alone. */
  source: 'prior' | 'fleet';
  failures: number;
  suspensions: number;
}

export interface LifeTableRow {
  cls: string;
  severity: number;
  medianKm: number;
  p10Km: number;
  p90Km: number;
  priorMedianKm: number;
}

/** GET /api/fleet-life: a spec's fitted life model and what it rests on. */
export interface SpecLife {
  specId: number;
  specName: string;
  model: LifeModelView & { note: string };
  prior: LifeModelView;
  ratedKm: { axleIndex: number; ratedKm: number }[];
  /** Life per ISO class at 80 km/h for the first axle's rated km. */
  lifeTable: LifeTableRow[];
  /** What the removals alone say, in km. */
  /** The fit is a Weibull fit in km (wear removals failed, the rest censored). */
  fleetKm: { fit: WeibullFit | null; reason: string | null; points: { life: number; unreliability: number }[] };
  comparison: { modelMeanKm: number | null; fleetMeanKm: number | null; ratio: number | null; disagrees: boolean; warning: string | null };
  dampers: { total: number; failures: number; suspensions: number; withRecords: number };
  assumptions: string[];
}

export const fleetLifeQueryOptions = (specId: number) =>
  queryOptions({ queryKey: workshopKeys.fleetLife(specId), queryFn: ({ signal }) => api.get<SpecLife>('/api/fleet-life', { query: { specId }, signal }), enabled: specId > 0 });

export const useFleetLife = (specId: number) => useQuery(fleetLifeQueryOptions(specId));
