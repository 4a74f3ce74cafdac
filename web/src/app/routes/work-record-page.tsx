import { useLocation, useParams } from 'react-router';
import { useQuery } from '@tanstack/react-query';
import { ErrorState } from '@/components/ui/error-state';
import { LoadingState } from '@/components/ui/loading-state';
import { inspectionQueryOptions } from '@/features/workshop/api/get-inspection';
import { useWorkRecord } from '@/features/workshop/api/get-work-record';
import { WorkRecordSheet } from '@/features/workshop/components/work-record-sheet';
import { Notice } from '@/components/ui/notice';

/** What the inspection page passes along when it opens a work record it has just saved. */
export interface WorkRecordPageState {
  justSaved?: boolean;
}

/** A printable work record, with the inspection it came from. */
export function WorkRecordPage() {
  const id = Number(useParams().workRecordId);
  const justSaved = (useLocation().state as WorkRecordPageState | null)?.justSaved === true;
  const q = useWorkRecord(id);
  const inspectionId = q.data?.inspectionId ?? null;
  const inspection = useQuery({ ...inspectionQueryOptions(inspectionId ?? 0), enabled: inspectionId !== null });
  if (q.isPending) return <LoadingState label="Loading the work record…" />;
  if (q.error) return <ErrorState error={q.error} what="this work record" onRetry={() => void q.refetch()} />;
  return (
    <>
      <title>{`Work record ${id} · Reboundry`}</title>
      {justSaved ? (
        <Notice tone="ok" title="Saved" className="no-print mb-4">
          The work record is saved; the old dampers are retired and the new ones count from today.
        </Notice>
      ) : null}
      <WorkRecordSheet record={q.data} inspection={inspection.data ?? null} inspectionProblem={inspection.error ? 'error' : inspection.isPending ? 'loading' : null} />
    </>
  );
}
