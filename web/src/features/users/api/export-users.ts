import { exportUrl } from '@/lib/api-client';
import type { UserListParams } from './get-users';

/** CSV of everyone matching the list's filters, in its sort. */
export const usersExportUrl = (params: UserListParams) => exportUrl('/api/users/export', { ...params });
