import { PageHeader } from '@/components/ui/page-header';
import { QueryState } from '@/components/ui/query-state';
import { useQuery } from '@tanstack/react-query';
import { vehiclesQueryOptions } from '@/features/vehicles/api/get-vehicles';
import { useLifeBacktest } from '@/features/workshop/api/get-life-backtest';
import { LifeBacktestView } from '@/features/workshop/components/life-backtest';
import { SpecPicker, useSpecChoice } from './spec-choice';
import { pages, vehiclePath } from '../navigation';

/** How good the damper-life predictions are: each past removal against what the model predicted before it. */
export function LifeBacktestPage() {
  const { specId, choose } = useSpecChoice();
  const bt = useLifeBacktest(specId);
  // fleet numbers for the table (a fleet has far fewer than 200 vehicles of one spec)
  const vehicles = useQuery({ ...vehiclesQueryOptions({ specId, page: 1, pageSize: 200 }), enabled: specId > 0 });
  const fleetNumbers = new Map((vehicles.data?.items ?? []).map((v) => [v.id, v.fleetNumber]));
  return (
    <>
      <title>Back-test of damper life · Reboundry</title>
      <PageHeader
        title="How good are the life predictions?"
        description="Every removal for wear on record, against what the life model predicted for it from the data before that day."
        back={{ to: `${pages.fleetLife.path}?specId=${specId}`, label: 'Damper life' }}
        actions={<SpecPicker specId={specId} onChange={choose} />}
      />
      <QueryState query={bt} loading="Replaying the removals…" what="the back-test">
        {(data) => (
          <LifeBacktestView bt={data} vehiclePath={vehiclePath} fleetNumberOf={(id) => fleetNumbers.get(id)} />
        )}
      </QueryState>
    </>
  );
}
