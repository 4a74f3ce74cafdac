import { PageHeader } from '@/components/ui/page-header';
import { SpecsList } from '@/features/specs/components/specs-list';
import { pages } from '../navigation';

export function SpecsPage() {
  return (
    <>
      <title>Specs · Reboundry</title>
      <PageHeader
        title="Suspension specs"
        description="Each vehicle type's suspension, per corner and axle. The wear model reads these for every trip."
      />
      <SpecsList vehiclesPath={(id) => `${pages.vehicles.path}?specId=${id}`} />
    </>
  );
}
