import { exportUrl } from '@/lib/api-client';
import type { TripListParams } from './get-trips';

/** CSV of every trip matching the list's filters, in its sort. */
export const tripsExportUrl = (params: TripListParams) => exportUrl('/api/trips/export', { ...params });
