import { PageHeader } from '@/components/ui/page-header';
import { QueryState } from '@/components/ui/query-state';
import { useFleetLife } from '@/features/workshop/api/get-fleet-life';
import { FleetLifeView } from '@/features/workshop/components/fleet-life-charts';
import { SpecPicker, useSpecChoice } from './spec-choice';
import { pages } from '../navigation';

/** Damper life per suspension spec: the life model fitted to the fleet's own removals and what it rests on. */
export function FleetLifePage() {
  const { specId, choose } = useSpecChoice();
  const life = useFleetLife(specId);
  return (
    <>
      <title>Damper life · Reboundry</title>
      <PageHeader
        title="Damper life from the fleet"
        description="How long a damper of this spec lasts on each kind of road, learned from the fleet's own removals on top of the trade's prior."
        actions={<SpecPicker specId={specId} onChange={choose} />}
      />
      <QueryState query={life} loading="Fitting…" what="the fit">
        {(data) => (
          <FleetLifeView life={data} backtestTo={`${pages.lifeBacktest.path}?specId=${specId}`} />
        )}
      </QueryState>
    </>
  );
}
