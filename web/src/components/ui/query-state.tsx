import type { ReactNode } from 'react';
import { ErrorState } from './error-state';
import { LoadingState } from './loading-state';

/**
 * A part of a page that shows what one query fetched: {@link LoadingState} (with `loading` as its
 * words) until it answers, {@link ErrorState} naming `what` if it fails (with a Try again button
 * when `retry`), else `children` given the data.
 */
export function QueryState<T>({
  query,
  loading,
  what,
  retry = false,
  children,
}: {
  query: { isPending: boolean; error: unknown; data: T | undefined; refetch: () => unknown };
  loading?: string;
  what: string;
  retry?: boolean;
  children: (data: T) => ReactNode;
}) {
  if (query.isPending) return <LoadingState label={loading} />;
  if (query.error) return <ErrorState error={query.error} what={what} onRetry={retry ? () => void query.refetch() : undefined} />;
  return children(query.data as T);
}
