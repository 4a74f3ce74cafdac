import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api, type ListParams, type ListResponse } from '@/lib/api-client';
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

export function getUsers(params: UserListParams, signal?: AbortSignal) {
  return api.get<ListResponse<UserListItem>>('/api/users', { query: { ...params }, signal });
}

export const usersQueryOptions = (params: UserListParams) =>
  queryOptions({
    queryKey: userKeys.list(params),
    queryFn: ({ signal }) => getUsers(params, signal),
    placeholderData: keepPreviousData,
  });

export function useUsers(params: UserListParams) {
  return useQuery(usersQueryOptions(params));
}
