import { oneOf, positiveInt, useListSearchParams } from '@/lib/use-list-search-params';
import { ROUGHNESS_CLASSES } from '@/lib/roughness';
import { ROUGHNESS_SOURCES, SEGMENT_SORTS } from '../api/get-segments';

function readFilters(search: URLSearchParams) {
  return {
    routeId: positiveInt(search.get('routeId')),
    isoClass: oneOf(search.get('isoClass'), ROUGHNESS_CLASSES),
    source: oneOf(search.get('source'), ROUGHNESS_SOURCES),
  };
}

/** The segments table's paging, sort and filters, kept in the address bar. */
export function useSegmentListParams() {
  return useListSearchParams({ sorts: SEGMENT_SORTS, defaultSort: 'routeName', readFilters });
}
