import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { rideReportKeys, type RideReport } from './ride-report-keys';

export const rideReportSchema = z.object({
  lat: z.number(),
  lon: z.number(),
  positionSource: z.enum(['gps', 'map']),
  accuracyM: z.number().nullable(),
  severity: z.number().int().min(1).max(3),
  felt: z.array(z.string()),
  note: z.string().max(1000),
  reportedAt: z.string(),
});
export type RideReportInput = z.infer<typeof rideReportSchema>;

/** Sends the report as multipart/form-data (photo in the field `photo`). */
export async function createRideReport(input: RideReportInput, photo: File | null): Promise<RideReport> {
  const v = rideReportSchema.parse(input);
  const form = new FormData();
  form.set('lat', String(v.lat));
  form.set('lon', String(v.lon));
  form.set('positionSource', v.positionSource);
  if (v.accuracyM !== null) form.set('accuracyM', String(Math.round(v.accuracyM)));
  form.set('severity', String(v.severity));
  form.set('felt', v.felt.join(','));
  form.set('note', v.note);
  form.set('reportedAt', v.reportedAt);
  if (photo) form.set('photo', photo, photo.name || 'photo.jpg');
  return api.postForm<RideReport>('/api/ride-reports', form, {
    networkMessage: 'No connection to Reboundry. Your report is kept on this phone; send it again when you have signal.',
  });
}

export function useCreateRideReport() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ input, photo }: { input: RideReportInput; photo: File | null }) => createRideReport(input, photo),
    onSuccess: () => qc.invalidateQueries({ queryKey: rideReportKeys.all }),
  });
}
