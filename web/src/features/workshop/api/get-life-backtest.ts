import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { workshopKeys } from './types';

/** One removal for wear: what the model, trained only on the data before it, predicted. */
export interface BacktestPoint {
  damperId: number;
  vehicleId: number;
  removedAt: string;
  actualKm: number;
  predictedMedianKm: number;
  p10Km: number;
  p90Km: number;
  inside: boolean;
  /** |predicted median − actual| / actual [%]. */
  errorPct: number;
  /** Removals for wear the model had learned from before this one. */
  trainedOn: number;
}

/** GET /api/life-backtest. `mdape` is in per cent, `insideShare` a fraction 0–1. */
export interface LifeBacktest {
  specId: number;
  specName: string;
  points: BacktestPoint[];
  mdape: number | null;
  insideShare: number | null;
  prior: { mdape: number | null; insideShare: number | null };
  method: string;
}

export const lifeBacktestQueryOptions = (specId: number) =>
  queryOptions({ queryKey: workshopKeys.lifeBacktest(specId), queryFn: ({ signal }) => api.get<LifeBacktest>('/api/life-backtest', { query: { specId }, signal }), enabled: specId > 0 });

export const useLifeBacktest = (specId: number) => useQuery(lifeBacktestQueryOptions(specId));
