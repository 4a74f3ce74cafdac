import { useState } from 'react';
import { z } from 'zod';
import { vehicleBody, vehiclePatch } from '@contracts/fleet';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { SelectField, TextField, type Option } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { isApiError } from '@/lib/api-client';
import { fromText, useSchemaForm } from '@/lib/use-schema-form';
import { formatNumber } from '@/lib/format';
import { VEHICLE_STATUSES, type VehicleListItem } from '../api/get-vehicles';
import { useSaveVehicle, type VehicleInput, type VehiclePatch } from '../api/save-vehicle';
import { vehicleStatusLabels } from './vehicle-status-badge';

export interface DriverChoice {
  id: number;
  name: string;
}

export interface VehicleFormOptions {
  specOptions: Option[];
  depotOptions: Option[];
  /** Active drivers. */
  drivers: DriverChoice[];
  /** Driver id → fleet number of the vehicle they already drive. */
  assignedDrivers: Map<number, string>;
}

const labels = {
  fleetNumber: 'Fleet number',
  plate: 'Plate',
  specId: 'Suspension spec',
  depotId: 'Depot',
  driverId: 'Driver',
  odometerKm: 'Odometer',
  status: 'Status',
};

/**
 * The server's vehicle rules (server/contracts/fleet.ts) over the form's text fields, and the one
 * rule only the form can know: a reading below the recorded odometer.
 */
function vehicleForm(current: VehicleListItem | undefined) {
  return z
    .object({
      fleetNumber: vehicleBody.shape.fleetNumber,
      plate: vehicleBody.shape.plate,
      specId: fromText(vehicleBody.shape.specId, 'Choose a suspension spec.'),
      depotId: fromText(vehicleBody.shape.depotId, 'Choose a depot.'),
      driverId: fromText(vehicleBody.shape.driverId),
      odometerKm: fromText(vehiclePatch.shape.odometerKm.unwrap()),
      status: vehiclePatch.shape.status.unwrap(),
    })
    .superRefine((v, ctx) => {
      if (current && typeof v.odometerKm === 'number' && v.odometerKm < current.odometerKm) {
        ctx.addIssue({ code: 'custom', path: ['odometerKm'], message: `The odometer cannot go backwards: the recorded reading is ${formatNumber(current.odometerKm)} km.` });
      }
    });
}

const draftOf = (v: VehicleListItem | undefined) => ({
  fleetNumber: v?.fleetNumber ?? '',
  plate: v?.plate ?? '',
  specId: v ? String(v.specId) : '',
  depotId: v ? String(v.depotId) : '',
  driverId: v?.driverId ? String(v.driverId) : '',
  odometerKm: v ? String(Math.round(v.odometerKm)) : '0',
  status: v?.status ?? 'in_service',
});

/**
 * Add a vehicle, or change one: plate, spec, depot, driver, an odometer reading (never lower than
 * the recorded one) and its status. Retiring asks once more before it is saved.
 */
export function VehicleFormDialog({
  open,
  onClose,
  vehicle,
  options,
  onSaved,
}: {
  open: boolean;
  onClose: () => void;
  /** The vehicle to edit; leave out to add a new one. */
  vehicle?: VehicleListItem;
  options: VehicleFormOptions;
  onSaved?: (v: VehicleListItem) => void;
}) {
  return (
    <Dialog
      open={open}
      onClose={onClose}
      title={vehicle ? `Edit ${vehicle.fleetNumber}` : 'Add a vehicle'}
      description={vehicle ? 'Change what is recorded for this vehicle. The odometer only moves forward.' : 'A new vehicle gets four new dampers, fitted today at its odometer reading.'}
    >
      <VehicleForm key={vehicle?.id ?? 'new'} vehicle={vehicle} options={options} onCancel={onClose} onSaved={(v) => { onSaved?.(v); onClose(); }} />
    </Dialog>
  );
}

function VehicleForm({ vehicle, options, onCancel, onSaved }: { vehicle?: VehicleListItem; options: VehicleFormOptions; onCancel: () => void; onSaved: (v: VehicleListItem) => void }) {
  const form = useSchemaForm(vehicleForm(vehicle), labels, draftOf(vehicle) as never);
  const [confirmRetire, setConfirmRetire] = useState(false);
  const save = useSaveVehicle(vehicle?.id);

  const driverOptions: Option[] = [
    { value: '', label: 'No driver' },
    ...options.drivers
      .filter((d) => !options.assignedDrivers.has(d.id) || d.id === vehicle?.driverId)
      .map((d) => ({ value: String(d.id), label: d.name })),
  ];
  // A driver assigned elsewhere is not offered; say so, so nobody wonders where they went.
  const hiddenDrivers = options.drivers.filter((d) => options.assignedDrivers.has(d.id) && d.id !== vehicle?.driverId).length;

  function body(v: z.output<ReturnType<typeof vehicleForm>>): VehicleInput | VehiclePatch {
    const full: VehicleInput = { fleetNumber: v.fleetNumber, plate: v.plate, specId: v.specId, depotId: v.depotId, driverId: v.driverId ?? null, odometerKm: v.odometerKm };
    if (!vehicle) return full;
    const patch: VehiclePatch = {};
    if (full.fleetNumber !== vehicle.fleetNumber) patch.fleetNumber = full.fleetNumber;
    if (full.plate !== vehicle.plate) patch.plate = full.plate;
    if (full.specId !== vehicle.specId) patch.specId = full.specId;
    if (full.depotId !== vehicle.depotId) patch.depotId = full.depotId;
    if (full.driverId !== vehicle.driverId) patch.driverId = full.driverId;
    if (full.odometerKm !== Math.round(vehicle.odometerKm) && full.odometerKm !== vehicle.odometerKm) patch.odometerKm = full.odometerKm;
    if (v.status !== vehicle.status) patch.status = v.status;
    return patch;
  }

  const onSubmit = form.handleSubmit((v) => {
    const b = body(v);
    if (vehicle && Object.keys(b).length === 0) {
      onCancel();
      return;
    }
    if (vehicle && v.status === 'retired' && vehicle.status !== 'retired' && !confirmRetire) {
      setConfirmRetire(true);
      return;
    }
    save.mutate(b, {
      onSuccess: (res) => onSaved(res.vehicle),
      onError: (err) => {
        form.showServerErrors(err);
        setConfirmRetire(false);
      },
    });
  });

  const serverMessage = save.error && (!isApiError(save.error) || Object.keys(save.error.fields).length === 0) ? save.error.message : null;

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField label="Fleet number" {...form.register('fleetNumber')} error={form.errorOf('fleetNumber')} autoComplete="off" maxLength={20} />
        <TextField label="Plate" {...form.register('plate')} error={form.errorOf('plate')} autoComplete="off" maxLength={20} />
        <SelectField label="Suspension spec" {...form.register('specId')} error={form.errorOf('specId')} options={[{ value: '', label: 'Choose a spec' }, ...options.specOptions]} />
        <SelectField label="Depot" {...form.register('depotId')} error={form.errorOf('depotId')} options={[{ value: '', label: 'Choose a depot' }, ...options.depotOptions]} />
        <SelectField
          label="Driver"
          aside="(optional)"
          hint={hiddenDrivers ? `${hiddenDrivers} ${hiddenDrivers === 1 ? 'driver who already drives another vehicle is' : 'drivers who already drive other vehicles are'} not listed.` : undefined}
          {...form.register('driverId')}
          error={form.errorOf('driverId')}
          options={driverOptions}
          className="sm:col-span-2"
        />
        <TextField
          label="Odometer [km]"
          inputMode="numeric"
          hint={vehicle ? `Recorded: ${formatNumber(vehicle.odometerKm)} km. A new reading cannot be lower.` : 'The reading today.'}
          {...form.register('odometerKm')}
          error={form.errorOf('odometerKm')}
        />
        {vehicle ? (
          <SelectField
            label="Status"
            {...form.register('status', { onChange: () => setConfirmRetire(false) })}
            error={form.errorOf('status')}
            options={VEHICLE_STATUSES.map((s) => ({ value: s, label: vehicleStatusLabels[s] }))}
          />
        ) : null}
      </div>

      {confirmRetire && vehicle ? (
        <Notice tone="error" title={`Retire ${vehicle.fleetNumber}?`}>
          It leaves the nightly wear run and its driver{vehicle.driverName ? ` (${vehicle.driverName})` : ''} is unassigned. Its dampers, trips and inspections stay on record. Press “Retire vehicle” to go ahead.
        </Notice>
      ) : null}
      {serverMessage ? <Notice tone="error">{serverMessage}</Notice> : null}

      <div className="flex flex-wrap justify-end gap-2">
        <Button onClick={onCancel}>Cancel</Button>
        <Button type="submit" variant={confirmRetire ? 'danger' : 'primary'} busy={save.isPending}>
          {confirmRetire ? 'Retire vehicle' : vehicle ? 'Save changes' : 'Add vehicle'}
        </Button>
      </div>
    </form>
  );
}
