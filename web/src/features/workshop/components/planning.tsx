import { useState } from 'react';
import { Link } from 'react-router';
import { Button } from '@/components/ui/button';
import { ErrorState } from '@/components/ui/error-state';
import { LoadingState } from '@/components/ui/loading-state';
import { Section } from '@/components/ui/section';
import { SimpleTable } from '@/components/ui/simple-table';
import { StatusBadge } from '@/components/ui/status-badge';
import { InspectionStatusBadge } from '@/components/ui/inspection-status-badge';
import { Caution } from '@/components/ui/caution';
import { formatDate, formatNumber } from '@/lib/format';
import { useInspections } from '../api/get-inspections';
import { useAssignInspection } from '../api/assign-inspection';
import { useForecast } from '../api/get-forecast';
import { useWorkload } from '../api/get-workload';


/** Open inspections with a mechanic/depot picker each. */
export function AssignInspections({ mechanics, depots, vehiclePath }: { mechanics: { id: number; name: string; depotId: number | null }[]; depots: { id: number; name: string }[]; vehiclePath: (id: number) => string }) {
  const [page, setPage] = useState(1);
  const q = useInspections({ status: 'open', pageSize: 15, page });
  const assign = useAssignInspection();
  if (q.isPending) return <LoadingState label="Loading open inspections…" />;
  if (q.error) return <ErrorState error={q.error} what="open inspections" onRetry={() => void q.refetch()} />;
  return (
    <>
      <SimpleTable
        label="Open inspections"
        rows={q.data.items}
        columns={[
          { key: 'd', header: 'Due', cell: (i) => formatDate(i.dueDate) },
          { key: 's', header: 'Status', cell: (i) => <InspectionStatusBadge status={i.status} /> },
          { key: 'v', header: 'Vehicle', rowHeader: true, cell: (i) => <Link className="link" to={vehiclePath(i.vehicle.id)}>{i.vehicle.fleetNumber}</Link> },
          { key: 'r', header: 'Reason', cell: (i) => <span className="line-clamp-2 max-w-md">{i.reason}</span> },
          {
            key: 'm',
            header: 'Mechanic',
            cell: (i) => (
              <select
                aria-label={`Mechanic for ${i.vehicle.fleetNumber}`}
                className="min-h-9 rounded border border-line bg-surface px-2"
                value={i.assignee?.id ?? ''}
                onChange={(e) => assign.mutate({ id: i.id, assigneeId: e.target.value ? Number(e.target.value) : null })}
              >
                <option value="">— nobody —</option>
                {mechanics.map((m) => (
                  <option key={m.id} value={m.id}>
                    {m.name}
                  </option>
                ))}
              </select>
            ),
          },
          {
            key: 'dep',
            header: 'Depot',
            cell: (i) => (
              <select
                aria-label={`Depot for ${i.vehicle.fleetNumber}`}
                className="min-h-9 rounded border border-line bg-surface px-2"
                value={i.depot.assignedDirectly ? i.depot.id : ''}
                onChange={(e) => assign.mutate({ id: i.id, depotId: e.target.value ? Number(e.target.value) : null })}
              >
                <option value="">vehicle&apos;s own ({i.depot.assignedDirectly ? '…' : i.depot.name})</option>
                {depots.map((d) => (
                  <option key={d.id} value={d.id}>
                    {d.name}
                  </option>
                ))}
              </select>
            ),
          },
        ]}
      />
      {assign.error ? <p role="alert" className="text-sm text-overdue">{(assign.error as Error).message}</p> : null}
      <div className="mt-2 flex items-center gap-2 text-sm">
        <Button size="sm" disabled={page <= 1} onClick={() => setPage((p) => p - 1)}>
          Previous
        </Button>
        <span>
          Page {page} of {Math.max(1, Math.ceil(q.data.total / 15))} ({q.data.total} open)
        </span>
        <Button size="sm" disabled={page * 15 >= q.data.total} onClick={() => setPage((p) => p + 1)}>
          Next
        </Button>
      </div>
    </>
  );
}

export function WorkloadTable() {
  const q = useWorkload(8);
  if (q.isPending) return <LoadingState label="Loading workload…" />;
  if (q.error) return <ErrorState error={q.error} what="the workload" />;
  return (
    <SimpleTable
      label="Open inspections per depot and week"
      rows={q.data.depots}
      getRowKey={(d) => d.depotId}
      columns={[
        { key: 'n', header: 'Depot', rowHeader: true, cell: (d) => d.depotName },
        { key: 'm', header: 'Mechanics', numeric: true, cell: (d) => d.mechanics },
        { key: 'o', header: 'Overdue', numeric: true, cell: (d) => (d.overdue ? <StatusBadge tone="overdue">{d.overdue}</StatusBadge> : 0) },
        ...q.data.weekStarts.map((w, k) => ({ key: w, header: `wk of ${formatDate(w)}`, numeric: true, cell: (d: (typeof q.data.depots)[number]) => d.weeks[k].inspections })),
        { key: 'u', header: 'Unassigned', numeric: true, cell: (d) => d.unassigned },
      ]}
    />
  );
}

export function ForecastTables() {
  const q = useForecast(90);
  if (q.isPending) return <LoadingState label="Loading the forecast…" />;
  if (q.error) return <ErrorState error={q.error} what="the forecast" />;
  const f = q.data;
  return (
    <>
      <p className="mb-2 text-sm text-slate">
        {formatDate(f.from)} to {formatDate(f.to)}: about <strong className="tabular text-ink">{formatNumber(f.totals.replacements, 1)}</strong> damper replacements expected, about{' '}
        <strong className="tabular text-ink">£{formatNumber(f.totals.cost)}</strong> in parts.{' '}
        <a className="link" href="/api/forecast?format=csv" download>
          Download CSV
        </a>
      </p>
      <SimpleTable
        label="Forecast of damper replacements by spec and depot"
        rows={f.rows}
        getRowKey={(r) => `${r.specId}-${r.depotId}`}
        columns={[
          { key: 's', header: 'Spec', rowHeader: true, cell: (r) => r.specName },
          { key: 'd', header: 'Depot', cell: (r) => r.depotName },
          { key: 'n', header: 'Expected replacements', numeric: true, cell: (r) => formatNumber(r.replacements, 1) },
          { key: 'c', header: 'Parts cost', unit: '£', numeric: true, cell: (r) => (r.costKnown ? formatNumber(r.cost) : `${formatNumber(r.cost)} + unknown`) },
        ]}
      />
      <p className="mt-2 text-sm text-slate">
        {f.method} Cost per damper: {f.costBasis.map((c) => `${c.specName}: £${formatNumber(c.cost)} (${c.basis})`).join('; ') || 'no history yet'}.
      </p>
      <Caution className="mt-2">A forecast for planning, not a decision to replace: inspect before replacing, and follow the manufacturer&apos;s and local regulations&apos; requirements.</Caution>
    </>
  );
}

export function PlanningSections(props: Parameters<typeof AssignInspections>[0]) {
  return (
    <>
      <Section title="Assign inspections">
        <AssignInspections {...props} />
      </Section>
      <Section title="Workload per depot and week">
        <WorkloadTable />
      </Section>
      <Section title="Damper replacements in the next 90 days">
        <ForecastTables />
      </Section>
    </>
  );
}
