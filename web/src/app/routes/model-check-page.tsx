import { Facts } from '@/components/ui/facts';
import { PageHeader } from '@/components/ui/page-header';
import { Caution } from '@/components/ui/caution';
import { EmptyState } from '@/components/ui/empty-state';
import { QueryState } from '@/components/ui/query-state';
import { useModelCheck } from '@/features/workshop/api/get-model-check';
import { ModelCheckChart } from '@/features/workshop/components/fleet-life-charts';
import { formatNumber } from '@/lib/format';

/** Predicted against measured damping over every inspection: can the model be trusted? */
export function ModelCheckPage() {
  const q = useModelCheck();
  return (
    <>
      <title>Model check · Reboundry</title>
      <PageHeader title="Model check" description="The wear model's predicted damping against the damping the test lane implies, for every inspected corner." />
      <QueryState query={q} what="the model check">
        {(data) => (
          <>
            <Facts
              items={[
                { label: 'Corners compared', value: data.n, numeric: true },
                { label: 'Bias [N·s/m]', value: formatNumber(data.biasNsPerM), numeric: true },
                { label: 'Spread [N·s/m]', value: formatNumber(data.spreadNsPerM), numeric: true },
                { label: 'Bias [% of nominal]', value: formatNumber(data.biasPctOfNominal, 1), numeric: true },
                { label: 'Adhesion with no estimate', value: data.noEstimate, numeric: true },
              ]}
            />
            <p className="my-2 text-xs text-slate">{data.definitions}. A positive bias means the model thinks dampers are in better shape than the lane shows.</p>
            {data.n === 0 ? (
              <EmptyState title="No test-lane results yet">
                When a mechanic records the adhesion of each corner on an inspection, that corner appears here: the damping the
                lane result implies against the damping the wear model predicted for it.
              </EmptyState>
            ) : (
              <ModelCheckChart points={data.points} />
            )}
            <Caution className="mt-3">The test-lane estimate rests on the two-mass model and the spec&apos;s parameters; it supports, and never replaces, a qualified mechanic&apos;s judgement.</Caution>
          </>
        )}
      </QueryState>
    </>
  );
}
