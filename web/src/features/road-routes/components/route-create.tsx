import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Field, Input, SelectField, TextField } from '@/components/ui/field';
import { isApiError } from '@/lib/api-client';
import { formatNumber } from '@/lib/format';
import { ROUGHNESS_CLASSES } from '@/lib/roughness';
import { useCreateRoute, type CreateRouteBody, type RoutePreview } from '../api/create-route';

/** A new route from an uploaded GeoJSON LineString or CSV of points, split into segments. */
export function RouteCreate({ onCreated }: { onCreated: (id: number) => void }) {
  const [name, setName] = useState('');
  const [speed, setSpeed] = useState('50');
  const [segLen, setSegLen] = useState('100');
  const [cls, setCls] = useState('');
  const [text, setText] = useState<{ format: 'geojson' | 'csv'; text: string; name: string } | null>(null);
  const [preview, setPreview] = useState<RoutePreview | null>(null);
  const m = useCreateRoute();
  const f = m.error && isApiError(m.error) ? m.error.fields : {};
  const body = (): CreateRouteBody | null =>
    text ? { name, defaultSpeedKmh: Number(speed), segmentLengthM: Number(segLen), statedClass: cls || null, line: { format: text.format, text: text.text } } : null;
  return (
    <div className="flex flex-col gap-3">
      <p className="text-sm text-slate">
        Upload the route’s line: a GeoJSON file with one LineString (coordinates [longitude, latitude] in degrees), or a CSV with a header naming <code>lat</code> and <code>lon</code> columns and one point per row in driving order.
      </p>
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-5">
        <TextField label="Route name" value={name} onChange={(e) => setName(e.target.value)} error={f.name} />
        <TextField label="Typical speed [km/h]" inputMode="decimal" value={speed} onChange={(e) => setSpeed(e.target.value)} error={f.defaultSpeedKmh} />
        <TextField label="Segment length [m]" inputMode="decimal" value={segLen} onChange={(e) => setSegLen(e.target.value)} error={f.segmentLengthM} aside="(default 100 m)" />
        <SelectField label="Stated class" aside="(optional)" value={cls} onChange={(e) => setCls(e.target.value)} options={[{ value: '', label: 'Not known yet' }, ...ROUGHNESS_CLASSES.map((c) => ({ value: c, label: c }))]} />
        <Field label="Line file (GeoJSON or CSV)" error={f.line}>
          {(c) => (
            <Input
              {...c}
              type="file"
              className="pt-1.5"
              accept=".geojson,.json,.csv,application/geo+json,application/json,text/csv"
              onChange={async (e) => {
                const file = e.target.files?.[0];
                setPreview(null);
                m.reset();
                if (!file) return setText(null);
                const t = await file.text();
                setText({ format: t.trim().startsWith('{') ? 'geojson' : 'csv', text: t, name: file.name });
              }}
            />
          )}
        </Field>
      </div>
      <div className="flex gap-2">
        <Button disabled={!text} busy={m.isPending && !preview} onClick={() => body() && m.mutate({ body: body()!, preview: true }, { onSuccess: (d) => setPreview(d as RoutePreview) })}>
          Preview segments
        </Button>
        <Button variant="primary" disabled={!preview} busy={m.isPending && Boolean(preview)} onClick={() => body() && m.mutate({ body: body()!, preview: false }, { onSuccess: (d) => onCreated((d as { route: { id: number } }).route.id) })}>
          Create route
        </Button>
      </div>
      {preview ? (
        <p role="status" className="text-sm">
          {formatNumber(preview.lengthM / 1000, 2)} km from {formatNumber(preview.pointCount)} points: {preview.segments.length} segments of {formatNumber(Number(segLen))} m (the last one takes the remainder).
        </p>
      ) : null}
      {m.error ? <p role="alert" className="text-sm text-overdue">{m.error.message}</p> : null}
    </div>
  );
}
