import { exportUrl } from '@/lib/api-client';
import type { RouteListParams } from './get-routes';

/** CSV of every route matching the list's search, in its sort. */
export const routesExportUrl = (params: RouteListParams) => exportUrl('/api/routes/export', { ...params });
