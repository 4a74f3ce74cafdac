import { useState, type ReactNode } from 'react';
import { CircleMarker, MapContainer, Polyline, useMapEvents } from 'react-leaflet';
import { BaseLayer } from '@/components/map/base-layer';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { RoughnessLegend } from '@/components/ui/roughness';
import { isApiError } from '@/lib/api-client';
import { formatNumber } from '@/lib/format';
import { ROUGHNESS_CLASSES } from '@/lib/roughness';
import { useCreateRoute, type CreateRouteBody, type RoutePreview } from '../api/create-route';

type LonLat = [number, number];

/** Great-circle distance [m] (haversine on a sphere of the mean Earth radius, 6 371 008.8 m). */
function distanceM(a: LonLat, b: LonLat): number {
  const R = 6_371_008.8;
  const rad = Math.PI / 180;
  const dLat = (b[1] - a[1]) * rad;
  const dLon = (b[0] - a[0]) * rad;
  const h = Math.sin(dLat / 2) ** 2 + Math.cos(a[1] * rad) * Math.cos(b[1] * rad) * Math.sin(dLon / 2) ** 2;
  return 2 * R * Math.asin(Math.min(1, Math.sqrt(h)));
}

export function lineLengthM(points: LonLat[]): number {
  let sum = 0;
  for (let i = 1; i < points.length; i++) sum += distanceM(points[i - 1], points[i]);
  return sum;
}

function ClickToAdd({ onAdd }: { onAdd: (p: LonLat) => void }) {
  useMapEvents({ click: (e) => onAdd([Math.round(e.latlng.lng * 1e6) / 1e6, Math.round(e.latlng.lat * 1e6) / 1e6]) });
  return null;
}

/**
 * A new route drawn on the map: click to add points in driving order, undo or clear, see the
 * length as it grows, preview how it splits into segments, then save.
 */
export function RouteDraw({ onCreated, backdrop, center }: { onCreated: (id: number) => void; /** Existing roads, drawn under the new line for orientation. */ backdrop?: ReactNode; center: [number, number] }) {
  const [points, setPoints] = useState<LonLat[]>([]);
  const [name, setName] = useState('');
  const [speed, setSpeed] = useState('50');
  const [segLen, setSegLen] = useState('100');
  const [cls, setCls] = useState('');
  const [preview, setPreview] = useState<RoutePreview | null>(null);
  const m = useCreateRoute();
  const f = m.error && isApiError(m.error) ? m.error.fields : {};

  const change = (next: LonLat[]) => {
    setPoints(next);
    setPreview(null);
    m.reset();
  };
  const body = (): CreateRouteBody => ({
    name: name.trim(),
    defaultSpeedKmh: Number(speed.replace(',', '.')),
    segmentLengthM: Number(segLen.replace(',', '.')),
    statedClass: cls || null,
    line: { format: 'coordinates', coordinates: points },
  });
  const lengthM = lineLengthM(points);
  const lineError = f.line ?? Object.entries(f).find(([k]) => k.startsWith('line.'))?.[1];

  return (
    <div className="flex flex-col gap-3">
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <TextField label="Route name" value={name} onChange={(e) => { setName(e.target.value); setPreview(null); }} error={f.name} />
        <TextField label="Typical speed [km/h]" inputMode="decimal" value={speed} onChange={(e) => { setSpeed(e.target.value); setPreview(null); }} error={f.defaultSpeedKmh} />
        <TextField label="Segment length [m]" inputMode="decimal" value={segLen} onChange={(e) => { setSegLen(e.target.value); setPreview(null); }} error={f.segmentLengthM} aside="(default 100 m)" />
        <SelectField label="Stated class" aside="(optional)" value={cls} onChange={(e) => setCls(e.target.value)} options={[{ value: '', label: 'Not known yet' }, ...ROUGHNESS_CLASSES.map((c) => ({ value: c, label: c }))]} />
      </div>

      <div className="flex flex-wrap items-center justify-between gap-2">
        <p className="text-sm text-ink" aria-live="polite" data-testid="draw-status">
          <span className="tabular font-medium">{formatNumber(points.length)}</span> {points.length === 1 ? 'point' : 'points'},{' '}
          <span className="tabular font-medium">{formatNumber(lengthM / 1000, 2)} km</span>
          {points.length === 0 ? <span className="text-slate"> — click the map where the route starts, then along the road in driving order.</span> : null}
          {points.length === 1 ? <span className="text-slate"> — click the next point along the road.</span> : null}
        </p>
        <div className="flex gap-2">
          <Button size="sm" onClick={() => change(points.slice(0, -1))} disabled={points.length === 0}>
            Undo last point
          </Button>
          <Button size="sm" variant="quiet" onClick={() => change([])} disabled={points.length === 0}>
            Clear
          </Button>
        </div>
      </div>

      <div className="h-[26rem] overflow-hidden rounded-md border border-line" data-testid="draw-map">
        <MapContainer center={center} zoom={12} className="h-full w-full cursor-crosshair" doubleClickZoom={false}>
          <BaseLayer />
          {backdrop}
          <ClickToAdd onAdd={(p) => change([...points, p])} />
          {points.length > 1 ? <Polyline positions={points.map(([lon, lat]) => [lat, lon] as [number, number])} pathOptions={{ color: '#1E2A32', weight: 4, dashArray: preview ? undefined : '6 6' }} /> : null}
          {preview
            ? preview.segments
                .filter((s) => s.seq > 0)
                .map((s) => <CircleMarker key={s.seq} center={[s.coords[0][1], s.coords[0][0]]} radius={3} pathOptions={{ color: '#1E2A32', weight: 1, fillColor: '#FAF8F3', fillOpacity: 1 }} />)
            : null}
          {points.map(([lon, lat], i) => (
            <CircleMarker key={i} center={[lat, lon]} radius={i === 0 ? 7 : 5} pathOptions={{ color: '#1E2A32', weight: 2, fillColor: i === 0 ? '#2E7D4F' : '#D9622B', fillOpacity: 1 }} />
          ))}
        </MapContainer>
      </div>
      <div className="flex flex-wrap items-start justify-between gap-3">
        <p className="text-xs text-slate">Green: start. Orange: the points you placed. After a preview, small white dots mark where segments begin.</p>
        {backdrop ? <RoughnessLegend /> : null}
      </div>

      <div className="flex flex-wrap gap-2">
        <Button disabled={points.length < 2} busy={m.isPending && !preview} onClick={() => m.mutate({ body: body(), preview: true }, { onSuccess: (d) => setPreview(d as RoutePreview) })}>
          Preview segments
        </Button>
        <Button variant="primary" disabled={!preview} busy={m.isPending && Boolean(preview)} onClick={() => m.mutate({ body: body(), preview: false }, { onSuccess: (d) => onCreated((d as { route: { id: number } }).route.id) })}>
          Save route
        </Button>
      </div>
      {preview ? (
        <Notice tone="ok" title="Preview">
          {formatNumber(preview.lengthM / 1000, 2)} km in {formatNumber(preview.segments.length)} {preview.segments.length === 1 ? 'segment' : 'segments'} of {formatNumber(Number(segLen))} m (the last one takes the remainder). Nothing is saved until you press “Save route”.
        </Notice>
      ) : null}
      {lineError ? <Notice tone="error">The line: {lineError}</Notice> : m.error && !Object.keys(f).length ? <Notice tone="error">{m.error.message}</Notice> : null}
      {m.error && Object.keys(f).length && !lineError ? <Notice tone="error">{m.error.message} See the marked fields.</Notice> : null}
    </div>
  );
}
