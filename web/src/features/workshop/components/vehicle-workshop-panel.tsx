import { Link } from 'react-router';
import { Caution } from '@/components/ui/caution';
import { ErrorState } from '@/components/ui/error-state';
import { LoadingState } from '@/components/ui/loading-state';
import { Section } from '@/components/ui/section';
import { SimpleTable } from '@/components/ui/simple-table';
import { formatDate, formatNumber } from '@/lib/format';
import { useVehicleWorkshop, type VehicleWorkshop } from '../api/get-vehicle-workshop';
import { LIFE_SOURCE_WORDS } from '../api/types';

/** The life model behind the corners, in words. */
function lifeWords(l: VehicleWorkshop['life']): string {
  const shape = `${formatNumber(l.classStepFactor, 2)}× shorter per ISO 8608 class step rougher, Weibull shape ${formatNumber(l.shape, 1)}`;
  return l.source === 'fleet'
    ? `Life used is measured against this spec's life model, fitted to the fleet's own removals (${l.failures} for wear): ${shape}. A test-lane result calibrates the corner it was taken on.`
    : `Life used is measured against the trade's prior for this spec (no removal for wear on record yet): the rated km on class B roads at 80 km/h, ${shape}. A test-lane result calibrates the corner it was taken on.`;
}

/** The vehicle page's workshop part: life used and its source, predicted vs measured damping, work records. */
export function VehicleWorkshopPanel({ vehicleId, workRecordPath }: { vehicleId: number; workRecordPath: (id: number) => string }) {
  const q = useVehicleWorkshop(vehicleId);
  if (q.isPending) return <LoadingState label="Loading workshop history…" />;
  if (q.error) return <ErrorState error={q.error} what="the workshop history" onRetry={() => void q.refetch()} />;
  const d = q.data;
  return (
    <>
      <Section title="Damper state and the life it rests on" description={lifeWords(d.life)}>
        <SimpleTable
          label="Damper state per corner"
          rows={d.corners}
          getRowKey={(c) => c.damperId}
          columns={[
            { key: 'p', header: 'Corner', cell: (c) => c.position, rowHeader: true },
            { key: 'u', header: 'Life used', unit: '%', numeric: true, cell: (c) => formatNumber(c.lifeUsedFraction * 100) },
            { key: 'c', header: 'Predicted damping', unit: 'N·s/m', numeric: true, cell: (c) => formatNumber(c.dampingNsPerM) },
            { key: 'km', header: 'Since fitted', unit: 'km', numeric: true, cell: (c) => formatNumber(c.kmSinceFitted) },
            { key: 'l', header: 'A new damper’s life on these roads', unit: 'km', numeric: true, cell: (c) => formatNumber(c.lifeKm) },
            {
              key: 'e',
              header: 'End of life',
              cell: (c) =>
                c.endOfLifeDate ? (
                  <>
                    {formatDate(c.endOfLifeDate)}
                    {c.endOfLifeP10Date && c.endOfLifeP90Date && c.endOfLifeP10Date !== c.endOfLifeP90Date ? (
                      <span className="block text-xs whitespace-nowrap text-slate">
                        P10–P90 {formatDate(c.endOfLifeP10Date)} – {formatDate(c.endOfLifeP90Date)}
                      </span>
                    ) : null}
                  </>
                ) : (
                  'not predicted'
                ),
            },
            { key: 'o', header: 'Worn before the records', unit: '%', numeric: true, cell: (c) => (c.openingShare === null ? '—' : formatNumber(c.openingShare * 100)) },
            { key: 's', header: 'Life from', cell: (c) => LIFE_SOURCE_WORDS[c.lifeSource] ?? c.lifeSource },
            { key: 'b', header: 'Basis', cell: (c) => c.basis },
          ]}
        />
        {/* The page's general safety caution sits with the first wear figures (Dampers by corner); this one says what is particular to these. */}
        <Caution className="mt-3">Predicted damping is the wear model&apos;s figure, not a measurement: only a test-lane result on a corner shows how that damper works now.</Caution>
      </Section>
      <Section title="Predicted and measured damping" description="Each test-lane adhesion turned into a present damping on the two-mass model at the plate amplitude of the lane that measured it (zero-to-peak, half the stroke), beside what the wear model predicted.">
        {d.comparisons.length ? (
          <SimpleTable
            label="Predicted and measured damping by inspection"
            rows={d.comparisons}
            getRowKey={(c) => `${c.inspectionId}-${c.position}`}
            columns={[
              { key: 'd', header: 'Date', cell: (c) => formatDate(c.at) },
              { key: 'p', header: 'Corner', cell: (c) => c.position, rowHeader: true },
              { key: 'a', header: 'Adhesion', unit: '%', numeric: true, cell: (c) => formatNumber(c.adhesionPct, 1) },
              { key: 'amp', header: 'Plate amplitude', unit: 'mm', numeric: true, cell: (c) => formatNumber(c.plateAmplitudeMm, 1) },
              { key: 'ph', header: 'Min. phase', unit: '°', numeric: true, cell: (c) => formatNumber(c.phaseDeg, 1) },
              { key: 'from', header: 'Estimate from', cell: (c) => (c.estimateMethod === 'phase' ? 'phase shift' : c.estimateMethod === 'adhesion' ? 'adhesion' : '') },
              { key: 'pr', header: 'Predicted', unit: 'N·s/m', numeric: true, cell: (c) => formatNumber(c.predictedNsPerM) },
              { key: 'm', header: 'Measured', unit: 'N·s/m', numeric: true, cell: (c) => formatNumber(c.measuredNsPerM) },
              { key: 'n', header: 'Note', cell: (c) => c.note ?? '' },
            ]}
          />
        ) : (
          <p className="text-sm text-slate">No test-lane results yet for this vehicle.</p>
        )}
      </Section>
      <Section title="Work records">
        {d.workRecords.length ? (
          <ul className="space-y-1 text-sm">
            {d.workRecords.map((w) => (
              <li key={w.id}>
                <Link className="link" to={workRecordPath(w.id)}>
                  {formatDate(w.performedAt)} · {w.summary}
                </Link>{' '}
                <span className="tabular text-slate">({formatNumber(w.odometerKm)} km)</span>
              </li>
            ))}
          </ul>
        ) : (
          <p className="text-sm text-slate">No work recorded.</p>
        )}
      </Section>
    </>
  );
}
