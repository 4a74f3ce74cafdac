import { Facts } from '@/components/ui/facts';
import { formatDate, formatQuantity } from '@/lib/format';
import type { VehicleDetail } from '../api/get-vehicle';

/** The handful of facts that identify a vehicle and where it works. */
export function VehicleFacts({ detail, className }: { detail: VehicleDetail; className?: string }) {
  const { vehicle, spec, depot, driver } = detail;
  return (
    <Facts
      className={className}
      items={[
        { label: 'Plate', value: <span className="font-mono tracking-wide">{vehicle.plate}</span> },
        { label: 'Spec', value: spec.name },
        { label: 'Depot', value: depot.name },
        { label: 'Driver', value: driver?.name ?? <span className="text-slate">Not assigned</span> },
        { label: 'Odometer', value: formatQuantity(vehicle.odometerKm, 'km'), numeric: true },
        { label: 'In service since', value: formatDate(vehicle.commissionedAt), numeric: true },
      ]}
    />
  );
}
