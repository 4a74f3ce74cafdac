import { useMemo } from 'react';
import { Link } from 'react-router';
import { createColumnHelper } from '@tanstack/react-table';
import { DataTable, pagedTableProps } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/empty-state';
import { SelectField } from '@/components/ui/field';
import { FilterBar } from '@/components/ui/filter-bar';
import { RoughnessClassBadge, RoughnessLegend } from '@/components/ui/roughness';
import { formatDate, formatNumber } from '@/lib/format';
import { ROUGHNESS_CLASSES, roughnessWords, type RoughnessClass } from '@/lib/roughness';
import { ROUGHNESS_SOURCES, useSegments, type RoughnessSource, type SegmentListItem, type SegmentListParams } from '../api/get-segments';
import { ROUGHNESS_SOURCE_WORDS } from '@contracts/roads';
import { segmentsExportUrl } from '../api/export-segments';
import { useRoutes } from '../api/get-routes';

/** How a segment's roughness was found, in the app's words (server/contracts/roads.ts). */
export const sourceLabels = ROUGHNESS_SOURCE_WORDS;

const col = createColumnHelper<SegmentListItem>();

/** Every route segment with its current roughness and speed; paged, sorted and filtered on the server. */
export function SegmentsTable({
  params,
  onParamsChange,
  routePath,
  mapPath,
}: {
  params: SegmentListParams;
  onParamsChange: (patch: Partial<SegmentListParams>) => void;
  routePath: (id: number) => string;
  /** The map, opened on one segment. */
  mapPath: (segmentId: number) => string;
}) {
  const query = useSegments(params);
  const routes = useRoutes({ page: 1, pageSize: 200, sort: 'name' });

  const columns = useMemo(
    () => [
      col.accessor('routeName', {
        header: 'Route',
        cell: (c) => (
          <Link to={routePath(c.row.original.routeId)} className="link font-medium">
            {c.getValue()}
          </Link>
        ),
      }),
      col.accessor('seq', {
        header: 'Segment',
        meta: { numeric: true, label: 'Segment number' },
        cell: (c) => formatNumber(c.getValue() + 1),
      }),
      col.display({
        id: 'span',
        header: 'From – to',
        meta: { numeric: true, unit: 'km', label: 'From – to' },
        cell: (c) => `${formatNumber(c.row.original.startM / 1000, 2)}–${formatNumber(c.row.original.endM / 1000, 2)}`,
      }),
      col.accessor('isoClass', {
        header: 'Class',
        meta: { label: 'ISO 8608 class' },
        cell: (c) => <RoughnessClassBadge value={c.getValue()} />,
      }),
      col.accessor('iri', {
        header: 'IRI',
        meta: { numeric: true, unit: 'm/km' },
        cell: (c) => (c.getValue() === null ? <span className="text-slate">—</span> : formatNumber(c.getValue(), 2)),
      }),
      col.accessor('roughnessSource', {
        header: 'Source',
        enableSorting: false,
        cell: (c) => (c.getValue() ? sourceLabels[c.getValue()!] : <span className="text-slate">None yet</span>),
      }),
      col.accessor('roughnessDate', {
        id: 'roughnessDate',
        header: 'Observed',
        meta: { numeric: true },
        cell: (c) => formatDate(c.getValue()),
      }),
      col.accessor('speedKmh', {
        header: 'Speed',
        meta: { numeric: true, unit: 'km/h' },
        cell: (c) => (
          <span>
            {formatNumber(c.getValue())}
            {c.row.original.speedSet ? null : <span className="ml-1 text-xs text-slate">route</span>}
          </span>
        ),
      }),
      col.display({
        id: 'map',
        header: () => <span className="sr-only">Map</span>,
        cell: (c) => (
          <Link to={mapPath(c.row.original.id)} className="link text-sm whitespace-nowrap" aria-label={`Segment ${c.row.original.seq + 1} of ${c.row.original.routeName} on the map`}>
            On the map
          </Link>
        ),
      }),
    ],
    [routePath, mapPath],
  );

  const filtered = Boolean(params.routeId || params.isoClass || params.source);
  const toolbar = (
    <FilterBar
      label="Filter segments"
      columns="md:grid-cols-[minmax(12rem,2fr)_repeat(2,minmax(9rem,1fr))_auto]"
      filtered={filtered}
      onClear={() => onParamsChange({ routeId: undefined, isoClass: undefined, source: undefined })}
    >
      <SelectField
        label="Route"
        value={params.routeId ? String(params.routeId) : ''}
        onChange={(e) => onParamsChange({ routeId: e.target.value ? Number(e.target.value) : undefined })}
        options={[{ value: '', label: 'All routes' }, ...(routes.data?.items ?? []).map((r) => ({ value: String(r.id), label: r.name }))]}
        className="col-span-2 md:col-span-1"
      />
      <SelectField
        label="ISO 8608 class"
        value={params.isoClass ?? ''}
        onChange={(e) => onParamsChange({ isoClass: (e.target.value || undefined) as RoughnessClass | undefined })}
        options={[{ value: '', label: 'Any class' }, ...ROUGHNESS_CLASSES.map((c) => ({ value: c, label: `${c} — ${roughnessWords[c]}` }))]}
      />
      <SelectField
        label="Source"
        value={params.source ?? ''}
        onChange={(e) => onParamsChange({ source: (e.target.value || undefined) as RoughnessSource | undefined })}
        options={[{ value: '', label: 'Any source' }, ...ROUGHNESS_SOURCES.map((s) => ({ value: s, label: sourceLabels[s] }))]}
      />
    </FilterBar>
  );

  return (
    <div className="flex flex-col gap-3">
      <DataTable
        columns={columns}
        {...pagedTableProps(query, params, onParamsChange, { noun: ['segment', 'segments'], exportUrl: segmentsExportUrl(params) })}
        toolbar={toolbar}
        empty={
          filtered ? (
            <EmptyState title="No segments match these filters">Clear a filter, or pick another route or class.</EmptyState>
          ) : (
            <EmptyState title="No segments yet">Segments appear once a route is added on the routes page.</EmptyState>
          )
        }
      />
      <RoughnessLegend unknown={false} />
      <p className="text-sm text-slate">“route” after a speed: the segment uses the route’s typical speed. Speeds feed the wear model; they are not driving advice.</p>
    </div>
  );
}
