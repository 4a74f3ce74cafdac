import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { queryRoots } from '@/lib/query-keys';

export interface RouteSegment {
  id: number;
  seq: number;
  startM: number;
  endM: number;
  coords: [number, number][];
  speedKmh: number | null;
  iri: number | null;
  gdN0: number | null;
  isoClass: string | null;
  roughnessSource: string | null;
  roughnessDate: string | null;
  surveyId: number | null;
}

export interface RouteDetail {
  route: { id: number; name: string; description: string | null; depotId: number | null; lengthM: number; defaultSpeedKmh: number; segmentLengthM: number; coordinates: [number, number][] };
  segments: RouteSegment[];
  surveys: { id: number; originalName: string; dxM: number; startM: number; endM: number; pointCount: number; surveyedOn: string; uploadedAt: string; uploadedByName: string | null; note: string | null }[];
  trips: { count: number; recent: { id: number; vehicleId: number; fleetNumber: string; driverName: string | null; startedAt: string; distanceKm: number; meanSpeedKmh: number }[] };
  currentRule: string;
}

export const routeDetailKey = (id: number) => [...queryRoots.routes, 'detail', id] as const;

export const routeQueryOptions = (id: number) => queryOptions({ queryKey: routeDetailKey(id), queryFn: ({ signal }) => api.get<RouteDetail>(`/api/routes/${id}`, { signal }) });

export function useRoute(id: number) {
  return useQuery(routeQueryOptions(id));
}
