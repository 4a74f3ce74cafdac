import 'leaflet/dist/leaflet.css';
import './map.css';
import { useEffect } from 'react';
import L from 'leaflet';
import { ScaleControl, useMap } from 'react-leaflet';

/** A metric scale bar in the map's lower left corner. */
export function ScaleBar() {
  return <ScaleControl position="bottomleft" metric imperial={false} />;
}

export interface RouteLabel {
  id: number;
  name: string;
  /** Where the name goes [lon, lat]: a point on the route. */
  at: [number, number];
}

/**
 * Places each route's name at a point along it (the middle of its middle segment). The names are
 * plain text with a paper halo that clicks pass through, so they never stand in the way of the
 * roads under them. With many routes they appear only when zoomed in, so they do not pile up.
 */
export function RouteNames({ labels, minZoom = labels.length > 30 ? 13 : 0 }: { labels: RouteLabel[]; minZoom?: number }) {
  const map = useMap();
  useEffect(() => {
    const group = L.layerGroup(
      labels.map((r) =>
        L.marker([r.at[1], r.at[0]], {
          interactive: false,
          keyboard: false,
          icon: L.divIcon({ className: 'map-route-label', html: `<span>${escapeHtml(r.name)}</span>`, iconSize: undefined }),
        }),
      ),
    );
    const sync = () => {
      if (map.getZoom() >= minZoom) group.addTo(map);
      else group.remove();
    };
    sync();
    map.on('zoomend', sync);
    return () => {
      map.off('zoomend', sync);
      group.remove();
    };
  }, [map, labels, minZoom]);
  return null;
}

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

/** One label per route, at the middle of its middle segment, from segments given as parallel arrays. */
export function routeLabels(routes: { id: number; name: string }[], segments: { routeId: number[]; coords: [number, number][][] }): RouteLabel[] {
  const byRoute = new Map<number, number[]>();
  segments.routeId.forEach((id, i) => {
    const list = byRoute.get(id);
    if (list) list.push(i);
    else byRoute.set(id, [i]);
  });
  const out: RouteLabel[] = [];
  for (const r of routes) {
    const idx = byRoute.get(r.id);
    if (!idx?.length) continue;
    const line = segments.coords[idx[Math.floor(idx.length / 2)]];
    if (!line?.length) continue;
    out.push({ id: r.id, name: r.name, at: line[Math.floor(line.length / 2)] });
  }
  return out;
}
