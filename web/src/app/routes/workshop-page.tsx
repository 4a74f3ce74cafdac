import { Link } from 'react-router';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { Section } from '@/components/ui/section';
import { QueryState } from '@/components/ui/query-state';
import { useVehicles } from '@/features/vehicles/api/get-vehicles';
import { VehiclesTable } from '@/features/vehicles/components/vehicles-table';
import { useVehicleListParams } from '@/features/vehicles/hooks/use-vehicle-list-params';
import { formatQuantity } from '@/lib/format';
import { inspectionPath, vehiclePath } from '../navigation';
import { MyInspections } from '@/features/workshop/components/my-inspections';
import { useVehicleFilterOptions } from './use-vehicle-filter-options';

/** The mechanic's start page, laid out for a tablet in the workshop. */
export function WorkshopPage() {
  const [params, update] = useVehicleListParams();
  const options = useVehicleFilterOptions();
  const inWorkshop = useVehicles({ page: 1, pageSize: 12, sort: 'fleetNumber', status: 'workshop' });

  return (
    <>
      <title>Workshop · Reboundry</title>
      <PageHeader title="Workshop" description="Vehicles in the workshop now, and the whole fleet to look up any vehicle." />
      <Section title="My inspections" description="Assigned to you or your depot, soonest first. Tap one to record the test lane, photos and parts.">
        <MyInspections inspectionPath={inspectionPath} />
      </Section>

      <Section title="In the workshop now">
        <QueryState query={inWorkshop} loading="Loading vehicles in the workshop…" what="the vehicles in the workshop" retry>
          {(data) =>
            data.items.length === 0 ? (
              <EmptyState title="No vehicles are in the workshop">When a vehicle is booked in, it is listed here.</EmptyState>
            ) : (
              <ul className="grid gap-3 sm:grid-cols-2 xl:grid-cols-3">
                {data.items.map((v) => (
                  <li key={v.id}>
                    <Link
                      to={vehiclePath(v.id)}
                      className="flex min-h-20 items-center justify-between gap-3 rounded-md border border-line bg-surface px-4 py-3 hover:border-slate"
                    >
                      <span className="min-w-0">
                        <span className="flex items-baseline gap-2">
                          <span className="text-lg font-semibold text-ink">{v.fleetNumber}</span>
                          <span className="font-mono text-sm text-slate">{v.plate}</span>
                        </span>
                        <span className="block text-sm text-slate">
                          {v.specName} · {v.depotName}
                        </span>
                        <span className="tabular block text-sm text-slate">Odometer {formatQuantity(v.odometerKm, 'km')}</span>
                      </span>
                      <span aria-hidden="true" className="text-xl text-slate">›</span>
                    </Link>
                  </li>
                ))}
              </ul>
            )
          }
        </QueryState>
        {inWorkshop.data && inWorkshop.data.total > inWorkshop.data.items.length ? (
          <p className="mt-2 text-sm text-slate">
            Showing {inWorkshop.data.items.length} of {inWorkshop.data.total}.{' '}
            <Link className="link" to="?status=workshop#all-vehicles">
              See them all in the table
            </Link>
          </p>
        ) : null}
      </Section>

      <Section title="All vehicles" className="scroll-mt-20">
        <div id="all-vehicles" />
        <VehiclesTable params={params} onParamsChange={update} vehiclePath={vehiclePath} roomy {...options} />
      </Section>
    </>
  );
}
