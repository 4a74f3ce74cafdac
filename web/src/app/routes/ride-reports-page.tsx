import { useSearchParams } from 'react-router';
import { PageHeader } from '@/components/ui/page-header';
import { ReviewBoard } from '@/features/ride-reports/components/review-board';

/** The manager's review of drivers' ride reports. */
export function RideReportsPage() {
  const [params] = useSearchParams();
  const initial = Number(params.get('report')) || null;
  return (
    <>
      <title>Ride reports · Reboundry</title>
      <PageHeader title="Drivers’ ride reports" description="Harsh-ride stretches reported from the road. Accepting one adds a roughness estimate to the segment, at half the weight of a survey." />
      <ReviewBoard routePath={(id) => `/routes/${id}`} initialReportId={initial} />
    </>
  );
}
