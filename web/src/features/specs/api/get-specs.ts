import { wholeList } from '@/lib/list-query';
import type { SuspensionSpec } from '@/lib/suspension';
import { specKeys } from './spec-keys';

export interface SpecListItem extends SuspensionSpec {
  vehicleCount: number;
}

/** Every suspension spec; a fleet has a handful of vehicle types, so one page holds them all. */
const specs = wholeList<SpecListItem>('/api/specs', specKeys.list(), 10 * 60 * 1000);
export const getSpecs = specs.get;
export const specsQueryOptions = specs.options;
export const useSpecs = specs.useList;
