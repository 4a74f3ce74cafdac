import { useParams } from 'react-router';
import { ErrorState } from '@/components/ui/error-state';
import { LoadingState } from '@/components/ui/loading-state';
import { useWorkRecord } from '@/features/workshop/api/get-work-record';
import { WorkRecordSheet } from '@/features/workshop/components/work-record-sheet';
import { Notice } from '@/components/ui/notice';

/** A printable work record. */
export function WorkRecordPage() {
  const id = Number(useParams().workRecordId);
  const q = useWorkRecord(id);
  if (q.isPending) return <LoadingState label="Loading the work record…" />;
  if (q.error) return <ErrorState error={q.error} what="this work record" onRetry={() => void q.refetch()} />;
  return (
    <>
      <title>{`Work record ${id} · Reboundry`}</title>
      <Notice tone="ok" title="Saved" className="no-print mb-4">
        The work record is saved; the old dampers are retired and the new ones count from today.
      </Notice>
      <WorkRecordSheet record={q.data} />
    </>
  );
}
