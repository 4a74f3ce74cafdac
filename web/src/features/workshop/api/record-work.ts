import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import type { WorkRecord } from './types';
import { invalidateRoots, staleAfter } from '@/lib/query-keys';

export const workSchema = z.object({
  vehicleId: z.number().int().positive(),
  inspectionId: z.number().int().positive().nullable(),
  performedOn: z.string().regex(/^\d{4}-\d{2}-\d{2}$/),
  odometerKm: z.number().min(0),
  summary: z.string().min(3),
  labourHours: z.number().min(0),
  notes: z.string().nullable(),
  items: z.array(z.object({ position: z.string(), component: z.enum(['damper', 'spring']), partDescription: z.string(), partNumber: z.string().nullable(), cost: z.number().min(0), removalReason: z.string() })),
});
export type WorkInput = z.infer<typeof workSchema>;

export function useRecordWork() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: WorkInput) => api.post<WorkRecord>('/api/work-records', workSchema.parse(body)),
    onSuccess: () => void invalidateRoots(qc, staleAfter.workshop),
  });
}
