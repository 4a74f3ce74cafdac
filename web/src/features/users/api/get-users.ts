import type { ListParams } from '@/lib/api-client';
import { pagedList } from '@/lib/list-query';
import type { Role } from '@/lib/roles';
import { userKeys } from './user-keys';
import type { UserListItem } from '@contracts/users';

export const USER_SORTS = ['name', 'email', 'role', 'createdAt'] as const;

export type { UserListItem } from '@contracts/users';

export interface UserListParams extends ListParams {
  /** Name or e-mail, partial. */
  q?: string;
  role?: Role;
  /** `true` active only, `false` deactivated only. */
  active?: boolean;
}

const users = pagedList<UserListParams, UserListItem>('/api/users', userKeys.list);
export const getUsers = users.get;
export const usersQueryOptions = users.options;
export const useUsers = users.useList;
