import type { ReactNode } from 'react';
import {
  flexRender,
  getCoreRowModel,
  useReactTable,
  type ColumnDef,
  type RowData,
  type SortingState,
} from '@tanstack/react-table';
import { cx } from '@/lib/class-names';
import { formatNumber } from '@/lib/format';
import { PAGE_SIZES } from '@/lib/use-list-search-params';
import { Button, buttonClasses } from './button';
import { ErrorState } from './error-state';
import { LoadingState } from './loading-state';

declare module '@tanstack/react-table' {
  // eslint-disable-next-line @typescript-eslint/no-unused-vars
  interface ColumnMeta<TData extends RowData, TValue> {
    /** Numbers are right-aligned in tabular figures. */
    numeric?: boolean;
    /** Unit shown in the header (never repeated in the cells), e.g. `km`. */
    unit?: string;
    /** Plain text of the header when `header` is not a string (the server's CSV export uses the same words). */
    label?: string;
    className?: string;
  }
}

export interface DataTableProps<T> {
  /** Names the table for screen readers (its caption). */
  label: string;
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  columns: ColumnDef<T, any>[];
  rows: T[] | undefined;
  total: number | undefined;
  getRowId: (row: T) => string;
  /** 1-based page number. */
  page: number;
  pageSize: number;
  /** Server sort: `field` or `-field`. Sortable columns have `id` equal to the server's field name. */
  sort?: string;
  onPageChange: (page: number) => void;
  onPageSizeChange: (pageSize: number) => void;
  onSortChange: (sort: string) => void;
  isLoading?: boolean;
  isFetching?: boolean;
  /** The rows are the previous view's, kept on screen while the asked-for page loads. */
  isPlaceholder?: boolean;
  error?: unknown;
  onRetry?: () => void;
  /** What to say when there are no rows (say what to do next). */
  empty: ReactNode;
  /** How to count rows: `['vehicle', 'vehicles']`. */
  noun: [string, string];
  /**
   * The list's CSV export with the current filters and sort (`exportUrl` in `@/lib/api-client`):
   * offers a download of every matching row, not only the page on screen.
   */
  exportUrl?: string;
  /** Filters and other controls shown above the table. */
  toolbar?: ReactNode;
  /** Larger rows for touch screens regardless of pointer type. */
  roomy?: boolean;
}

/** What {@link pagedTableProps} reads of a list query (TanStack Query's result has it all). */
interface PagedListQuery<T> {
  data?: { items: T[]; total: number };
  isPending: boolean;
  isFetching: boolean;
  isPlaceholderData?: boolean;
  error: unknown;
  refetch: () => unknown;
}

/**
 * The props a server-paged list of rows with an `id` shares, from its list query, the list state
 * kept in the address and how its rows are counted:
 * `<DataTable columns={…} {...pagedTableProps(query, params, update, { noun: ['route', 'routes'] })} …/>`.
 * The table is named (its caption) by the plural noun, capitalised; rows are keyed by `id`.
 */
export function pagedTableProps<T extends { id: number | string }>(
  query: PagedListQuery<T>,
  params: { page: number; pageSize: number; sort?: string },
  update: (patch: { page?: number; pageSize?: number; sort?: string }) => void,
  list: { noun: [string, string]; exportUrl?: string },
) {
  const plural = list.noun[1];
  return {
    label: plural.charAt(0).toUpperCase() + plural.slice(1),
    noun: list.noun,
    exportUrl: list.exportUrl,
    getRowId: (row: T) => String(row.id),
    rows: query.data?.items,
    total: query.data?.total,
    page: params.page,
    pageSize: params.pageSize,
    sort: params.sort,
    onPageChange: (page: number) => update({ page }),
    onPageSizeChange: (pageSize: number) => update({ pageSize }),
    onSortChange: (sort: string) => update({ sort }),
    isLoading: query.isPending,
    isFetching: query.isFetching,
    isPlaceholder: query.isPlaceholderData,
    error: query.error,
    onRetry: () => void query.refetch(),
  } satisfies Partial<DataTableProps<T>>;
}

function toSorting(sort?: string): SortingState {
  if (!sort) return [];
  return [{ id: sort.replace(/^-/, ''), desc: sort.startsWith('-') }];
}

/**
 * A table whose paging, sorting and filtering happen on the server. The parent holds the state
 * (usually in the URL) and fetches the page; this renders it, with accessible sort buttons,
 * numbers right-aligned with units in the headers, paging controls and a CSV download of every matching row.
 */
export function DataTable<T>(props: DataTableProps<T>) {
  const {
    label,
    columns,
    rows,
    total,
    getRowId,
    page,
    pageSize,
    sort,
    onPageChange,
    onPageSizeChange,
    onSortChange,
    isLoading,
    isFetching,
    isPlaceholder,
    error,
    onRetry,
    empty,
    noun,
    exportUrl,
    toolbar,
    roomy,
  } = props;
  const sorting = toSorting(sort);

  const table = useReactTable({
    data: rows ?? [],
    columns,
    getRowId,
    getCoreRowModel: getCoreRowModel(),
    manualPagination: true,
    manualSorting: true,
    manualFiltering: true,
    enableMultiSort: false,
    enableSortingRemoval: false,
    sortDescFirst: false,
    rowCount: total ?? 0,
    state: { sorting, pagination: { pageIndex: page - 1, pageSize } },
    onSortingChange: (updater) => {
      const next = typeof updater === 'function' ? updater(sorting) : updater;
      const first = next[0];
      if (first) onSortChange(first.desc ? `-${first.id}` : first.id);
    },
  });

  const count = total ?? 0;
  const pageCount = Math.max(1, Math.ceil(count / pageSize));
  const from = count === 0 ? 0 : (page - 1) * pageSize + 1;
  const to = Math.min(count, (page - 1) * pageSize + (rows?.length ?? 0));
  const nounFor = (n: number) => (n === 1 ? noun[0] : noun[1]);

  const cellPad = roomy ? 'px-3 py-3' : 'px-3 py-2 pointer-coarse:py-3';

  return (
    <div className="flex flex-col gap-3">
      {toolbar}
      {error && !rows ? (
        <ErrorState error={error} what={noun[1]} onRetry={onRetry} />
      ) : (
        <>
          <div className="flex flex-wrap items-center justify-between gap-2 text-sm text-slate">
            <p aria-live="polite" className="tabular">
              {(isLoading && !rows) || isPlaceholder
                ? `Loading ${noun[1]}…`
                : count === 0
                  ? `No ${noun[1]} match`
                  : `${formatNumber(from)}–${formatNumber(to)} of ${formatNumber(count)} ${nounFor(count)}`}
            </p>
            {exportUrl ? (
              count > 0 && !isPlaceholder && !(isLoading && !rows) ? (
                // A link, so the browser downloads the server's streamed file as it comes.
                <a href={exportUrl} download className={buttonClasses('quiet', 'sm')}>
                  <DownloadIcon />
                  {exportLabel(count)}
                </a>
              ) : (
                <Button size="sm" variant="quiet" disabled>
                  <DownloadIcon />
                  {/* while the count is loading it is not known yet: say nothing of it */}
                  {isPlaceholder || (isLoading && !rows) ? 'Download CSV' : exportLabel(count)}
                </Button>
              )
            ) : null}
          </div>

          <div role="group" aria-label={label} tabIndex={0} className="relative overflow-x-auto rounded-md border border-line bg-surface">
            {isFetching && rows ? (
              <div aria-hidden="true" className="absolute inset-x-0 top-0 h-0.5 animate-pulse bg-accent" />
            ) : null}
            <table className="w-full border-collapse text-sm" aria-busy={isFetching || undefined}>
              <caption className="sr-only">
                {label}
                {count > 0 ? `, ${from} to ${to} of ${count}` : ''}
              </caption>
              <thead>
                {table.getHeaderGroups().map((hg) => (
                  <tr key={hg.id} className="border-b border-line-strong bg-mist/70">
                    {hg.headers.map((h) => {
                      const meta = h.column.columnDef.meta;
                      const sorted = h.column.getIsSorted();
                      const canSort = h.column.getCanSort();
                      const headerContent = (
                        <>
                          <span>{h.isPlaceholder ? null : flexRender(h.column.columnDef.header, h.getContext())}</span>
                          {meta?.unit ? <span className="font-normal text-slate">({meta.unit})</span> : null}
                        </>
                      );
                      return (
                        <th
                          key={h.id}
                          scope="col"
                          aria-sort={canSort ? (sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : 'none') : undefined}
                          className={cx(
                            'px-3 py-2 text-[0.8125rem] font-semibold whitespace-nowrap text-ink',
                            meta?.numeric ? 'text-right' : 'text-left',
                          )}
                        >
                          {canSort ? (
                            <button
                              type="button"
                              onClick={h.column.getToggleSortingHandler()}
                              className={cx(
                                '-mx-1 inline-flex items-center gap-1 rounded px-1 py-0.5 hover:bg-line/60 pointer-coarse:py-2',
                                !meta?.numeric && 'flex-row-reverse',
                              )}
                            >
                              <SortIcon dir={sorted} />
                              <span className="inline-flex items-baseline gap-1">{headerContent}</span>
                            </button>
                          ) : (
                            <span className="inline-flex items-baseline gap-1">{headerContent}</span>
                          )}
                        </th>
                      );
                    })}
                  </tr>
                ))}
              </thead>
              <tbody>
                {table.getRowModel().rows.map((row) => (
                  <tr key={row.id} className={cx('border-b border-line last:border-b-0 hover:bg-mist/50', isPlaceholder && 'opacity-55')}>
                    {row.getVisibleCells().map((cell) => {
                      const meta = cell.column.columnDef.meta;
                      return (
                        <td
                          key={cell.id}
                          className={cx(cellPad, 'align-middle', meta?.numeric ? 'tabular text-right whitespace-nowrap' : 'text-left', meta?.className)}
                        >
                          {flexRender(cell.column.columnDef.cell, cell.getContext())}
                        </td>
                      );
                    })}
                  </tr>
                ))}
              </tbody>
            </table>
            {isLoading && !rows ? <LoadingState label={`Loading ${noun[1]}…`} className="justify-center" /> : null}
            {rows && rows.length === 0 ? <div className="p-4">{empty}</div> : null}
          </div>

          {count > 0 ? (
            <nav aria-label={`Pages of ${noun[1]}`} className="flex flex-wrap items-center justify-between gap-3 text-sm">
              <label className="flex items-center gap-2 text-slate">
                Rows per page
                <select
                  value={pageSize}
                  onChange={(e) => onPageSizeChange(Number(e.target.value))}
                  className="select-chevron h-8 appearance-none rounded-md border border-line-strong bg-surface bg-no-repeat pr-8 pl-2 text-ink pointer-coarse:h-11"
                >
                  {PAGE_SIZES.map((s) => (
                    <option key={s} value={s}>
                      {s}
                    </option>
                  ))}
                </select>
              </label>
              <div className="flex items-center gap-2">
                <span className="tabular text-slate">
                  Page {formatNumber(page)} of {formatNumber(pageCount)}
                </span>
                <Button size="sm" onClick={() => onPageChange(page - 1)} disabled={page <= 1}>
                  <span aria-hidden="true">←</span> Previous
                </Button>
                <Button size="sm" onClick={() => onPageChange(page + 1)} disabled={page >= pageCount}>
                  Next <span aria-hidden="true">→</span>
                </Button>
              </div>
            </nav>
          ) : null}
        </>
      )}
    </div>
  );
}

/** The download's words: it holds every row matching the filters, not only the page on screen. */
function exportLabel(count: number) {
  if (count === 0) return 'Download CSV (no matching rows)';
  return count === 1 ? 'Download CSV of the 1 matching row' : `Download CSV of all ${formatNumber(count)} matching rows`;
}

function SortIcon({ dir }: { dir: false | 'asc' | 'desc' }) {
  return (
    <svg aria-hidden="true" viewBox="0 0 10 14" className={cx('h-3.5 w-2.5 shrink-0', dir ? 'text-accent-strong' : 'text-line-strong')}>
      <path d="M5 1 9 5.5H1z" fill={dir === 'asc' ? 'currentColor' : dir ? 'transparent' : 'currentColor'} stroke="currentColor" strokeWidth="0.8" />
      <path d="M5 13 1 8.5h8z" fill={dir === 'desc' ? 'currentColor' : dir ? 'transparent' : 'currentColor'} stroke="currentColor" strokeWidth="0.8" />
    </svg>
  );
}

function DownloadIcon() {
  return (
    <svg aria-hidden="true" viewBox="0 0 16 16" className="size-4">
      <path d="M8 2v8m0 0L4.5 6.5M8 10l3.5-3.5M2.5 13.5h11" fill="none" stroke="currentColor" strokeWidth="1.5" strokeLinecap="round" />
    </svg>
  );
}
