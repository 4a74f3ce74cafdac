import { useMutation, useQueryClient } from '@tanstack/react-query';
import { uploadFile } from '@/lib/api-client';
import { queryRoots } from '@/lib/query-keys';

export interface ImportReport {
  columns: string[];
  total: number;
  ok: number;
  bad: number;
  rows: { row: number; ok: boolean; problems: string[]; trip: { fleetNumber: string; routeName: string; driverEmail: string | null; startedAt: string | null; endedAt: string | null; distanceKm: number | null; meanSpeedKmh: number | null } }[];
}

export function useImportTrips() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (v: { file: File; preview: boolean }): Promise<ImportReport | { importId: number; imported: number }> =>
      v.preview ? uploadFile<ImportReport>('/api/trips/import?preview=true', v.file) : uploadFile<{ importId: number; imported: number }>('/api/trips/import', v.file),
    onSuccess: (_d, v) => {
      if (!v.preview) void qc.invalidateQueries({ queryKey: queryRoots.trips });
    },
  });
}
