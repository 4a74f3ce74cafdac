import { PageHeader } from '@/components/ui/page-header';
import { ButtonLink } from '@/components/ui/button';
import { SpecsList } from '@/features/specs/components/specs-list';
import { pages } from '../navigation';

export function SpecsPage() {
  return (
    <>
      <title>Specs · Reboundry</title>
      <PageHeader
        title="Suspension specs"
        description="Each vehicle type's suspension, per corner and axle. The wear model reads these for every trip."
        actions={<ButtonLink to={`${pages.specs.path}/new`} variant="primary">New spec</ButtonLink>}
      />
      <SpecsList vehiclesPath={(id) => `${pages.vehicles.path}?specId=${id}`} editPath={(id) => `${pages.specs.path}/${id}/edit`} />
    </>
  );
}
