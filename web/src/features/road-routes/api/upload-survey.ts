import { useMutation, useQueryClient } from '@tanstack/react-query';
import { uploadFile } from '@/lib/api-client';
import { invalidateRoots, staleAfter } from '@/lib/query-keys';

export interface SurveyResult {
  surveyId?: number;
  summary: { dxM: number; startM: number; endM: number; pointCount: number; skippedHeadM: number; beyondRouteM: number; segmentCount: number; routeSegmentCount: number };
  segments: { segmentId: number; seq: number; startM: number; endM: number; iri: number; gdN0: number; isoClass: string; previous: { iri: number | null; isoClass: string | null; source: string | null; date: string | null } }[];
}

export function uploadSurvey(routeId: number, file: File, opts: { preview: boolean; surveyedOn?: string; note?: string }) {
  return uploadFile<SurveyResult>(`/api/routes/${routeId}/surveys${opts.preview ? '?preview=true' : ''}`, file, { surveyedOn: opts.surveyedOn, note: opts.note });
}

export function useUploadSurvey(routeId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (v: { file: File; preview: boolean; surveyedOn?: string; note?: string }) => uploadSurvey(routeId, v.file, v),
    onSuccess: (_d, v) => {
      if (!v.preview) {
        void invalidateRoots(qc, staleAfter.roadData);
      }
    },
  });
}
