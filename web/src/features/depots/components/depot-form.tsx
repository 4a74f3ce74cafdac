import { useEffect } from 'react';
import { CircleMarker, MapContainer, Tooltip, useMap, useMapEvents } from 'react-leaflet';
import { BaseLayer } from '@/components/map/base-layer';
import { Dialog } from '@/components/ui/dialog';
import { TextField } from '@/components/ui/field';
import { FormActions } from '@/components/ui/form-actions';
import { Notice } from '@/components/ui/notice';
import { isApiError } from '@/lib/api-client';
import { fromText, useSchemaForm } from '@/lib/use-schema-form';
import { depotBody } from '@contracts/fleet';
import type { Depot } from '../api/get-depots';
import { useSaveDepot } from '../api/save-depot';

const labels = { name: 'Name', address: 'Address', lat: 'Latitude', lon: 'Longitude' };

function ClickToPlace({ onPick }: { onPick: (lat: number, lon: number) => void }) {
  useMapEvents({ click: (e) => onPick(e.latlng.lat, e.latlng.lng) });
  return null;
}

/** The map is created while the dialog opens; measure again once it has its size. */
function FixSize() {
  const map = useMap();
  useEffect(() => {
    const t = window.setTimeout(() => map.invalidateSize(), 50);
    return () => window.clearTimeout(t);
  }, [map]);
  return null;
}

const round = (x: number) => String(Math.round(x * 1e5) / 1e5);

/** Add a depot or change one: name, address and position (typed, or clicked on the small map). */
export function DepotFormDialog({ open, onClose, depot, near, others = [] }: { open: boolean; onClose: () => void; depot?: Depot; near: [number, number]; /** Other depots, drawn grey to find one's way on the plain map. */ others?: Depot[] }) {
  return (
    <Dialog open={open} onClose={onClose} title={depot ? `Edit ${depot.name}` : 'Add a depot'} description="Type the position in degrees, or click the map to place the depot.">
      <DepotForm key={depot?.id ?? 'new'} depot={depot} near={near} others={others.filter((o) => o.id !== depot?.id)} onDone={onClose} />
    </Dialog>
  );
}

/** The server's depot rules (server/contracts/fleet.ts), with the position typed as text. */
const depotForm = depotBody.extend({ lat: fromText(depotBody.shape.lat), lon: fromText(depotBody.shape.lon) });

function DepotForm({ depot, near, others, onDone }: { depot?: Depot; near: [number, number]; others: Depot[]; onDone: () => void }) {
  const form = useSchemaForm(depotForm, labels, { name: depot?.name ?? '', address: depot?.address ?? '', lat: depot ? String(depot.lat) : '', lon: depot ? String(depot.lon) : '' } as never);
  const save = useSaveDepot(depot?.id);
  const lat = String(form.watch('lat') ?? '');
  const lon = String(form.watch('lon') ?? '');

  const latN = Number(lat.replace(',', '.'));
  const lonN = Number(lon.replace(',', '.'));
  const placed = lat.trim() !== '' && lon.trim() !== '' && Number.isFinite(latN) && Number.isFinite(lonN) && Math.abs(latN) <= 90 && Math.abs(lonN) <= 180;
  const center: [number, number] = depot ? [depot.lat, depot.lon] : near;

  const onSubmit = form.handleSubmit((v) =>
    save.mutate({ name: v.name, address: v.address?.trim() || null, lat: v.lat, lon: v.lon }, { onSuccess: onDone, onError: (err) => form.showServerErrors(err) }),
  );

  const serverMessage = save.error && (!isApiError(save.error) || Object.keys(save.error.fields).length === 0) ? save.error.message : null;

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3">
      <TextField label="Name" {...form.register('name')} error={form.errorOf('name')} maxLength={120} />
      <TextField label="Address" aside="(optional)" {...form.register('address')} error={form.errorOf('address')} maxLength={240} />
      <div className="grid grid-cols-2 gap-3">
        <TextField label="Latitude [°]" inputMode="decimal" {...form.register('lat')} error={form.errorOf('lat')} placeholder="e.g. 52.56" />
        <TextField label="Longitude [°]" inputMode="decimal" {...form.register('lon')} error={form.errorOf('lon')} placeholder="e.g. −1.40" />
      </div>
      <div className="h-52 overflow-hidden rounded-md border border-line" data-testid="depot-map">
        <MapContainer center={center} zoom={11} className="h-full w-full cursor-crosshair">
          <BaseLayer />
          <FixSize />
          <ClickToPlace
            onPick={(a, b) => {
              form.setValue('lat', round(a) as never, { shouldValidate: form.formState.isSubmitted });
              form.setValue('lon', round(b) as never, { shouldValidate: form.formState.isSubmitted });
            }}
          />
          {others.map((o) => (
            <CircleMarker key={o.id} center={[o.lat, o.lon]} radius={6} pathOptions={{ color: '#5B6B73', weight: 2, fillColor: '#FAF8F3', fillOpacity: 1 }}>
              <Tooltip direction="top" offset={[0, -4]}>{o.name}</Tooltip>
            </CircleMarker>
          ))}
          {placed ? <CircleMarker center={[latN, lonN]} radius={8} pathOptions={{ color: '#1E2A32', weight: 2, fillColor: '#D9622B', fillOpacity: 1 }} /> : null}
        </MapContainer>
      </div>
      <p className="text-sm text-slate">{placed ? 'The orange dot is where the depot will be. Click elsewhere to move it.' : 'Click the map to place the depot.'}</p>
      {serverMessage ? <Notice tone="error">{serverMessage}</Notice> : null}
      <FormActions onCancel={onDone} busy={save.isPending}>
        {depot ? 'Save changes' : 'Add depot'}
      </FormActions>
    </form>
  );
}
