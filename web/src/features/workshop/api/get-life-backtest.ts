import { queryOptions, useQuery } from '@tanstack/react-query';
import type { LifeBacktest } from '@contracts/workshop';
import { api } from '@/lib/api-client';
import { workshopKeys } from './types';

export type { BacktestPoint, LifeBacktest } from '@contracts/workshop';

export const lifeBacktestQueryOptions = (specId: number) =>
  queryOptions({ queryKey: workshopKeys.lifeBacktest(specId), queryFn: ({ signal }) => api.get<LifeBacktest>('/api/life-backtest', { query: { specId }, signal }), enabled: specId > 0 });

export const useLifeBacktest = (specId: number) => useQuery(lifeBacktestQueryOptions(specId));
