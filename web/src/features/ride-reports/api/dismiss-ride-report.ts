import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { rideReportKeys, type RideReport } from './ride-report-keys';

export const dismissSchema = z.object({ reason: z.string().trim().min(3, 'Say briefly why (at least 3 characters).').max(500) });

export const dismissRideReport = (id: number, body: z.infer<typeof dismissSchema>) => api.post<{ report: RideReport }>(`/api/ride-reports/${id}/dismiss`, dismissSchema.parse(body));

export function useDismissRideReport() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, reason }: { id: number; reason: string }) => dismissRideReport(id, { reason }),
    onSuccess: () => qc.invalidateQueries({ queryKey: rideReportKeys.all }),
  });
}
