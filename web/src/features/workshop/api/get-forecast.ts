import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { workshopKeys } from './types';

export interface Forecast {
  from: string;
  to: string;
  days: number;
  rows: { specId: number; specName: string; depotId: number; depotName: string; replacements: number; cost: number; costKnown: boolean }[];
  totals: { replacements: number; cost: number };
  costBasis: { specId: number; specName: string; cost: number; basis: string }[];
  /** Dampers likely to need replacing within the horizon, most likely first; `chance` in 0–1, `date` the median end-of-life date. */
  items: { vehicleId: number; fleetNumber: string; position: string; damperId: number; date: string | null; chance: number; basis: string; specName: string; depotName: string; cost: number | null }[];
  /** How the expected count is made, in words. */
  method: string;
}

export const forecastQueryOptions = (days = 90) =>
  queryOptions({ queryKey: workshopKeys.forecast(days), queryFn: ({ signal }) => api.get<Forecast>('/api/forecast', { query: { days }, signal }) });

export const useForecast = (days = 90) => useQuery(forecastQueryOptions(days));
