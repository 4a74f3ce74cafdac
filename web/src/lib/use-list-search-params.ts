import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router';
import type { ListParams } from './api-client';

export const PAGE_SIZES = [25, 50, 100, 200] as const;

export function positiveInt(value: string | null): number | undefined {
  if (!value) return undefined;
  const n = Number(value);
  return Number.isInteger(n) && n > 0 ? n : undefined;
}

/** A value from a fixed list, or undefined. */
export function oneOf<T extends string>(value: string | null, allowed: readonly T[]): T | undefined {
  return value !== null && (allowed as readonly string[]).includes(value) ? (value as T) : undefined;
}

type Patch<F> = Partial<ListParams & F>;

/**
 * A list's paging, sort and filters, kept in the address bar so a view can be bookmarked, shared
 * and returned to with Back. Unknown values fall back to defaults; any change other than the page
 * goes back to page 1; typing in a search box replaces the history entry instead of adding one.
 */
export function useListSearchParams<F extends object>(options: {
  sorts: readonly string[];
  defaultSort: string;
  readFilters: (search: URLSearchParams) => F;
}) {
  const { sorts, defaultSort, readFilters } = options;
  const [search, setSearch] = useSearchParams();

  const params = useMemo<ListParams & F>(() => {
    const sort = search.get('sort') ?? defaultSort;
    const size = positiveInt(search.get('pageSize'));
    return {
      page: positiveInt(search.get('page')) ?? 1,
      pageSize: size && (PAGE_SIZES as readonly number[]).includes(size) ? size : PAGE_SIZES[0],
      sort: sorts.includes(sort.replace(/^-/, '')) ? sort : defaultSort,
      ...readFilters(search),
    };
  }, [search, sorts, defaultSort, readFilters]);

  const update = useCallback(
    (patch: Patch<F>) => {
      setSearch(
        (prev) => {
          const next = new URLSearchParams(prev);
          for (const [key, value] of Object.entries(patch)) {
            if (value === undefined || value === null || value === '') next.delete(key);
            else next.set(key, String(value));
          }
          if (!('page' in patch)) next.delete('page');
          if (next.get('page') === '1') next.delete('page');
          return next;
        },
        { replace: 'q' in patch },
      );
    },
    [setSearch],
  );

  return [params, update] as const;
}
