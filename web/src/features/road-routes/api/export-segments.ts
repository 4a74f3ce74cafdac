import { exportUrl } from '@/lib/api-client';
import type { SegmentListParams } from './get-segments';

/** CSV of every segment matching the list's filters, in its sort. */
export const segmentsExportUrl = (params: SegmentListParams) => exportUrl('/api/segments/export', { ...params });
