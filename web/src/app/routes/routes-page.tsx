import { PageHeader } from '@/components/ui/page-header';
import { useNavigate } from 'react-router';
import { Section } from '@/components/ui/section';
import { RoutesTable } from '@/features/road-routes/components/routes-table';
import { RouteCreate } from '@/features/road-routes/components/route-create';

export function RoutesPage() {
  const navigate = useNavigate();
  return (
    <>
      <title>Routes · Reboundry</title>
      <PageHeader title="Routes" description="The roads your fleet drives, and the roughest stretch of each." />
      <RoutesTable />
      <Section title="Add a route" className="mt-8">
        <RouteCreate onCreated={(id) => void navigate(`/routes/${id}`)} />
      </Section>
    </>
  );
}
