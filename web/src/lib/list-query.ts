import { keepPreviousData, queryOptions, useQuery, type QueryKey } from '@tanstack/react-query';
import { api, type ListParams, type ListResponse } from './api-client';

/**
 * One paged list endpoint (`GET path?page=…&sort=…&<filters>`): its fetcher, its query options
 * (the page on screen stays while the next one loads) and its hook.
 */
export function pagedList<P extends ListParams, T>(path: string, keyOf: (params: P) => QueryKey) {
  // a list's parameters are flat: page, size, sort and filters of plain values
  const get = (params: P, signal?: AbortSignal) => api.get<ListResponse<T>>(path, { query: { ...(params as unknown as Record<string, string | number | boolean | undefined>) }, signal });
  const options = (params: P) => queryOptions({ queryKey: keyOf(params), queryFn: ({ signal }) => get(params, signal), placeholderData: keepPreviousData });
  const useList = (params: P) => useQuery(options(params));
  return { get, options, useList };
}

/**
 * A list endpoint short enough to fetch whole (a fleet's depots, its specs): one page of the
 * largest size holds it all. Its fetcher, its query options (kept fresh for `staleMs`) and its hook.
 */
export function wholeList<T>(path: string, key: QueryKey, staleMs: number) {
  const get = (signal?: AbortSignal) => api.get<ListResponse<T>>(path, { query: { pageSize: 200 }, signal });
  const options = () => queryOptions({ queryKey: key, queryFn: ({ signal }) => get(signal), staleTime: staleMs });
  const useList = () => useQuery(options());
  return { get, options, useList };
}
