import { PageHeader } from '@/components/ui/page-header';
import { RoutesTable } from '@/features/road-routes/components/routes-table';

export function RoutesPage() {
  return (
    <>
      <title>Routes · Reboundry</title>
      <PageHeader title="Routes" description="The roads your fleet drives, and the roughest stretch of each." />
      <RoutesTable />
    </>
  );
}
