import 'leaflet/dist/leaflet.css';
import { CircleMarker, MapContainer, Tooltip } from 'react-leaflet';
import { Link } from 'react-router';
import type { ReactNode } from 'react';
import type { DueInspection } from '../api/get-due-inspections';

const toneColour: Record<string, string> = { overdue: '#B3261E', due: '#D9622B', scheduled: '#B7791F' };

interface DepotGroup {
  depotId: number;
  depotName: string;
  lat: number;
  lon: number;
  items: DueInspection[];
}

/**
 * Where the vehicles with open inspections are based: one marker per depot, sized by how many
 * vehicles, coloured by the most urgent status (and listed in words beside the map). The base
 * layer is passed in by the page (the app's map configuration).
 */
export function DueMap({ items, baseLayer, vehiclePath }: { items: DueInspection[]; baseLayer: ReactNode; vehiclePath: (id: number) => string }) {
  const byDepot = new Map<number, DepotGroup>();
  for (const i of items) {
    const g = byDepot.get(i.depotId) ?? { depotId: i.depotId, depotName: i.depotName, lat: i.depotLat, lon: i.depotLon, items: [] };
    g.items.push(i);
    byDepot.set(i.depotId, g);
  }
  const depots = [...byDepot.values()];
  if (!depots.length) return <p className="text-sm text-slate">No open inspections to show on the map.</p>;
  const lats = depots.map((d) => d.lat);
  const lons = depots.map((d) => d.lon);
  const bounds: [[number, number], [number, number]] = [
    [Math.min(...lats) - 0.08, Math.min(...lons) - 0.12],
    [Math.max(...lats) + 0.08, Math.max(...lons) + 0.12],
  ];
  const worst = (g: DepotGroup) => (g.items.some((i) => i.status === 'overdue') ? 'overdue' : g.items.some((i) => i.status === 'due') ? 'due' : 'scheduled');
  return (
    <div className="grid gap-4 lg:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
      <div className="h-[26rem] overflow-hidden rounded-md border border-line" role="region" aria-label="Map of depots with vehicles due for inspection">
        <MapContainer bounds={bounds} scrollWheelZoom={false} className="h-full w-full">
          {baseLayer}
          {depots.map((g) => (
            <CircleMarker
              key={g.depotId}
              center={[g.lat, g.lon]}
              radius={10 + Math.sqrt(g.items.length) * 4}
              pathOptions={{ color: '#1E2A32', weight: 2, fillColor: toneColour[worst(g)], fillOpacity: 0.85 }}
            >
              <Tooltip permanent direction="right" offset={[14, 0]}>
                {g.depotName}: {g.items.length} open
              </Tooltip>
            </CircleMarker>
          ))}
        </MapContainer>
      </div>
      <ul className="space-y-4">
        <li className="text-sm text-slate">
          One marker per depot where the vehicles are based; its size grows with the number of open inspections and its colour is the most urgent
          status there (red: overdue, orange: due, amber: scheduled), also written out below.
        </li>
        {depots.map((g) => (
          <li key={g.depotId} className="rounded-md border border-line bg-surface p-3">
            <p className="font-semibold text-ink">{g.depotName}</p>
            <p className="text-sm text-slate">
              {g.items.filter((i) => i.status === 'overdue').length} overdue · {g.items.filter((i) => i.status === 'due').length} due ·{' '}
              {g.items.filter((i) => i.status === 'scheduled').length} scheduled
            </p>
            <ul className="mt-2 flex flex-wrap gap-x-3 gap-y-1 text-sm">
              {g.items.slice(0, 30).map((i) => (
                <li key={i.id}>
                  <Link className="link" to={vehiclePath(i.vehicleId)}>
                    {i.fleetNumber}
                  </Link>
                </li>
              ))}
            </ul>
          </li>
        ))}
      </ul>
    </div>
  );
}
