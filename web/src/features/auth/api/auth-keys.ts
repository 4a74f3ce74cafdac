import { queryRoots } from '@/lib/query-keys';

export const authKeys = {
  all: queryRoots.auth,
  me: () => [...authKeys.all, 'me'] as const,
};
