import { useState } from 'react';
import { ErrorState } from '@/components/ui/error-state';
import { LoadingState } from '@/components/ui/loading-state';
import { Section } from '@/components/ui/section';
import { SimpleTable } from '@/components/ui/simple-table';
import { Button } from '@/components/ui/button';
import { formatDate, formatNumber } from '@/lib/format';
import { useExposureOverview } from '../api/get-exposure-overview';
import { ExposureCaution } from './exposure-caution';
import { ExposureStatusBadge } from './exposure-status';
import { DriverExposure } from './my-exposure';

/** Rows of the days-above list shown before "show all". */
const DAYS_SHOWN = 15;

/** The manager's view: every driver, the days above the action value, and what contributes most. */
export function ExposureOverview() {
  const q = useExposureOverview({});
  const [driverId, setDriverId] = useState<number | null>(null);
  const [allDays, setAllDays] = useState(false);
  if (q.isPending) return <LoadingState label="Loading drivers’ exposure…" />;
  if (q.error) return <ErrorState error={q.error} what="drivers’ exposure" onRetry={() => void q.refetch()} />;
  const d = q.data;
  const contribCols = (what: string) => [
    { key: 'name', header: what, rowHeader: true, cell: (r: (typeof d.routes)[number]) => r.name },
    { key: 'above', header: 'Share of dose on days above action', unit: '%', numeric: true, cell: (r: (typeof d.routes)[number]) => formatNumber(r.shareAbovePct, 0) },
    { key: 'share', header: 'Share of all dose', unit: '%', numeric: true, cell: (r: (typeof d.routes)[number]) => formatNumber(r.sharePct, 0) },
    { key: 'aw', header: 'Mean a_w at the seat', unit: 'm/s²', numeric: true, cell: (r: (typeof d.routes)[number]) => formatNumber(r.meanWeightedAccel, 2) },
    { key: 'hours', header: 'Driving', unit: 'h', numeric: true, cell: (r: (typeof d.routes)[number]) => formatNumber(r.hours, 0) },
  ];
  return (
    <div className="flex flex-col gap-2">
      <ExposureCaution text={d.caution} method={d.method} />
      <p className="text-sm text-slate">
        {formatDate(d.from)} – {formatDate(d.to)}. Dose = a_w² × hours, the quantity A(8) adds up.
      </p>
      <Section title="Drivers">
        {d.drivers.length ? (
          <SimpleTable
            label="Drivers"
            rows={d.drivers}
            getRowKey={(r) => r.driverId}
            columns={[
              { key: 'name', header: 'Driver', rowHeader: true, cell: (r) => r.name },
              { key: 'max', header: 'Highest A(8)', unit: 'm/s²', numeric: true, cell: (r) => formatNumber(r.maxA8, 2) },
              { key: 'above', header: 'Days above action', numeric: true, cell: (r) => String(r.daysAboveAction) },
              { key: 'limit', header: 'Days above limit', numeric: true, cell: (r) => String(r.daysAboveLimit) },
              { key: 'days', header: 'Days driven', numeric: true, cell: (r) => String(r.daysDriven) },
              { key: 'open', header: '', cell: (r) => <Button size="sm" variant="quiet" onClick={() => setDriverId(r.driverId === driverId ? null : r.driverId)}>{r.driverId === driverId ? 'Hide days' : 'Show days'}</Button> },
            ]}
          />
        ) : (
          <p className="text-sm text-slate">No figures yet: they appear after the nightly calculation has run over drivers’ trips.</p>
        )}
        {driverId !== null ? (
          <div className="mt-4 rounded-md border border-line p-3">
            <h3 className="mb-2 font-semibold text-ink">{d.drivers.find((x) => x.driverId === driverId)?.name}: last 30 days</h3>
            <DriverExposure driverId={driverId} />
          </div>
        ) : null}
      </Section>
      <Section title={`Days above the action value (${d.daysAbove.length})`}>
        {d.daysAbove.length ? (
          <>
            <p className="mb-2 text-sm text-slate">Highest A(8) first{d.daysAbove.length > DAYS_SHOWN && !allDays ? `; the ${DAYS_SHOWN} highest of ${d.daysAbove.length} shown` : ''}.</p>
            <SimpleTable
              label="Days above the action value"
              rows={allDays ? d.daysAbove : d.daysAbove.slice(0, DAYS_SHOWN)}
              getRowKey={(r) => `${r.driverId}-${r.day}`}
              columns={[
                { key: 'day', header: 'Day', cell: (r) => formatDate(r.day) },
                { key: 'name', header: 'Driver', rowHeader: true, cell: (r) => r.name },
                { key: 'a8', header: 'A(8)', unit: 'm/s²', numeric: true, cell: (r) => formatNumber(r.a8, 2) },
                { key: 'seat', header: 'Floor to seat', numeric: true, cell: (r) => r.seatFactor ?? '—' },
                { key: 'st', header: 'Against the values', cell: (r) => <ExposureStatusBadge a8={r.a8} action={d.actionValue} limit={d.limitValue} /> },
                { key: 'h', header: 'Driving', unit: 'h', numeric: true, cell: (r) => formatNumber(r.hours, 1) },
                { key: 'route', header: 'Main route', cell: (r) => r.topRoute ?? '—' },
                { key: 'veh', header: 'Vehicle', cell: (r) => r.topVehicle ?? '—' },
              ]}
            />
            {d.daysAbove.length > DAYS_SHOWN ? (
              <Button className="mt-2" size="sm" variant="quiet" onClick={() => setAllDays((v) => !v)} aria-expanded={allDays}>
                {allDays ? `Show the ${DAYS_SHOWN} highest only` : `Show all ${d.daysAbove.length} days`}
              </Button>
            ) : null}
          </>
        ) : (
          <p className="text-sm text-slate">No driver’s day was above the action value of {d.actionValue} m/s² in this period.</p>
        )}
      </Section>
      <div className="mt-8 grid gap-4 xl:grid-cols-2">
        <div>
          <Section title="Routes that contribute most">{d.routes.length ? <SimpleTable label="Routes that contribute most" rows={d.routes} columns={contribCols('Route')} /> : <p className="text-sm text-slate">—</p>}</Section>
        </div>
        <div>
          <Section title="Vehicles that contribute most">{d.vehicles.length ? <SimpleTable label="Vehicles that contribute most" rows={d.vehicles} columns={contribCols('Vehicle')} /> : <p className="text-sm text-slate">—</p>}</Section>
        </div>
      </div>
    </div>
  );
}
