import 'leaflet/dist/leaflet.css';
import { useEffect, useMemo } from 'react';
import { CircleMarker, MapContainer, Tooltip, useMap } from 'react-leaflet';
import { Link } from 'react-router';
import { BaseLayer } from '@/components/map/base-layer';
import { RouteNames, routeLabels, ScaleBar } from '@/components/map/map-context';
import { SegmentLayer, useSharedCanvas, type SegmentLines } from '@/components/map/segment-layer';
import { RoughnessLegend } from '@/components/ui/roughness';
import { StatusBadge, StatusShape } from '@/components/ui/status-badge';
import type { DueInspection } from '../api/get-due-inspections';
import { inspectionLabels, inspectionTones } from './due-inspections';

const toneColour: Record<string, string> = { overdue: '#B3261E', due: '#D9622B', scheduled: '#B7791F' };
const URGENCY = ['overdue', 'due', 'scheduled'] as const;

/** The roads the page hands in: every route's name and the segments as parallel arrays. */
export interface DueMapRoads {
  routes: { id: number; name: string }[];
  segments: SegmentLines & { routeId: number[] };
}

interface DepotGroup {
  depotId: number;
  depotName: string;
  lat: number;
  lon: number;
  items: DueInspection[];
  worst: (typeof URGENCY)[number];
  counts: Record<(typeof URGENCY)[number], number>;
}

function groupByDepot(items: DueInspection[]): DepotGroup[] {
  const byDepot = new Map<number, DepotGroup>();
  for (const i of items) {
    const g = byDepot.get(i.depotId) ?? { depotId: i.depotId, depotName: i.depotName, lat: i.depotLat, lon: i.depotLon, items: [], worst: 'scheduled', counts: { overdue: 0, due: 0, scheduled: 0 } };
    g.items.push(i);
    if (i.status === 'overdue' || i.status === 'due' || i.status === 'scheduled') g.counts[i.status]++;
    byDepot.set(i.depotId, g);
  }
  for (const g of byDepot.values()) g.worst = URGENCY.find((s) => g.counts[s] > 0) ?? 'scheduled';
  return [...byDepot.values()];
}

/** Keeps the depots and routes in view as they arrive (the roads come after the due list). */
function FitTo({ bounds }: { bounds: [[number, number], [number, number]] }) {
  const map = useMap();
  const key = bounds.flat().join();
  useEffect(() => {
    map.invalidateSize();
    map.fitBounds(bounds, { padding: [12, 12] });
    // eslint-disable-next-line react-hooks/exhaustive-deps -- the key stands for the bounds' values
  }, [map, key]);
  return null;
}

const countsText = (g: DepotGroup) => URGENCY.filter((s) => g.counts[s] > 0).map((s) => `${g.counts[s]} ${inspectionLabels[s].toLowerCase()}`).join(' · ');

/**
 * Where the vehicles with open inspections are based and which roads they drive: one marker per
 * depot, sized by how many vehicles and coloured by the most urgent status, with the counts in
 * words beside it; the routes those vehicles drove in the last 90 days in their roughness colours
 * (the roads behind the wear); each depot's vehicles listed beside the map with their routes.
 */
export function DueMap({ items, roads, vehiclePath }: { items: DueInspection[]; roads: DueMapRoads | undefined; vehiclePath: (id: number) => string }) {
  const canvas = useSharedCanvas();
  const depots = useMemo(() => groupByDepot(items), [items]);
  const routeIds = useMemo(() => new Set(items.flatMap((i) => i.routeIds)), [items]);
  const routeName = useMemo(() => new Map((roads?.routes ?? []).map((r) => [r.id, r.name])), [roads]);
  const lines = useMemo<SegmentLines | null>(() => {
    if (!roads) return null;
    const keep = roads.segments.routeId.map((r) => routeIds.has(r));
    return {
      id: roads.segments.id.filter((_, i) => keep[i]),
      isoClass: roads.segments.isoClass.filter((_, i) => keep[i]),
      coords: roads.segments.coords.filter((_, i) => keep[i]),
    };
  }, [roads, routeIds]);
  const labels = useMemo(
    () => (roads ? routeLabels(roads.routes.filter((r) => routeIds.has(r.id)), roads.segments) : []),
    [roads, routeIds],
  );

  if (!depots.length) return <p className="text-sm text-slate">No open inspections to show on the map.</p>;
  const points: [number, number][] = depots.map((d) => [d.lat, d.lon]);
  for (const line of lines?.coords ?? []) for (const [lon, lat] of line) points.push([lat, lon]);
  const lats = points.map((p) => p[0]);
  const lons = points.map((p) => p[1]);
  const bounds: [[number, number], [number, number]] = [
    [Math.min(...lats) - 0.02, Math.min(...lons) - 0.03],
    [Math.max(...lats) + 0.02, Math.max(...lons) + 0.03],
  ];
  return (
    <div className="grid gap-4 lg:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
      <div className="min-w-0">
        <div className="h-[30rem] overflow-hidden rounded-md border border-line" role="region" aria-label="Map of depots with vehicles due for inspection and the routes they drive" data-testid="due-map">
          <MapContainer renderer={canvas} bounds={bounds} scrollWheelZoom={false} className="h-full w-full">
            <BaseLayer />
            <FitTo bounds={bounds} />
            <ScaleBar />
            {lines ? <SegmentLayer data={lines} weight={4} /> : null}
            <RouteNames labels={labels} />
            {depots.map((g) => (
              <CircleMarker
                key={g.depotId}
                center={[g.lat, g.lon]}
                radius={9 + Math.sqrt(g.items.length) * 3}
                pathOptions={{ color: '#1E2A32', weight: 2, fillColor: toneColour[g.worst], fillOpacity: 0.9 }}
              >
                <Tooltip permanent direction="right" offset={[14, 0]} className="map-depot-label">
                  {g.depotName}: {g.items.length} {g.items.length === 1 ? 'vehicle' : 'vehicles'} ({countsText(g)})
                </Tooltip>
              </CircleMarker>
            ))}
          </MapContainer>
        </div>
        <p className="mt-2 text-sm text-slate">
          One marker per depot; it grows with the number of vehicles with an open inspection, and its colour is the most urgent status there (red: overdue,
          orange: due, amber: scheduled), also written beside it. The lines are the routes these vehicles drove in the last 90 days.
        </p>
        {lines ? <RoughnessLegend className="mt-2" /> : null}
      </div>
      <ul className="space-y-4" aria-label="Vehicles due, by depot">
        {depots.map((g) => (
          <li key={g.depotId} className="rounded-md border border-line bg-surface p-3">
            <p className="flex items-center gap-2 font-semibold text-ink">
              <StatusShape tone={inspectionTones[g.worst]} />
              {g.depotName}
            </p>
            <p className="text-sm text-slate">
              {g.items.length} {g.items.length === 1 ? 'vehicle' : 'vehicles'}: {countsText(g)}
            </p>
            <ul className="mt-2 divide-y divide-line text-sm">
              {g.items.slice(0, 30).map((i) => (
                <li key={i.id} className="flex flex-wrap items-baseline gap-x-2 py-1.5">
                  <Link className="link font-medium" to={vehiclePath(i.vehicleId)}>
                    {i.fleetNumber}
                  </Link>
                  <StatusBadge tone={inspectionTones[i.status] ?? 'neutral'} size="sm">
                    {inspectionLabels[i.status] ?? i.status}
                  </StatusBadge>
                  <span className="text-slate">{i.routeIds.length ? i.routeIds.map((r) => routeName.get(r) ?? `route ${r}`).join(', ') : 'no trips in the last 90 days'}</span>
                </li>
              ))}
            </ul>
            {g.items.length > 30 ? <p className="mt-1 text-sm text-slate">and {g.items.length - 30} more in the list view.</p> : null}
          </li>
        ))}
      </ul>
    </div>
  );
}
