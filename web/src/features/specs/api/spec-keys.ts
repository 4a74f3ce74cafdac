import { queryRoots } from '@/lib/query-keys';

export const specKeys = {
  all: queryRoots.specs,
  list: () => [...specKeys.all, 'list'] as const,
};
