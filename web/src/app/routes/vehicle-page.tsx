import { useState } from 'react';
import { data, useParams, type LoaderFunctionArgs } from 'react-router';
import { useQuery, type QueryClient } from '@tanstack/react-query';
import { Button } from '@/components/ui/button';
import { meQueryOptions } from '@/features/auth/api/get-me';
import { VehicleFormDialog } from '@/features/vehicles/components/vehicle-form';
import { ErrorState } from '@/components/ui/error-state';
import { LoadingState } from '@/components/ui/loading-state';
import { PageHeader } from '@/components/ui/page-header';
import { Section } from '@/components/ui/section';
import { SpecCornerTable } from '@/features/specs/components/spec-corner-table';
import { useVehicle, vehicleQueryOptions, type VehicleDetail } from '@/features/vehicles/api/get-vehicle';
import { DamperCorners } from '@/features/vehicles/components/damper-corners';
import { DamperHistory } from '@/features/vehicles/components/damper-history';
import { RecentTrips } from '@/features/vehicles/components/recent-trips';
import { VehicleFacts } from '@/features/vehicles/components/vehicle-facts';
import { VehicleInspections } from '@/features/vehicles/components/vehicle-inspections';
import { VehicleStatusBadge } from '@/features/vehicles/components/vehicle-status-badge';
import { VehicleWear } from '@/features/wear/components/vehicle-wear';
import type { Role } from '@/lib/roles';
import { requireRole } from '../guards';
import { pages, workRecordPath } from '../navigation';
import { VehicleWorkshopPanel } from '@/features/workshop/components/vehicle-workshop-panel';
import { useVehicleFormOptions } from './use-vehicle-form-options';

function vehicleId(raw: string | undefined): number {
  const id = Number(raw);
  if (!Number.isInteger(id) || id <= 0) throw data({ code: 'not_found' }, { status: 404 });
  return id;
}

/** Checks the role, then starts loading the vehicle so the page opens with its data. */
export function vehicleLoader(queryClient: QueryClient, roles: readonly Role[]) {
  const guard = requireRole(queryClient, roles);
  return async (args: LoaderFunctionArgs) => {
    await guard(args);
    const id = vehicleId(args.params.vehicleId);
    // Errors are shown by the page itself, next to the header, so they are not thrown here.
    await queryClient.ensureQueryData(vehicleQueryOptions(id)).catch(() => undefined);
    return null;
  };
}

/** One vehicle: its dampers by corner, inspections, recent trips and suspension spec. */
export function VehiclePage() {
  const id = vehicleId(useParams().vehicleId);
  const query = useVehicle(id);
  const back = { to: pages.vehicles.path, label: 'Vehicles' };

  if (query.isPending) return <LoadingState label="Loading the vehicle…" />;
  if (query.error) {
    return (
      <>
        <PageHeader title="Vehicle" back={back} />
        <ErrorState error={query.error} what="this vehicle" onRetry={() => void query.refetch()} />
      </>
    );
  }
  return <VehicleDetailView detail={query.data} back={back} />;
}

function VehicleDetailView({ detail, back }: { detail: VehicleDetail; back: { to: string; label: string } }) {
  const { vehicle, spec } = detail;
  const me = useQuery(meQueryOptions());
  const isManager = me.data?.role === 'manager';
  const [editing, setEditing] = useState(false);
  const formOptions = useVehicleFormOptions(isManager && editing);
  return (
    <>
      <title>{`${vehicle.fleetNumber} · Vehicles · Reboundry`}</title>
      <PageHeader
        back={back}
        eyebrow="Vehicle"
        title={vehicle.fleetNumber}
        badges={<VehicleStatusBadge status={vehicle.status} size="md" />}
        actions={
          isManager ? (
            <Button onClick={() => setEditing(true)}>Edit vehicle</Button>
          ) : null
        }
      />
      {isManager ? <VehicleFormDialog open={editing} onClose={() => setEditing(false)} vehicle={vehicle} options={formOptions} /> : null}
      <VehicleFacts detail={detail} className="mb-8 rounded-md border border-line bg-surface px-4 py-3.5" />

      <div className="grid gap-x-8 lg:grid-cols-[minmax(0,7fr)_minmax(0,5fr)]">
        <Section title="Dampers by corner" description="As seen from above, front at the top.">
          <DamperCorners dampers={detail.dampers} axles={spec.axles} threshold={detail.inspectionThreshold} />
        </Section>
        <div>
          <Section title="Inspections" className="lg:mt-0">
            <VehicleInspections inspections={detail.inspections} />
          </Section>
          <Section title="Replaced dampers">
            <DamperHistory dampers={detail.dampers} />
          </Section>
        </div>
      </div>

      {me.data && me.data.role !== 'driver' ? <VehicleWorkshopPanel vehicleId={vehicle.id} workRecordPath={workRecordPath} /> : null}

      <VehicleWear vehicleId={vehicle.id} />

      <Section title="Recent trips" description="What the dampers went through: route, distance, speed and load.">
        <RecentTrips trips={detail.recentTrips} />
      </Section>

      <Section title={`Suspension spec: ${spec.name}`} description={[spec.vehicleClass, spec.description].filter(Boolean).join(' — ')}>
        <SpecCornerTable axles={spec.axles} />
      </Section>
    </>
  );
}
