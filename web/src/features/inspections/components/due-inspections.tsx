import { Link } from 'react-router';
import { Caution } from '@/components/ui/caution';
import { EmptyState } from '@/components/ui/empty-state';
import { Section } from '@/components/ui/section';
import { SimpleTable, type SimpleColumn } from '@/components/ui/simple-table';
import { InspectionStatusBadge } from '@/components/ui/inspection-status-badge';
import { inspectionStatusTones, inspectionStatusWords } from '@/lib/inspection-status';
import { formatDate, formatPercent } from '@/lib/format';
import type { DueInspection, DueInspections } from '../api/get-due-inspections';

export const inspectionTones: Record<string, (typeof inspectionStatusTones)[keyof typeof inspectionStatusTones]> = inspectionStatusTones;
export const inspectionLabels: Record<string, string> = inspectionStatusWords;
const ruleLabels: Record<string, string> = { prediction: 'Predicted wear', interval_km: 'Interval (km)', interval_months: 'Interval (months)', manual: 'Entered by hand', follow_up: 'Follow-up' };

function daysText(d: number) {
  if (d < 0) return `${-d} overdue`;
  if (d === 0) return 'today';
  return String(d);
}

const columns = (vehiclePath: (id: number) => string): SimpleColumn<DueInspection>[] => [
  {
    key: 'vehicle',
    header: 'Vehicle',
    rowHeader: true,
    cell: (r) => (
      <Link to={vehiclePath(r.vehicleId)} className="link font-medium whitespace-nowrap text-ink">
        {r.fleetNumber}
        <span className="block text-xs font-normal text-slate">{r.plate}</span>
      </Link>
    ),
  },
  { key: 'status', header: 'Status', cell: (r) => <InspectionStatusBadge status={r.status} /> },
  { key: 'due', header: 'Due', cell: (r) => <span className="whitespace-nowrap">{formatDate(r.dueDate)}</span> },
  { key: 'days', header: 'Due in', unit: 'days', numeric: true, cell: (r) => daysText(r.daysLeft) },
  { key: 'life', header: 'Most-worn damper', unit: '% of life', numeric: true, cell: (r) => formatPercent(r.maxLifeUsed) },
  { key: 'depot', header: 'Depot', cell: (r) => <span className="whitespace-nowrap">{r.depotName}</span> },
  {
    key: 'reason',
    header: 'Why',
    className: 'min-w-[22rem]',
    cell: (r) => (
      <span>
        {r.trigger ? <span className="mr-1.5 text-xs font-semibold tracking-wide text-slate uppercase">{ruleLabels[r.trigger] ?? r.trigger}</span> : null}
        {r.reason}
      </span>
    ),
  },
  { key: 'assignee', header: 'Mechanic', cell: (r) => r.assignee?.name ?? <span className="text-slate">not assigned</span> },
];

const groups: { id: string; title: string; description: string; pick: (r: DueInspection) => boolean }[] = [
  { id: 'overdue', title: 'Overdue', description: 'Past their due date and not yet done.', pick: (r) => r.status === 'overdue' },
  { id: 'due', title: 'Due now', description: 'Due within the next few days.', pick: (r) => r.status === 'due' },
  { id: 'next30', title: 'Next 30 days', description: 'Scheduled, due within 30 days.', pick: (r) => r.status === 'scheduled' && r.daysLeft <= 30 },
  { id: 'next90', title: 'In 31–90 days', description: 'Scheduled further ahead.', pick: (r) => r.status === 'scheduled' && r.daysLeft > 30 && r.daysLeft <= 90 },
  { id: 'later', title: 'Later', description: 'More than 90 days ahead: entered by hand, or a follow-up the mechanic set.', pick: (r) => r.status === 'scheduled' && r.daysLeft > 90 },
];

/** The due list, grouped: overdue, due, next 30 days, 31–90 days. */
export function DueInspectionsList({ data, vehiclePath }: { data: DueInspections; vehiclePath: (id: number) => string }) {
  const cols = columns(vehiclePath);
  if (!data.items.length) {
    return (
      <EmptyState title="No open inspections">
        Nothing is due. The nightly run schedules an inspection {data.rules.leadDays} days before a damper is predicted to reach{' '}
        {formatPercent(data.rules.threshold)} of its life, or by the interval rule ({data.rules.intervalKm.toLocaleString('en-GB')} km or{' '}
        {data.rules.intervalMonths} months). Run it now from the Job runs page.
      </EmptyState>
    );
  }
  return (
    <>
      <Caution className="mb-6">
        Due dates from predicted wear are estimates from a model of the vehicle and its roads. They support, and never replace, inspection by a
        qualified mechanic, the vehicle and damper makers’ requirements and local regulations.
      </Caution>
      {data.sort === 'lifeUsed' ? (
        <Section title={`All open inspections (${data.items.length})`} description="Most-worn damper first: the highest share of its expected life used on each vehicle.">
          <SimpleTable label="Open inspections by life used" columns={cols} rows={data.items} />
        </Section>
      ) : null}
      {data.sort === 'lifeUsed' ? null : groups.map((g) => {
        const rows = data.items.filter(g.pick);
        if (!rows.length) return null;
        return (
          <Section key={g.id} title={`${g.title} (${rows.length})`} description={g.description}>
            <SimpleTable label={`${g.title} inspections`} columns={cols} rows={rows} />
          </Section>
        );
      })}
    </>
  );
}
