import { queryRoots } from '@/lib/query-keys';

export const depotKeys = {
  all: queryRoots.depots,
  list: () => [...depotKeys.all, 'list'] as const,
};
