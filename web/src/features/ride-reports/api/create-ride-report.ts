import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { ApiError, type ApiErrorBody } from '@/lib/api-client';
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

/** Sends the report as multipart/form-data (photo in the field `photo`) with the CSRF token. */
export async function createRideReport(input: RideReportInput, photo: File | null): Promise<RideReport> {
  const v = rideReportSchema.parse(input);
  const path = '/api/ride-reports';
  let res: Response;
  try {
    const { token } = (await (await fetch('/api/auth/csrf', { credentials: 'same-origin' })).json()) as { token: string };
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
    res = await fetch(path, { method: 'POST', body: form, headers: { 'x-csrf-token': token, accept: 'application/json' }, credentials: 'same-origin' });
  } catch {
    throw new ApiError(0, 'network', 'No connection to Reboundry. Your report is kept on this phone; send it again when you have signal.', {}, path);
  }
  const text = await res.text();
  const body = text ? (JSON.parse(text) as unknown) : undefined;
  if (!res.ok) {
    const e = (body as Partial<ApiErrorBody> | undefined)?.error;
    throw new ApiError(res.status, e?.code ?? `http_${res.status}`, e?.message ?? `Sending failed (HTTP ${res.status}).`, e?.fields ?? {}, path);
  }
  return body as RideReport;
}

export function useCreateRideReport() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ input, photo }: { input: RideReportInput; photo: File | null }) => createRideReport(input, photo),
    onSuccess: () => qc.invalidateQueries({ queryKey: rideReportKeys.all }),
  });
}
