import { useState } from 'react';
import { ErrorState } from '@/components/ui/error-state';
import { LoadingState } from '@/components/ui/loading-state';
import { PageHeader } from '@/components/ui/page-header';
import { useSpecs } from '@/features/specs/api/get-specs';
import { useFleetLife } from '@/features/workshop/api/get-fleet-life';
import { FleetLifeView } from '@/features/workshop/components/fleet-life-charts';

/** Damper life learned from the fleet's own replacements, per suspension spec. */
export function FleetLifePage() {
  const specs = useSpecs();
  const [chosen, setChosen] = useState<number | null>(null);
  const specId = chosen ?? specs.data?.items[0]?.id ?? 0;
  const life = useFleetLife(specId);
  return (
    <>
      <title>Damper life · Reboundry</title>
      <PageHeader
        title="Damper life from the fleet"
        description="Weibull fit by maximum likelihood to every removal, with dampers still fitted counted as running (right-censored)."
        actions={
          <label className="text-sm">
            Spec{' '}
            <select className="min-h-9 rounded border border-line bg-surface px-2" value={specId} onChange={(e) => setChosen(Number(e.target.value))}>
              {(specs.data?.items ?? []).map((s) => (
                <option key={s.id} value={s.id}>
                  {s.name}
                </option>
              ))}
            </select>
          </label>
        }
      />
      {life.isPending ? <LoadingState label="Fitting…" /> : life.error ? <ErrorState error={life.error} what="the fit" /> : <FleetLifeView life={life.data} />}
    </>
  );
}
