import { useMemo, useState } from 'react';
import { Link } from 'react-router';
import { MapContainer } from 'react-leaflet';
import { BaseLayer } from '@/components/map/base-layer';
import { SegmentLayer, useSharedCanvas } from '@/components/map/segment-layer';
import { ScaleBar } from '@/components/map/map-context';
import { Button } from '@/components/ui/button';
import { ErrorState } from '@/components/ui/error-state';
import { Facts } from '@/components/ui/facts';
import { SelectField, TextField } from '@/components/ui/field';
import { LoadingState } from '@/components/ui/loading-state';
import { RoughnessLegend } from '@/components/ui/roughness';
import { Section } from '@/components/ui/section';
import { isApiError } from '@/lib/api-client';
import { formatDate, formatDateTime, formatNumber } from '@/lib/format';
import { ROUGHNESS_CLASSES } from '@/lib/roughness';
import { useRoute, type RouteDetail } from '../api/get-route';
import { useSetRoughness } from '../api/set-roughness';
import { IriChart } from './iri-chart';
import { SegmentSpeeds } from './segment-speeds';
import { SurveyUpload } from './survey-upload';

/** One route: map, IRI along it, surveys, trips; managers upload surveys and set classes. */
export function RouteView({ routeId, canEdit, today, vehiclePath, tripsPath }: { routeId: number; canEdit: boolean; today: string; /** Leave out where the reader may not open vehicles. */ vehiclePath?: (id: number) => string; /** Leave out where the reader may not open the trips table. */ tripsPath?: string }) {
  const q = useRoute(routeId);
  if (q.isPending) return <LoadingState label="Loading the route…" />;
  if (q.error) return <ErrorState error={q.error} what="the route" onRetry={() => void q.refetch()} />;
  return <RouteBody d={q.data} canEdit={canEdit} today={today} vehiclePath={vehiclePath} tripsPath={tripsPath} />;
}

function RouteBody({ d, canEdit, today, vehiclePath, tripsPath }: { d: RouteDetail; canEdit: boolean; today: string; vehiclePath?: (id: number) => string; tripsPath?: string }) {
  const lines = useMemo(() => ({ id: d.segments.map((s) => s.id), isoClass: d.segments.map((s) => s.isoClass), coords: d.segments.map((s) => s.coords) }), [d.segments]);
  const surveyed = d.segments.filter((s) => s.roughnessSource === 'survey').length;
  const canvas = useSharedCanvas();
  return (
    <div className="flex flex-col gap-6">
      <Facts
        items={[
          { label: 'Length', value: `${formatNumber(d.route.lengthM / 1000, 1)} km`, numeric: true },
          { label: 'Segments', value: `${d.segments.length} × ${formatNumber(d.route.segmentLengthM)} m`, numeric: true },
          { label: 'Typical speed', value: `${formatNumber(d.route.defaultSpeedKmh)} km/h`, numeric: true },
          { label: 'Measured by survey', value: `${surveyed} of ${d.segments.length} segments`, numeric: true },
          { label: 'Trips', value: formatNumber(d.trips.count), numeric: true },
        ]}
      />
      <div className="grid gap-4 lg:grid-cols-[22rem_1fr]">
        <div>
          <div className="h-72 overflow-hidden rounded-md border border-line" data-testid="route-map">
            <MapContainer renderer={canvas} center={[d.route.coordinates[0][1], d.route.coordinates[0][0]]} zoom={12} className="h-full w-full">
              <BaseLayer />
              <ScaleBar />
              <SegmentLayer data={lines} fit weight={5} />
            </MapContainer>
          </div>
          <RoughnessLegend className="mt-2" />
        </div>
        <IriChart segments={d.segments} />
      </div>
      <p className="text-sm text-slate">Current value per segment: {d.currentRule}</p>
      {canEdit ? (
        <Section title="Typical speed per segment" description={`Speeds the wear model uses on each stretch. Leave a row empty to use the route’s ${formatNumber(d.route.defaultSpeedKmh)} km/h.`}>
          <SegmentSpeeds routeId={d.route.id} segments={d.segments} defaultSpeedKmh={d.route.defaultSpeedKmh} />
        </Section>
      ) : null}
      {canEdit ? (
        <Section title="Upload a profile survey" description="IRI per segment by the golden-car method (ASTM E1926), previewed before anything is saved.">
          <SurveyUpload routeId={d.route.id} today={today} />
        </Section>
      ) : null}
      {canEdit ? (
        <Section title="Set roughness by hand" description="A class or IRI for a stretch of segments, e.g. after resurfacing. Stored as a stated observation.">
          <ManualRoughness routeId={d.route.id} last={d.segments.length} today={today} />
        </Section>
      ) : null}
      <Section title="Survey history">
        {d.surveys.length === 0 ? (
          <p className="text-sm text-slate">No profile survey yet. Segments carry stated classes or estimates from drivers’ reports.</p>
        ) : (
          <table className="w-full text-sm [&_td]:pr-3 [&_th]:pr-3" aria-label="Survey history">
            <thead className="text-left text-slate">
              <tr>
                <th className="py-1">Surveyed on</th>
                <th>File</th>
                <th className="text-right">Covers [km]</th>
                <th className="text-right">Interval [m]</th>
                <th>Uploaded</th>
              </tr>
            </thead>
            <tbody>
              {d.surveys.map((s) => (
                <tr key={s.id} className="border-t border-line">
                  <td className="py-1">{formatDate(s.surveyedOn)}</td>
                  <td>{canEdit ? <a className="link" href={`/api/surveys/${s.id}/file`}>{s.originalName}</a> : s.originalName}</td>
                  <td className="text-right tabular-nums">{formatNumber(s.startM / 1000, 2)}–{formatNumber(s.endM / 1000, 2)}</td>
                  <td className="text-right tabular-nums">{formatNumber(s.dxM, 3)}</td>
                  <td>{formatDateTime(s.uploadedAt)}{s.uploadedByName ? `, ${s.uploadedByName}` : ''}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </Section>
      <Section title="Trips on this route" actions={tripsPath ? <Link className="link text-sm" to={tripsPath}>All {formatNumber(d.trips.count)} trips</Link> : undefined}>
        <div className="overflow-x-auto" role="group" aria-label="Recent trips on this route" tabIndex={0}>
        <table className="w-full text-sm [&_td]:pr-3 [&_th]:pr-3 [&_td:last-child]:pr-0 [&_th:last-child]:pr-0" aria-label="Recent trips on this route">
          <thead className="text-left text-slate">
            <tr>
              <th className="py-1">Started</th>
              <th>Vehicle</th>
              <th>Driver</th>
              <th className="text-right">Distance [km]</th>
              <th className="text-right">Mean speed [km/h]</th>
            </tr>
          </thead>
          <tbody>
            {d.trips.recent.map((t) => (
              <tr key={t.id} className="border-t border-line">
                <td className="py-1 whitespace-nowrap">{formatDateTime(t.startedAt)}</td>
                <td>{vehiclePath ? <Link className="link" to={vehiclePath(t.vehicleId)}>{t.fleetNumber}</Link> : t.fleetNumber}</td>
                <td>{t.driverName ?? '—'}</td>
                <td className="text-right tabular-nums">{formatNumber(t.distanceKm, 1)}</td>
                <td className="text-right tabular-nums">{formatNumber(t.meanSpeedKmh, 1)}</td>
              </tr>
            ))}
          </tbody>
        </table>
        </div>
      </Section>
    </div>
  );
}

function ManualRoughness({ routeId, last, today }: { routeId: number; last: number; today: string }) {
  const [from, setFrom] = useState('1');
  const [to, setTo] = useState(String(last));
  const [cls, setCls] = useState('B');
  const [iri, setIri] = useState('');
  const [date, setDate] = useState(today);
  const m = useSetRoughness(routeId);
  const f = m.error && isApiError(m.error) ? m.error.fields : {};
  return (
    <form
      className="flex flex-wrap items-end gap-3"
      onSubmit={(e) => {
        e.preventDefault();
        m.mutate({ seqFrom: Number(from) - 1, seqTo: Number(to) - 1, isoClass: iri ? null : cls, iri: iri ? Number(iri) : null, observedOn: date });
      }}
    >
      <TextField label="From segment" type="number" min={1} max={last} value={from} onChange={(e) => setFrom(e.target.value)} error={f.seqFrom} className="w-32" />
      <TextField label="To segment" type="number" min={1} max={last} value={to} onChange={(e) => setTo(e.target.value)} error={f.seqTo} className="w-32" />
      <SelectField label="ISO 8608 class" value={cls} onChange={(e) => setCls(e.target.value)} options={ROUGHNESS_CLASSES.map((c) => ({ value: c, label: c }))} error={f.isoClass} className="w-32" />
      <TextField label="or IRI [m/km]" inputMode="decimal" value={iri} onChange={(e) => setIri(e.target.value)} error={f.iri} className="w-36" />
      <TextField label="Observed on" type="date" max={today} value={date} onChange={(e) => setDate(e.target.value)} error={f.observedOn} />
      <Button type="submit" busy={m.isPending}>Set roughness</Button>
      {m.isSuccess ? <p role="status" className="text-sm text-ok">Set on {m.data.updated} segments.</p> : null}
      {m.error && !Object.keys(f).length ? <p role="alert" className="text-sm text-overdue">{m.error.message}</p> : null}
    </form>
  );
}
