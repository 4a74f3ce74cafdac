import { PageHeader } from '@/components/ui/page-header';
import { ReportForm } from '@/features/ride-reports/components/report-form';
import { pages } from '../navigation';

/** The driver's form for reporting a rough stretch of road. */
export function ReportPage() {
  return (
    <>
      <title>Report a road · Reboundry</title>
      <PageHeader title="Report a rough stretch" description="Only when it is safe: stopped, or by a passenger. It takes four taps." />
      <ReportForm myReportsPath={pages.myReports.path} />
    </>
  );
}
