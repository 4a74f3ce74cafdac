import type { UserListParams } from './get-users';
import { queryRoots } from '@/lib/query-keys';

export const userKeys = {
  all: queryRoots.users,
  lists: () => [...userKeys.all, 'list'] as const,
  list: (params: UserListParams) => [...userKeys.lists(), params] as const,
};
