import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { isApiError } from '@/lib/api-client';
import { useCreateTrip, useTripOptions } from '../api/create-trip';

/** Enter one trip by hand (times in your local time zone). */
export function TripForm() {
  const opts = useTripOptions();
  const m = useCreateTrip();
  const [v, setV] = useState({ vehicleId: '', routeId: '', driverId: '', start: '', end: '', distanceKm: '', meanSpeedKmh: '', payloadKg: '' });
  const f = m.error && isApiError(m.error) ? m.error.fields : {};
  const set = (k: keyof typeof v) => (e: { target: { value: string } }) => setV((s) => ({ ...s, [k]: e.target.value }));
  return (
    <form
      className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4"
      onSubmit={(e) => {
        e.preventDefault();
        m.mutate({
          vehicleId: Number(v.vehicleId),
          routeId: Number(v.routeId),
          driverId: v.driverId ? Number(v.driverId) : null,
          startedAt: v.start ? new Date(v.start).toISOString() : '',
          endedAt: v.end ? new Date(v.end).toISOString() : '',
          distanceKm: Number(v.distanceKm),
          meanSpeedKmh: Number(v.meanSpeedKmh),
          payloadKg: v.payloadKg ? Number(v.payloadKg) : null,
        });
      }}
    >
      <SelectField label="Vehicle" value={v.vehicleId} onChange={set('vehicleId')} error={f.vehicleId} options={[{ value: '', label: 'Choose…' }, ...(opts.data?.vehicles ?? []).map((x) => ({ value: String(x.id), label: x.fleetNumber }))]} />
      <SelectField label="Route" value={v.routeId} onChange={set('routeId')} error={f.routeId} options={[{ value: '', label: 'Choose…' }, ...(opts.data?.routes ?? []).map((x) => ({ value: String(x.id), label: x.name }))]} />
      <SelectField label="Driver" aside="(optional)" value={v.driverId} onChange={set('driverId')} error={f.driverId} options={[{ value: '', label: 'Not recorded' }, ...(opts.data?.drivers ?? []).map((x) => ({ value: String(x.id), label: x.name }))]} />
      <TextField label="Payload [kg]" aside="(optional)" inputMode="decimal" value={v.payloadKg} onChange={set('payloadKg')} error={f.payloadKg} />
      <TextField label="Start" type="datetime-local" value={v.start} onChange={set('start')} error={f.startedAt} />
      <TextField label="End" type="datetime-local" value={v.end} onChange={set('end')} error={f.endedAt} />
      <TextField label="Distance [km]" inputMode="decimal" value={v.distanceKm} onChange={set('distanceKm')} error={f.distanceKm} />
      <TextField label="Mean speed [km/h]" inputMode="decimal" value={v.meanSpeedKmh} onChange={set('meanSpeedKmh')} error={f.meanSpeedKmh} />
      <div className="flex items-center gap-3 sm:col-span-2 lg:col-span-4">
        <Button type="submit" variant="primary" busy={m.isPending}>Save trip</Button>
        {m.isSuccess ? <p role="status" className="text-sm text-ok">Trip saved.</p> : null}
        {m.error ? <p role="alert" className="text-sm text-overdue">{m.error.message}{f._ ? ` ${f._}` : ''}</p> : null}
      </div>
    </form>
  );
}
