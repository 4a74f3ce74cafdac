import { PageHeader } from '@/components/ui/page-header';
import { MyReports } from '@/features/ride-reports/components/my-reports';
import { pages } from '../navigation';

/** The driver's own reports and what became of each. */
export function MyReportsPage() {
  return (
    <>
      <title>My reports · Reboundry</title>
      <PageHeader title="My reports" description="What you reported and what became of it." />
      <MyReports reportPath={pages.report.path} />
    </>
  );
}
