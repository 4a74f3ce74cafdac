import { EmptyState } from '@/components/ui/empty-state';
import { ErrorState } from '@/components/ui/error-state';
import { Facts } from '@/components/ui/facts';
import { LoadingState } from '@/components/ui/loading-state';
import { Section } from '@/components/ui/section';
import { useVehicle } from '@/features/vehicles/api/get-vehicle';
import { useVehicles } from '@/features/vehicles/api/get-vehicles';
import { DamperCorners } from '@/features/vehicles/components/damper-corners';
import { RecentTrips } from '@/features/vehicles/components/recent-trips';
import { VehicleInspections } from '@/features/vehicles/components/vehicle-inspections';
import { VehicleStatusBadge } from '@/features/vehicles/components/vehicle-status-badge';
import { formatQuantity } from '@/lib/format';

/** The driver's start page: the vehicle assigned to them, laid out for a phone. */
export function MyVehiclePage() {
  // The server answers a driver with only the vehicle assigned to them.
  const mine = useVehicles({ page: 1, pageSize: 1 });
  const id = mine.data?.items[0]?.id;
  const detail = useVehicle(id);

  let body;
  if (mine.isPending || (id && detail.isPending)) body = <LoadingState label="Loading your vehicle…" />;
  else if (mine.error) body = <ErrorState error={mine.error} what="your vehicle" onRetry={() => void mine.refetch()} />;
  else if (!id)
    body = (
      <EmptyState title="No vehicle is assigned to you">
        When a fleet manager assigns you a vehicle, its dampers and inspections show here. Ask your depot if you expected
        one.
      </EmptyState>
    );
  else if (detail.error) body = <ErrorState error={detail.error} what="your vehicle" onRetry={() => void detail.refetch()} />;
  else if (detail.data) {
    const { vehicle, spec, depot } = detail.data;
    body = (
      <>
        <header className="mb-5">
          <p className="text-sm font-medium text-slate">Your vehicle</p>
          <div className="flex flex-wrap items-center gap-x-3 gap-y-1.5">
            <h1 className="text-3xl font-semibold tracking-tight text-ink">{vehicle.fleetNumber}</h1>
            <VehicleStatusBadge status={vehicle.status} size="md" />
          </div>
        </header>
        <Facts
          className="mb-6 rounded-md border border-line bg-surface px-4 py-3.5"
          columns="grid-cols-2 sm:grid-cols-4"
          items={[
            { label: 'Plate', value: <span className="font-mono tracking-wide">{vehicle.plate}</span> },
            { label: 'Odometer', value: formatQuantity(vehicle.odometerKm, 'km'), numeric: true },
            { label: 'Type', value: spec.name },
            { label: 'Depot', value: depot.name },
          ]}
        />
        <Section title="Dampers">
          <DamperCorners dampers={detail.data.dampers} axles={spec.axles} threshold={detail.data.inspectionThreshold} compact />
        </Section>
        <Section title="Inspections">
          <VehicleInspections inspections={detail.data.inspections} />
        </Section>
        <Section title="Recent trips">
          <RecentTrips trips={detail.data.recentTrips} compact />
        </Section>
      </>
    );
  }

  return (
    <div className="mx-auto max-w-2xl">
      <title>My vehicle · Reboundry</title>
      {body}
    </div>
  );
}
