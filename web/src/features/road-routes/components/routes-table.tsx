import { useMemo } from 'react';
import { Link } from 'react-router';
import { createColumnHelper } from '@tanstack/react-table';
import { DataTable, pagedTableProps } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/empty-state';
import { RoughnessClassBadge, RoughnessLegend } from '@/components/ui/roughness';
import { SearchField } from '@/components/ui/search-field';
import { formatNumber } from '@/lib/format';
import { useListSearchParams } from '@/lib/use-list-search-params';
import { routesExportUrl } from '../api/export-routes';
import { ROUTE_SORTS, useRoutes, type RouteListItem } from '../api/get-routes';

const col = createColumnHelper<RouteListItem>();

function readFilters(search: URLSearchParams) {
  return { q: search.get('q')?.trim() || undefined };
}

/** The fleet's routes with their length, usual speed, segment count and roughest stretch. */
export function RoutesTable() {
  const [params, update] = useListSearchParams({ sorts: ROUTE_SORTS, defaultSort: 'name', readFilters });
  const query = useRoutes(params);

  const columns = useMemo(
    () => [
      col.accessor('name', {
        header: 'Route',
        cell: (c) => (
          <span>
            <Link to={`/routes/${c.row.original.id}`} className="link font-medium">
              {c.getValue()}
            </Link>
            {c.row.original.description ? <span className="block text-[0.8125rem] text-slate">{c.row.original.description}</span> : null}
          </span>
        ),
      }),
      col.accessor('lengthKm', {
        // The server sorts by the stored length in metres.
        id: 'lengthM',
        header: 'Length',
        meta: { numeric: true, unit: 'km' },
        cell: (c) => formatNumber(c.getValue(), 1),
      }),
      col.accessor('defaultSpeedKmh', {
        header: 'Usual speed',
        enableSorting: false,
        meta: { numeric: true, unit: 'km/h' },
        cell: (c) => formatNumber(c.getValue()),
      }),
      col.accessor('segmentCount', { header: 'Segments', enableSorting: false, meta: { numeric: true }, cell: (c) => formatNumber(c.getValue()) }),
      col.accessor('worstClass', {
        header: 'Roughest stretch',
        enableSorting: false,
        meta: { label: 'Roughest ISO 8608 class' },
        cell: (c) => <RoughnessClassBadge value={c.getValue()} />,
      }),
    ],
    [],
  );

  return (
    <DataTable
      columns={columns}
      {...pagedTableProps(query, params, update, { noun: ['route', 'routes'], exportUrl: routesExportUrl(params) })}
      toolbar={
        <div className="flex flex-wrap items-end justify-between gap-4">
          <div role="search" aria-label="Filter routes" className="w-full max-w-sm">
            <SearchField label="Route name" value={params.q ?? ''} onChange={(q) => update({ q: q || undefined })} />
          </div>
          <RoughnessLegend unknown={false} />
        </div>
      }
      empty={
        params.q ? (
          <EmptyState title="No routes match this search">Try a shorter part of the route&rsquo;s name.</EmptyState>
        ) : (
          <EmptyState title="No routes yet">
            Routes come from a road survey upload or are drawn by a fleet manager; trips are then matched to them.
          </EmptyState>
        )
      }
    />
  );
}
