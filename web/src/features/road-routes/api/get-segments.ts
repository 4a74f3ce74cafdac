import type { ListParams } from '@/lib/api-client';
import { pagedList } from '@/lib/list-query';
import type { RoughnessClass } from '@/lib/roughness';
import { queryRoots } from '@/lib/query-keys';

export const SEGMENT_SORTS = ['routeName', 'seq', 'iri', 'isoClass', 'roughnessDate', 'speedKmh'] as const;
export { ROUGHNESS_SOURCES, type RoughnessSource } from '@contracts/roads';
import type { RoughnessSource, SegmentOnRoute } from '@contracts/roads';

export interface SegmentListItem extends SegmentOnRoute {
  /** The segment's own speed, or the route's default when none is set [km/h]. */
  speedKmh: number | null;
  /** Whether the segment has a speed of its own. */
  speedSet: boolean;
}

export interface SegmentListParams extends ListParams {
  routeId?: number;
  isoClass?: RoughnessClass;
  source?: RoughnessSource;
}

const segments = pagedList<SegmentListParams, SegmentListItem>('/api/segments', (params) => [...queryRoots.segments, 'list', params] as const);
export const getSegments = segments.get;
export const segmentsQueryOptions = segments.options;
export const useSegments = segments.useList;
