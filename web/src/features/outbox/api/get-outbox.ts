import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { MailStatusCounts } from '@contracts/mail';
import { api, type ListResponse } from '@/lib/api-client';
import { queryRoots } from '@/lib/query-keys';

export interface CaughtMailItem {
  id: number;
  messageId: string | null;
  key: string | null;
  from: string | null;
  to: string;
  subject: string;
  sizeBytes: number;
  receivedAt: string;
  preview?: string;
}

export interface CaughtMailMessage extends CaughtMailItem {
  text: string | null;
  html: string | null;
}

export interface Outbox extends ListResponse<CaughtMailItem> {
  transport: string;
  catches: boolean;
  /** Queued messages by status: waiting, being sent by an app instance now, sent, failed. */
  sent: MailStatusCounts;
}

export const outboxKeys = {
  all: queryRoots.outbox,
  list: (page: number, q: string) => [...outboxKeys.all, 'list', { page, q }] as const,
  message: (id: number) => [...outboxKeys.all, 'message', id] as const,
};

export const outboxQueryOptions = (page: number, q: string) =>
  queryOptions({
    queryKey: outboxKeys.list(page, q),
    queryFn: ({ signal }) => api.get<Outbox>('/api/outbox', { query: { page, pageSize: 50, q }, signal }),
    placeholderData: keepPreviousData,
  });

export function useOutbox(page: number, q: string) {
  return useQuery(outboxQueryOptions(page, q));
}
