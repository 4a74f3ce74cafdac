import { lazy, Suspense, useState } from 'react';
import { Link } from 'react-router';
import { Button } from '@/components/ui/button';
import { type Depot, useDepots } from '@/features/depots/api/get-depots';
import { ButtonLink } from '@/components/ui/button';
import { ErrorState } from '@/components/ui/error-state';
import { FigureCard } from '@/components/ui/figure-card';
import { PageHeader } from '@/components/ui/page-header';
import { Section } from '@/components/ui/section';
import { StatusShape } from '@/components/ui/status-badge';
import { QueryState } from '@/components/ui/query-state';
import { DepotsTable } from '@/features/depots/components/depots-table';
import { VEHICLE_STATUSES } from '@/features/vehicles/api/get-vehicles';
import { vehicleStatusLabels, vehicleStatusTones } from '@/features/vehicles/components/vehicle-status-badge';
import { useVehicleCounts } from '@/features/vehicles/hooks/use-vehicle-counts';
import { useDueInspections } from '@/features/inspections/api/get-due-inspections';
import { formatNumber } from '@/lib/format';
import { pages } from '../navigation';

// The depot form carries a map (leaflet): loaded when it is opened, not with the overview.
const DepotFormDialog = lazy(() => import('@/features/depots/components/depot-form').then((m) => ({ default: m.DepotFormDialog })));

const statusNotes = {
  in_service: 'On the road and counted in the nightly wear run.',
  workshop: 'Off the road for inspection or repair.',
  retired: 'Kept for their history; not driven.',
};

/** The fleet at a glance: vehicles by status, inspections coming due, depots. */
export function FleetPage() {
  const counts = useVehicleCounts();
  const depots = useDepots();
  const due = useDueInspections(null);
  const dc = due.data?.counts;
  const [depotForm, setDepotForm] = useState<{ open: boolean; depot?: Depot }>({ open: false });
  const list = depots.data?.items ?? [];
  const near: [number, number] = list.length ? [list.reduce((s, d) => s + d.lat, 0) / list.length, list.reduce((s, d) => s + d.lon, 0) / list.length] : [52.56, -1.4];

  return (
    <>
      <title>Fleet · Reboundry</title>
      <PageHeader
        title="Fleet"
        description="Your vehicles by status and depot, and the inspections coming due."
        actions={
          <ButtonLink to={pages.vehicles.path} variant="primary">
            Open the vehicles table
          </ButtonLink>
        }
      />

      <Section title="Vehicles by status">
        {counts.error ? (
          <ErrorState error={counts.error} what="the vehicle counts" onRetry={counts.refetch} />
        ) : (
          <div className="grid gap-3 sm:grid-cols-3">
            {VEHICLE_STATUSES.map((status) => (
              <FigureCard
                key={status}
                icon={<StatusShape tone={vehicleStatusTones[status]} />}
                label={vehicleStatusLabels[status]}
                value={counts.isPending ? '…' : formatNumber(counts.counts[status])}
                unit={counts.counts[status] === 1 ? 'vehicle' : 'vehicles'}
                footer={
                  <>
                    {statusNotes[status]}{' '}
                    <Link to={`${pages.vehicles.path}?status=${status}`} className="link whitespace-nowrap text-ink">
                      List them
                    </Link>
                  </>
                }
              />
            ))}
          </div>
        )}
      </Section>

      <Section
        title="Inspections"
        actions={
          <ButtonLink to={pages.due.path} size="sm">
            Open the due list
          </ButtonLink>
        }
      >
        {due.error ? (
          <ErrorState error={due.error} what="the due inspections" onRetry={() => void due.refetch()} />
        ) : (
          <div className="grid gap-3 sm:grid-cols-3">
            <FigureCard icon={<StatusShape tone="overdue" />} label="Overdue" value={dc ? formatNumber(dc.overdue) : '…'} unit={dc?.overdue === 1 ? 'vehicle' : 'vehicles'} footer="Past the due date." />
            <FigureCard icon={<StatusShape tone="due" />} label="Due now" value={dc ? formatNumber(dc.due) : '…'} unit={dc?.due === 1 ? 'vehicle' : 'vehicles'} footer="Due within the next few days." />
            <FigureCard
              icon={<StatusShape tone="watch" />}
              label="Next 30 days"
              value={dc ? formatNumber(dc.next30) : '…'}
              unit={dc?.next30 === 1 ? 'vehicle' : 'vehicles'}
              footer="From predicted wear and the interval rule."
            />
          </div>
        )}
      </Section>

      <Section
        title="Depots"
        actions={
          <Button size="sm" onClick={() => setDepotForm({ open: true })}>
            Add a depot
          </Button>
        }
      >
        <QueryState query={depots} loading="Loading depots…" what="the depots" retry>
          {(data) => (
            <DepotsTable depots={data.items} vehiclesPath={(id) => `${pages.vehicles.path}?depotId=${id}`} onEdit={(depot) => setDepotForm({ open: true, depot })} />
          )}
        </QueryState>
      </Section>
      {depotForm.open ? (
        <Suspense fallback={null}>
          <DepotFormDialog open depot={depotForm.depot} near={near} others={list} onClose={() => setDepotForm({ open: false })} />
        </Suspense>
      ) : null}
    </>
  );
}
