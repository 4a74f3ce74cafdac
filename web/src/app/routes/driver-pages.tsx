/** Issue 7 pages: the driver's report form and list, the manager's review, exposure for both. */
import { useQuery } from '@tanstack/react-query';
import { useSearchParams } from 'react-router';
import { PageHeader } from '@/components/ui/page-header';
import { meQueryOptions } from '@/features/auth/api/get-me';
import { ReportForm } from '@/features/ride-reports/components/report-form';
import { MyReports } from '@/features/ride-reports/components/my-reports';
import { ReviewBoard } from '@/features/ride-reports/components/review-board';
import { DriverExposure } from '@/features/exposure/components/my-exposure';
import { ExposureOverview } from '@/features/exposure/components/exposure-overview';
import { pages } from '../navigation';

export function ReportPage() {
  return (
    <>
      <title>Report a road · Reboundry</title>
      <PageHeader title="Report a rough stretch" description="Only when it is safe: stopped, or by a passenger. It takes four taps." />
      <ReportForm myReportsPath={pages.myReports.path} />
    </>
  );
}

export function MyReportsPage() {
  return (
    <>
      <title>My reports · Reboundry</title>
      <PageHeader title="My reports" description="What you reported and what became of it." />
      <MyReports reportPath={pages.report.path} />
    </>
  );
}

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

export function ExposurePage() {
  const me = useQuery(meQueryOptions());
  const manager = me.data?.role === 'manager';
  return (
    <>
      <title>Vibration exposure · Reboundry</title>
      <PageHeader
        title={manager ? 'Drivers’ vibration exposure' : 'My vibration exposure'}
        description={manager ? 'Daily A(8) per driver over the last 30 days against the action value (0.5 m/s²) and the limit value (1.15 m/s²).' : 'Your daily A(8) over the last 30 days against the action value (0.5 m/s²) and the limit value (1.15 m/s²).'}
      />
      {me.data ? manager ? <ExposureOverview /> : <DriverExposure /> : null}
    </>
  );
}
