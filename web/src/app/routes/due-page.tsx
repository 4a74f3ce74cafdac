import { lazy, Suspense, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { ButtonLink } from '@/components/ui/button';
import { FigureCard } from '@/components/ui/figure-card';
import { LoadingState } from '@/components/ui/loading-state';
import { PageHeader } from '@/components/ui/page-header';
import { SelectField } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { StatusShape } from '@/components/ui/status-badge';
import { QueryState } from '@/components/ui/query-state';
import { formatDate } from '@/lib/format';
import { useDepots } from '@/features/depots/api/get-depots';
import { useDueInspections, type DueSort } from '@/features/inspections/api/get-due-inspections';
import { DueInspectionsList } from '@/features/inspections/components/due-inspections';
import { mapDataQueryOptions } from '@/features/map/api/get-map-data';
import { formatNumber } from '@/lib/format';
import { pages, vehiclePath } from '../navigation';

// The map (leaflet) loads when the map view is chosen, not with the manager's start page.
const DueMap = lazy(() => import('@/features/inspections/components/due-map').then((m) => ({ default: m.DueMap })));

/** The fleet manager's home: inspections overdue, due, and coming in the next 30 and 90 days. */
export function DuePage() {
  const [depotId, setDepotId] = useState<number | null>(null);
  const [mode, setMode] = useState<'list' | 'map'>('list');
  const [sort, setSort] = useState<DueSort>('due');
  const due = useDueInspections(depotId, sort);
  const depots = useDepots();
  const c = due.data?.counts;
  const roads = useQuery({ ...mapDataQueryOptions(), enabled: mode === 'map' });

  return (
    <>
      <title>Due inspections · Reboundry</title>
      <PageHeader
        title="Due inspections"
        description="Which vehicles need their dampers and springs checked, why, and how soon — from the roads they drive and the interval rule."
        actions={
          <>
            <ButtonLink to={pages.jobs.path} variant="secondary">
              Job runs
            </ButtonLink>
            <ButtonLink to={pages.outbox.path} variant="secondary">
              Outbox
            </ButtonLink>
          </>
        }
      />
      <div className="mb-6 grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <FigureCard icon={<StatusShape tone="overdue" />} label="Overdue" value={c ? formatNumber(c.overdue) : '…'} unit="vehicles" />
        <FigureCard icon={<StatusShape tone="due" />} label="Due now" value={c ? formatNumber(c.due) : '…'} unit="vehicles" />
        <FigureCard icon={<StatusShape tone="watch" />} label="Next 30 days" value={c ? formatNumber(c.next30) : '…'} unit="vehicles" />
        <FigureCard icon={<StatusShape tone="neutral" />} label="In 31–90 days" value={c ? formatNumber(c.next90) : '…'} unit="vehicles" />
      </div>
      <div className="mb-6 flex flex-wrap items-end gap-4">
        <SelectField
          label="Depot"
          className="w-64"
          value={depotId === null ? '' : String(depotId)}
          onChange={(e) => setDepotId(e.target.value ? Number(e.target.value) : null)}
          options={[{ value: '', label: 'All depots' }, ...(depots.data?.items ?? []).map((d) => ({ value: String(d.id), label: d.name }))]}
        />
        <SelectField
          label="Order by"
          className="w-48"
          value={sort}
          onChange={(e) => setSort(e.target.value === 'lifeUsed' ? 'lifeUsed' : 'due')}
          options={[
            { value: 'due', label: 'Due date' },
            { value: 'lifeUsed', label: 'Life used' },
          ]}
        />
        <div className="flex gap-2" role="group" aria-label="View">
          <Button variant={mode === 'list' ? 'primary' : 'secondary'} aria-pressed={mode === 'list'} onClick={() => setMode('list')}>
            List
          </Button>
          <Button variant={mode === 'map' ? 'primary' : 'secondary'} aria-pressed={mode === 'map'} onClick={() => setMode('map')}>
            Map
          </Button>
        </div>
        {due.data ? <p className="text-sm text-slate">As of <time dateTime={due.data.today}>{formatDate(due.data.today)}</time>.</p> : null}
      </div>
      <QueryState query={due} loading="Loading due inspections…" what="the due inspections" retry>
        {(result) =>
          mode === 'map' ? (
            <Suspense fallback={<LoadingState label="Loading the map…" />}>
              <DueMap items={result.items} roads={roads.data} vehiclePath={vehiclePath} />
            </Suspense>
          ) : (
            <DueInspectionsList data={result} vehiclePath={vehiclePath} />
          )
        }
      </QueryState>
    </>
  );
}
