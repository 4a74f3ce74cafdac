import { useMutation, useQueryClient } from '@tanstack/react-query';
import { resultsBody, type ResultsBody } from '@contracts/workshop';
import { api, checked } from '@/lib/api-client';
import { workshopKeys, type InspectionDetail } from './types';
import { invalidateRoots, staleAfter } from '@/lib/query-keys';

export type ResultsInput = ResultsBody;

/** Today in the browser, the inspection day the follow-up date is checked against (the server checks it again by its own clock). */
const localToday = () => new Date().toLocaleDateString('sv-SE');

export function useRecordResults(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: ResultsInput) => api.post<InspectionDetail>(`/api/inspections/${id}/results`, checked(resultsBody(localToday()), body, `/api/inspections/${id}/results`)),
    onSuccess: (d) => {
      qc.setQueryData(workshopKeys.inspection(id), d);
      // the lane readings revise the corners' damping: wear, predictions and the due list with it
      void invalidateRoots(qc, staleAfter.workshop);
    },
  });
}
