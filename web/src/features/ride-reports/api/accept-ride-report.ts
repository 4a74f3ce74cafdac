import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { rideReportKeys, type RideReport } from './ride-report-keys';
import { invalidateRoots, staleAfter } from '@/lib/query-keys';

export const acceptSchema = z.object({ note: z.string().max(200).nullable(), confirm: z.literal(true) });

export interface AcceptResult {
  report: RideReport;
  segmentBefore: { isoClass: string | null; gdN0: number | null; iri: number | null };
  segmentAfter: { isoClass: string | null; gdN0: number | null; iri: number | null; roughnessSource: string | null };
  rule: string;
}

export const acceptRideReport = (id: number, body: z.infer<typeof acceptSchema>) => api.post<AcceptResult>(`/api/ride-reports/${id}/accept`, acceptSchema.parse(body));

export function useAcceptRideReport() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, note }: { id: number; note: string | null }) => acceptRideReport(id, { note, confirm: true }),
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: rideReportKeys.all });
      // the segment's roughness changed: the map, route pages and speed advice re-read it
      void invalidateRoots(qc, staleAfter.roadData);
    },
  });
}
