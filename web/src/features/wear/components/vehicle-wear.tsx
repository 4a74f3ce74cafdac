import { Link } from 'react-router';
import { Caution } from '@/components/ui/caution';
import { EmptyState } from '@/components/ui/empty-state';
import { ErrorState } from '@/components/ui/error-state';
import { LoadingState } from '@/components/ui/loading-state';
import { Section } from '@/components/ui/section';
import { SimpleTable, type SimpleColumn } from '@/components/ui/simple-table';
import { StatusBadge, type StatusTone } from '@/components/ui/status-badge';
import { formatDate, formatNumber, formatPercent } from '@/lib/format';
import { wearTone } from '@/lib/wear';
import { useVehicleWear, type DamperWear, type RouteDuty } from '../api/get-vehicle-wear';
import { DamperWearChart } from './damper-wear-chart';

const tone = (u: number, th: number): StatusTone => wearTone(u, th);
const toneWord: Record<StatusTone, string> = { ok: 'Within life', watch: 'Approaching', due: 'Past threshold', overdue: 'Past end of life', neutral: '' };

function DamperCard({ d, th }: { d: DamperWear; th: number }) {
  const p = d.prediction;
  const t = tone(d.lifeUsedFraction, th);
  return (
    <div className="rounded-md border border-line bg-surface p-3">
      <div className="flex items-center justify-between gap-2">
        <h3 className="font-semibold text-ink">{d.position} damper</h3>
        <StatusBadge tone={t}>
          {toneWord[t]} · {formatPercent(d.lifeUsedFraction)}
        </StatusBadge>
      </div>
      <DamperWearChart damper={d} thresholdFraction={th} />
      <dl className="mt-2 grid grid-cols-2 gap-x-4 gap-y-1 text-sm">
        <dt className="text-slate">Reaches {formatPercent(th)}</dt>
        <dd className="tabular text-right">{p?.thresholdDate ? formatDate(p.thresholdDate) : 'not predicted'}</dd>
        <dt className="text-slate">End of life</dt>
        <dd className="tabular text-right">{p?.endOfLifeDate ? formatDate(p.endOfLifeDate) : 'not predicted'}</dd>
        <dt className="text-slate">Duty rate (last {p?.windowDays ?? 30} days)</dt>
        <dd className="tabular text-right">{p ? `${formatNumber(p.rateJPerDay / 1000)} kJ/day` : '—'}</dd>
        <dt className="text-slate">Energy dissipated</dt>
        <dd className="tabular text-right">{formatNumber(d.energyJ / 1e6, 1)} MJ</dd>
        <dt className="text-slate">Rated life energy</dt>
        <dd className="tabular text-right">{p ? `${formatNumber(p.lifeEnergyJ / 1e6, 0)} MJ` : '—'}</dd>
        <dt className="text-slate">Estimated damping</dt>
        <dd className="tabular text-right">
          {formatNumber(d.dampingNsPerM)} N·s/m <span className="text-slate">of {formatNumber(d.nominalDampingNsPerM)}</span>
        </dd>
        <dt className="text-slate">Spring fatigue (Miner)</dt>
        <dd className="tabular text-right">{formatNumber(d.springDamage, 4)}</dd>
      </dl>
      {p?.basis ? <p className="mt-2 text-xs text-slate">Rests on: {p.basis.method}; {p.basis.life}; {p.basis.window}.</p> : null}
      {d.opening && d.opening.km >= 1 ? (
        <p className="mt-1 text-xs text-slate">
          Before the records: {formatNumber(d.opening.energyJ / 1e6, 1)} MJ for {d.opening.basis}.
        </p>
      ) : null}
    </div>
  );
}

const routeColumns: SimpleColumn<RouteDuty>[] = [
  { key: 'route', header: 'Route', rowHeader: true, cell: (r) => r.routeName },
  { key: 'axle', header: 'Axle', cell: (r) => (r.axleIndex === 0 ? 'front' : r.axleIndex === 1 ? 'rear' : `axle ${r.axleIndex + 1}`) },
  { key: 'trips', header: 'Trips', numeric: true, cell: (r) => formatNumber(r.trips) },
  { key: 'km', header: 'Distance', unit: 'km', numeric: true, cell: (r) => formatNumber(r.km) },
  { key: 'jpk', header: 'Energy per damper', unit: 'J/km', numeric: true, cell: (r) => formatNumber(r.energyJPerKm) },
  { key: 'share', header: 'Share of wear', unit: '%', numeric: true, cell: (r) => formatNumber(r.sharePct, 1) },
  { key: 'aw', header: 'Weighted body accel.', unit: 'm/s²', numeric: true, cell: (r) => formatNumber(r.avgWeightedAccel, 2) },
];

/** Wear of each fitted damper, the predicted path, which routes wear it, and the next inspection. */
export function VehicleWear({ vehicleId }: { vehicleId: number }) {
  const wear = useVehicleWear(vehicleId);
  if (wear.isPending) return <LoadingState label="Loading wear…" />;
  if (wear.error) return <ErrorState error={wear.error} what="the wear of this vehicle" onRetry={() => void wear.refetch()} />;
  const w = wear.data;
  const th = w.thresholdFraction;
  const estimated = w.dampers.some((d) => d.prediction);
  return (
    <>
      <Section title="Next inspection">
        {w.nextInspection ? (
          <div className="rounded-md border border-line bg-surface p-3">
            <p className="font-semibold text-ink">
              Due {formatDate(w.nextInspection.dueDate)} <span className="font-normal text-slate">({w.nextInspection.status})</span>
              {w.nextInspection.assigneeName ? <span className="font-normal text-slate"> · {w.nextInspection.assigneeName}</span> : null}
            </p>
            <p className="mt-1 text-sm text-ink">Why: {w.nextInspection.reason}</p>
          </div>
        ) : (
          <p className="text-sm text-slate">No inspection is open for this vehicle.</p>
        )}
      </Section>
      <Section title="Damper wear" description={`Consumed life from the roads driven; dashed: projected at the last ${w.windowDays} days’ rate to the ${formatPercent(th)} inspection point and end of life.`}>
        <Caution className="mb-4">{w.caution}</Caution>
        {!estimated ? (
          <EmptyState title="No wear estimated yet">
            The nightly run has not processed this vehicle’s trips yet. A manager can start it from the <Link to="/jobs" className="link">Job runs</Link> page.
          </EmptyState>
        ) : (
          <>
            <div className="grid gap-4 md:grid-cols-2">
              {w.dampers.map((d) => (
                <DamperCard key={d.id} d={d} th={th} />
              ))}
            </div>
            <details className="mt-3 text-sm text-slate">
              <summary className="cursor-pointer">What these figures rest on</summary>
              <ul className="mt-1 list-disc pl-5">
                {w.assumptions.map((a) => (
                  <li key={a}>{a}</li>
                ))}
              </ul>
            </details>
          </>
        )}
      </Section>
      <Section title="Duty by route" description="Which roads are wearing the fitted dampers.">
        {w.dutyByRoute.length ? (
          <SimpleTable label="Damper duty by route" columns={routeColumns} rows={w.dutyByRoute} getRowKey={(r) => `${r.routeId}-${r.axleIndex}`} />
        ) : (
          <p className="text-sm text-slate">No processed trips yet.</p>
        )}
      </Section>
    </>
  );
}
