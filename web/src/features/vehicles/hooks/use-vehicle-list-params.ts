import { oneOf, positiveInt, useListSearchParams } from '@/lib/use-list-search-params';
import { VEHICLE_SORTS, VEHICLE_STATUSES } from '../api/get-vehicles';

function readFilters(search: URLSearchParams) {
  return {
    q: search.get('q')?.trim() || undefined,
    depotId: positiveInt(search.get('depotId')),
    specId: positiveInt(search.get('specId')),
    status: oneOf(search.get('status'), VEHICLE_STATUSES),
  };
}

/** The vehicles table's paging, sort and filters, read from and written to the address bar. */
export function useVehicleListParams() {
  return useListSearchParams({ sorts: VEHICLE_SORTS, defaultSort: 'fleetNumber', readFilters });
}
