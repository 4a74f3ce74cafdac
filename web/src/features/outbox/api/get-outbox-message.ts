import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { outboxKeys, type CaughtMailMessage } from './get-outbox';

export const outboxMessageQueryOptions = (id: number) =>
  queryOptions({
    queryKey: outboxKeys.message(id),
    queryFn: ({ signal }) => api.get<{ message: CaughtMailMessage }>(`/api/outbox/${id}`, { signal }).then((b) => b.message),
  });

export function useOutboxMessage(id: number | null) {
  return useQuery({ ...outboxMessageQueryOptions(id ?? 0), enabled: id !== null });
}
