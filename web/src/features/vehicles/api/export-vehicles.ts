import { exportUrl } from '@/lib/api-client';
import type { VehicleListParams } from './get-vehicles';

/** CSV of every vehicle matching the list's filters, in its sort (a driver's holds their own vehicle). */
export const vehiclesExportUrl = (params: VehicleListParams) => exportUrl('/api/vehicles/export', { ...params });
