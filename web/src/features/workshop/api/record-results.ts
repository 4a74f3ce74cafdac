import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { workshopKeys, type InspectionDetail } from './types';
import { invalidateRoots, staleAfter } from '@/lib/query-keys';

export const resultsSchema = z.object({
  odometerKm: z.number().min(0),
  notes: z.string().max(4000).nullable(),
  complete: z.boolean().optional(),
  /** With a "check again soon" verdict: the day to check again (the server checks the range; empty = 30 days on). */
  followUpOn: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'must be a date').nullable().optional(),
  plateAmplitudeMm: z.number().min(0.5).max(10).optional(),
  corners: z.array(z.object({ position: z.string(), adhesionPct: z.number().min(0).max(100).nullable(), phaseDeg: z.number().min(0).max(180).nullable(), findings: z.array(z.string()), verdict: z.string() })),
});
export type ResultsInput = z.infer<typeof resultsSchema>;

export function useRecordResults(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: ResultsInput) => api.post<InspectionDetail>(`/api/inspections/${id}/results`, resultsSchema.parse(body)),
    onSuccess: (d) => {
      qc.setQueryData(workshopKeys.inspection(id), d);
      // the lane readings revise the corners' damping: wear, predictions and the due list with it
      void invalidateRoots(qc, staleAfter.workshop);
    },
  });
}
