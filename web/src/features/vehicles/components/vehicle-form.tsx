import { useRef, useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { SelectField, TextField, type Option } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { isApiError } from '@/lib/api-client';
import { focusFirstError, serverFieldErrors, type FieldErrors } from '@/lib/form-errors';
import { formatNumber } from '@/lib/format';
import { VEHICLE_STATUSES, type VehicleListItem, type VehicleStatus } from '../api/get-vehicles';
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

const labels: Record<string, string> = {
  fleetNumber: 'Fleet number',
  plate: 'Plate',
  specId: 'Suspension spec',
  depotId: 'Depot',
  driverId: 'Driver',
  odometerKm: 'Odometer',
  status: 'Status',
};

interface Draft {
  fleetNumber: string;
  plate: string;
  specId: string;
  depotId: string;
  driverId: string;
  odometerKm: string;
  status: VehicleStatus;
}

function draftOf(v: VehicleListItem | undefined): Draft {
  return {
    fleetNumber: v?.fleetNumber ?? '',
    plate: v?.plate ?? '',
    specId: v ? String(v.specId) : '',
    depotId: v ? String(v.depotId) : '',
    driverId: v?.driverId ? String(v.driverId) : '',
    odometerKm: v ? String(Math.round(v.odometerKm)) : '0',
    status: v?.status ?? 'in_service',
  };
}

/** Checks in the browser what the server would refuse anyway, so the person hears it at once. */
function check(d: Draft, current: VehicleListItem | undefined): FieldErrors {
  const e: FieldErrors = {};
  if (!d.fleetNumber.trim()) e.fleetNumber = 'Fleet number is required.';
  else if (!/^[A-Za-z0-9-]+$/.test(d.fleetNumber.trim())) e.fleetNumber = 'Fleet number may use letters, digits and -.';
  if (d.plate.trim().length < 2) e.plate = 'Plate must be at least 2 characters.';
  if (!d.specId) e.specId = 'Choose a suspension spec.';
  if (!d.depotId) e.depotId = 'Choose a depot.';
  const odo = Number(d.odometerKm.replace(',', '.'));
  if (d.odometerKm.trim() === '' || !Number.isFinite(odo) || odo < 0) e.odometerKm = 'Odometer must be a number of km, 0 or more.';
  else if (current && odo < current.odometerKm)
    e.odometerKm = `The odometer cannot go backwards: the recorded reading is ${formatNumber(current.odometerKm)} km.`;
  return e;
}

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
  const [draft, setDraft] = useState<Draft>(() => draftOf(vehicle));
  const [errors, setErrors] = useState<FieldErrors>({});
  const [confirmRetire, setConfirmRetire] = useState(false);
  const formRef = useRef<HTMLFormElement>(null);
  const save = useSaveVehicle(vehicle?.id);

  const set = (key: keyof Draft) => (e: { target: { value: string } }) => {
    setDraft((d) => ({ ...d, [key]: e.target.value }));
    setErrors((er) => ({ ...er, [key]: '' }));
    if (key === 'status') setConfirmRetire(false);
  };

  const driverOptions: Option[] = [
    { value: '', label: 'No driver' },
    ...options.drivers
      .filter((d) => !options.assignedDrivers.has(d.id) || d.id === vehicle?.driverId)
      .map((d) => ({ value: String(d.id), label: d.name })),
  ];
  // A driver assigned elsewhere is not offered; say so, so nobody wonders where they went.
  const hiddenDrivers = options.drivers.filter((d) => options.assignedDrivers.has(d.id) && d.id !== vehicle?.driverId).length;

  function body(): VehicleInput | VehiclePatch {
    const full: VehicleInput = {
      fleetNumber: draft.fleetNumber.trim(),
      plate: draft.plate.trim(),
      specId: Number(draft.specId),
      depotId: Number(draft.depotId),
      driverId: draft.driverId ? Number(draft.driverId) : null,
      odometerKm: Number(draft.odometerKm.replace(',', '.')),
    };
    if (!vehicle) return full;
    const patch: VehiclePatch = {};
    if (full.fleetNumber !== vehicle.fleetNumber) patch.fleetNumber = full.fleetNumber;
    if (full.plate !== vehicle.plate) patch.plate = full.plate;
    if (full.specId !== vehicle.specId) patch.specId = full.specId;
    if (full.depotId !== vehicle.depotId) patch.depotId = full.depotId;
    if (full.driverId !== vehicle.driverId) patch.driverId = full.driverId;
    if (full.odometerKm !== Math.round(vehicle.odometerKm) && full.odometerKm !== vehicle.odometerKm) patch.odometerKm = full.odometerKm;
    if (draft.status !== vehicle.status) patch.status = draft.status;
    return patch;
  }

  function onSubmit(e: FormEvent) {
    e.preventDefault();
    const found = check(draft, vehicle);
    if (Object.values(found).some(Boolean)) {
      setErrors(found);
      focusFirstError(formRef.current, found);
      return;
    }
    const b = body();
    if (vehicle && Object.keys(b).length === 0) {
      onCancel();
      return;
    }
    if (vehicle && draft.status === 'retired' && vehicle.status !== 'retired' && !confirmRetire) {
      setConfirmRetire(true);
      return;
    }
    save.mutate(b, {
      onSuccess: (res) => onSaved(res.vehicle),
      onError: (err) => {
        const f = serverFieldErrors(err, labels);
        setErrors(f);
        setConfirmRetire(false);
        focusFirstError(formRef.current, f);
      },
    });
  }

  const serverMessage = save.error && (!isApiError(save.error) || Object.keys(save.error.fields).length === 0) ? save.error.message : null;

  return (
    <form ref={formRef} onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField name="fleetNumber" label="Fleet number" value={draft.fleetNumber} onChange={set('fleetNumber')} error={errors.fleetNumber} autoComplete="off" maxLength={20} />
        <TextField name="plate" label="Plate" value={draft.plate} onChange={set('plate')} error={errors.plate} autoComplete="off" maxLength={20} />
        <SelectField name="specId" label="Suspension spec" value={draft.specId} onChange={set('specId')} error={errors.specId} options={[{ value: '', label: 'Choose a spec' }, ...options.specOptions]} />
        <SelectField name="depotId" label="Depot" value={draft.depotId} onChange={set('depotId')} error={errors.depotId} options={[{ value: '', label: 'Choose a depot' }, ...options.depotOptions]} />
        <SelectField
          name="driverId"
          label="Driver"
          aside="(optional)"
          hint={hiddenDrivers ? `${hiddenDrivers} ${hiddenDrivers === 1 ? 'driver who already drives another vehicle is' : 'drivers who already drive other vehicles are'} not listed.` : undefined}
          value={draft.driverId}
          onChange={set('driverId')}
          error={errors.driverId}
          options={driverOptions}
          className="sm:col-span-2"
        />
        <TextField
          name="odometerKm"
          label="Odometer [km]"
          inputMode="numeric"
          hint={vehicle ? `Recorded: ${formatNumber(vehicle.odometerKm)} km. A new reading cannot be lower.` : 'The reading today.'}
          value={draft.odometerKm}
          onChange={set('odometerKm')}
          error={errors.odometerKm}
        />
        {vehicle ? (
          <SelectField
            name="status"
            label="Status"
            value={draft.status}
            onChange={set('status')}
            error={errors.status}
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
