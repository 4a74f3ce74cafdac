import { wholeList } from '@/lib/list-query';
import { depotKeys } from './depot-keys';

export interface Depot {
  id: number;
  name: string;
  address?: string | null;
  lat: number;
  lon: number;
  vehicleCount: number;
}

/** Every depot; a fleet has few, so one page of the largest size holds them all. */
const depots = wholeList<Depot>('/api/depots', depotKeys.list(), 10 * 60 * 1000);
export const getDepots = depots.get;
export const depotsQueryOptions = depots.options;
export const useDepots = depots.useList;
