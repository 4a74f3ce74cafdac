import 'leaflet/dist/leaflet.css';
import { useCallback, useMemo, useState, type ReactNode } from 'react';
import L from 'leaflet';
import { CircleMarker, MapContainer, TileLayer, Tooltip, useMap } from 'react-leaflet';
import { useEffect } from 'react';
import { Link } from 'react-router';
import { Caution } from '@/components/ui/caution';
import { ErrorState } from '@/components/ui/error-state';
import { LoadingState } from '@/components/ui/loading-state';
import { RoughnessClassBadge, RoughnessLegend } from '@/components/ui/roughness';
import { formatDate, formatNumber } from '@/lib/format';
import { useMapConfig } from '../api/get-map-config';
import { useMapData, type MapData } from '../api/get-map-data';
import { useSegment } from '../api/get-segment';
import { SegmentLayer, useSharedCanvas } from '@/components/map/segment-layer';
import { RouteNames, routeLabels, ScaleBar } from '@/components/map/map-context';

export const SOURCE_WORDS: Record<string, string> = { survey: 'Profile survey (measured)', stated: 'Stated / set by hand', driver_report: 'Estimated from drivers’ reports' };

/** Zooms to one segment (opened from a link such as the segments table's "On the map"). */
function FocusSegment({ data, id }: { data: MapData; id: number | null | undefined }) {
  const map = useMap();
  useEffect(() => {
    if (id == null) return;
    const i = data.segments.id.indexOf(id);
    if (i < 0) return;
    const b = L.latLngBounds(data.segments.coords[i].map(([lon, lat]) => [lat, lon] as [number, number]));
    if (b.isValid()) map.fitBounds(b, { padding: [60, 60], maxZoom: 16 });
  }, [map, data, id]);
  return null;
}

function FitFleet({ data }: { data: MapData }) {
  const map = useMap();
  useEffect(() => {
    const b = L.latLngBounds([]);
    for (const line of data.segments.coords) for (const [lon, lat] of line) b.extend([lat, lon]);
    for (const d of data.depots) b.extend([d.lat, d.lon]);
    if (b.isValid()) map.fitBounds(b, { padding: [20, 20] });
  }, [map, data]);
  return null;
}

/** The fleet's roads coloured by roughness class, with depots; click a segment for its details. */
export function FleetMap({ initialSegment, routePath, reportLayer, segmentExtra }: { /** A segment to open the map on. */ initialSegment?: number | null; routePath: (id: number) => string; reportLayer?: ReactNode; /** More about the selected segment (speed advice). */ segmentExtra?: (id: number) => ReactNode }) {
  const config = useMapConfig();
  const data = useMapData();
  const [selected, setSelected] = useState<number | null>(initialSegment ?? null);
  const [show, setShow] = useState({ segments: true, depots: true, reports: true });
  const onSelect = useCallback((id: number) => setSelected(id), []);
  const segments = useMemo(() => data.data?.segments, [data.data]);
  const labels = useMemo(() => (data.data ? routeLabels(data.data.routes, data.data.segments) : []), [data.data]);
  const canvas = useSharedCanvas();

  if (config.isPending || data.isPending) return <LoadingState label="Loading the map…" />;
  if (config.error || data.error) return <ErrorState error={config.error ?? data.error} what="the map" onRetry={() => void data.refetch()} />;

  return (
    <div className="grid gap-4 lg:grid-cols-[1fr_20rem]">
      <div className="min-w-0">
        <div className="h-[34rem] overflow-hidden rounded-md border border-line" data-testid="fleet-map">
          <MapContainer renderer={canvas} center={[52.56, -1.4]} zoom={10} className="h-full w-full" attributionControl>
            <TileLayer url={config.data.tileUrl} attribution={config.data.attribution} />
            <ScaleBar />
            {show.segments ? <RouteNames labels={labels} /> : null}
            <FitFleet data={data.data} />
            <FocusSegment data={data.data} id={initialSegment} />
            {show.segments && segments ? <SegmentLayer data={segments} onSelect={onSelect} selectedId={selected} /> : null}
            {show.depots
              ? data.data.depots.map((d) => (
                  <CircleMarker key={d.id} center={[d.lat, d.lon]} radius={8} pathOptions={{ color: '#1E2A32', weight: 3, fillColor: '#FFFFFF', fillOpacity: 1 }}>
                    <Tooltip direction="right" offset={[10, 0]} permanent className="map-depot-label">
                      Depot: {d.name}
                    </Tooltip>
                  </CircleMarker>
                ))
              : null}
            {show.reports ? reportLayer : null}
          </MapContainer>
        </div>
        <RoughnessLegend className="mt-3" />
      </div>
      <aside className="flex flex-col gap-4">
        <fieldset className="rounded-md border border-line bg-surface p-3">
          <legend className="px-1 text-sm font-medium text-ink">Layers</legend>
          {(
            [
              ['segments', `Road segments (${formatNumber(data.data.segments.id.length)})`],
              ['depots', `Depots (${data.data.depots.length})`],
              ['reports', 'Drivers’ ride reports'],
            ] as const
          ).map(([key, label]) => (
            <label key={key} className="flex items-center gap-2 py-1 text-sm">
              <input type="checkbox" checked={show[key]} onChange={(e) => setShow((s) => ({ ...s, [key]: e.target.checked }))} />
              {label}
              {key === 'reports' && !reportLayer ? <span className="text-slate">(none yet)</span> : null}
            </label>
          ))}
        </fieldset>
        <SegmentPanel id={selected} routePath={routePath} />
        {selected !== null && segmentExtra ? segmentExtra(selected) : null}
        {config.data.offline ? <p className="text-xs text-slate">Base layer: a plain offline grid with our depots and route names. Set MAP_TILE_URL to use a street map.</p> : null}
      </aside>
    </div>
  );
}

export function SegmentPanel({ id, routePath }: { id: number | null; routePath?: (id: number) => string }) {
  const seg = useSegment(id);
  if (id === null) return <p className="rounded-md border border-dashed border-line p-3 text-sm text-slate">Click a road segment to see its roughness, where it comes from, and the speed used for it.</p>;
  if (seg.isPending) return <LoadingState label="Loading the segment…" />;
  if (seg.error) return <ErrorState error={seg.error} what="the segment" />;
  const s = seg.data.segment;
  return (
    <section aria-label="Selected segment" className="rounded-md border border-line bg-surface p-3 text-sm" data-testid="segment-panel">
      <h2 className="font-semibold text-ink">
        {routePath ? <Link className="link" to={routePath(s.routeId)}>{s.routeName}</Link> : s.routeName}
      </h2>
      <p className="text-slate">
        Segment {s.seq + 1}, {formatNumber(s.startM / 1000, 2)}–{formatNumber(s.endM / 1000, 2)} km
      </p>
      <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1">
        <dt className="text-slate">Class</dt>
        <dd><RoughnessClassBadge value={s.isoClass} /></dd>
        <dt className="text-slate">IRI</dt>
        <dd className="tabular-nums">{s.iri !== null ? `${formatNumber(s.iri, 2)} m/km` : 'not measured'}</dd>
        <dt className="text-slate">Gd(n0)</dt>
        <dd className="tabular-nums">{s.gdN0 !== null ? `${formatNumber(s.gdN0 * 1e6, 0)} × 10⁻⁶ m³` : '—'}</dd>
        <dt className="text-slate">Source</dt>
        <dd>{s.roughnessSource ? SOURCE_WORDS[s.roughnessSource] : 'none yet'}</dd>
        <dt className="text-slate">Date</dt>
        <dd>{formatDate(s.roughnessDate)}</dd>
        <dt className="text-slate">Speed</dt>
        <dd className="tabular-nums">
          {formatNumber(s.speedKmh ?? s.defaultSpeedKmh, 0)} km/h {s.speedKmh === null ? <span className="text-slate">(route default)</span> : null}
        </dd>
      </dl>
      <Caution className="mt-3" title="Speed">Typical speeds feed the wear model; they are not advice. Drive to the road, the load and local limits.</Caution>
    </section>
  );
}
