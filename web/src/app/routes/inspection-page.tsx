import { useNavigate, useParams } from 'react-router';
import { ErrorState } from '@/components/ui/error-state';
import { LoadingState } from '@/components/ui/loading-state';
import { PageHeader } from '@/components/ui/page-header';
import { InspectionStatusBadge } from '@/components/ui/inspection-status-badge';
import { useInspection } from '@/features/workshop/api/get-inspection';
import { useWorkshopOptions } from '@/features/workshop/api/get-workshop-options';
import { InspectionRecord } from '@/features/workshop/components/inspection-record';
import { formatDate, formatNumber, isoDate } from '@/lib/format';
import { pages, workRecordPath } from '../navigation';
import type { WorkRecordPageState } from './work-record-page';

/** One inspection: the mechanic records test-lane results, photos and the work done. */
export function InspectionPage() {
  const id = Number(useParams().inspectionId);
  const q = useInspection(id);
  const options = useWorkshopOptions();
  const navigate = useNavigate();
  const back = { to: pages.workshop.path, label: 'Workshop' };
  if (q.isPending || options.isPending) return <LoadingState label="Loading the inspection…" />;
  if (q.error || options.error) return (
    <>
      <PageHeader title="Inspection" back={back} />
      <ErrorState error={q.error ?? options.error} what="this inspection" onRetry={() => void q.refetch()} />
    </>
  );
  const i = q.data;
  return (
    <>
      <title>{`Inspection ${i.vehicle.fleetNumber} · Reboundry`}</title>
      <PageHeader
        back={back}
        eyebrow={`Inspection #${i.id}`}
        title={`${i.vehicle.fleetNumber} · ${i.vehicle.plate}`}
        badges={<InspectionStatusBadge status={i.status}> · due {formatDate(i.dueDate)}</InspectionStatusBadge>}
        description={`${i.reason} Odometer on file ${formatNumber(i.vehicle.odometerKm)} km.`}
      />
      <InspectionRecord inspection={i} options={options.data} today={isoDate(new Date())} onWorkSaved={(w) => void navigate(workRecordPath(w), { state: { justSaved: true } satisfies WorkRecordPageState })} />
    </>
  );
}
