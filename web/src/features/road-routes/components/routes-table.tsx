import { useMemo } from 'react';
import { createColumnHelper } from '@tanstack/react-table';
import { DataTable } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/empty-state';
import { RoughnessClassBadge, RoughnessLegend } from '@/components/ui/roughness';
import { formatNumber, isoDate } from '@/lib/format';
import { useListSearchParams } from '@/lib/use-list-search-params';
import { useRoutes, type RouteListItem } from '../api/get-routes';

const col = createColumnHelper<RouteListItem>();
const noFilters = () => ({});

/** The fleet's routes with their length, segment count and roughest stretch. */
export function RoutesTable() {
  const [params, update] = useListSearchParams({ sorts: ['name'], defaultSort: 'name', readFilters: noFilters });
  const query = useRoutes(params);

  const columns = useMemo(
    () => [
      col.accessor('name', { header: 'Route', cell: (c) => <span className="font-medium">{c.getValue()}</span> }),
      col.accessor('lengthKm', {
        header: 'Length',
        enableSorting: false,
        meta: { numeric: true, unit: 'km' },
        cell: (c) => formatNumber(c.getValue(), 1),
      }),
      col.accessor('segmentCount', { header: 'Segments', enableSorting: false, meta: { numeric: true }, cell: (c) => formatNumber(c.getValue()) }),
      col.accessor('worstClass', {
        header: 'Roughest class',
        enableSorting: false,
        meta: { label: 'Roughest ISO 8608 class' },
        cell: (c) => <RoughnessClassBadge value={c.getValue()} />,
      }),
    ],
    [],
  );

  return (
    <div className="flex flex-col gap-4">
      <RoughnessLegend />
      <DataTable
        label="Routes"
        columns={columns}
        rows={query.data?.items}
        total={query.data?.total}
        getRowId={(r) => String(r.id)}
        page={params.page}
        pageSize={params.pageSize}
        sort={params.sort}
        onPageChange={(page) => update({ page })}
        onPageSizeChange={(pageSize) => update({ pageSize })}
        onSortChange={(sort) => update({ sort })}
        isLoading={query.isPending}
        isFetching={query.isFetching}
        error={query.error}
        onRetry={() => void query.refetch()}
        noun={['route', 'routes']}
        csvFileName={`reboundry-routes-${isoDate(new Date())}.csv`}
        empty={
          <EmptyState title="No routes yet">
            Routes come from a road survey upload or are drawn by a fleet manager; trips are then matched to them.
          </EmptyState>
        }
      />
    </div>
  );
}
