import { Link } from 'react-router';
import { Caution } from '@/components/ui/caution';
import { EmptyState } from '@/components/ui/empty-state';
import { ErrorState } from '@/components/ui/error-state';
import { LoadingState } from '@/components/ui/loading-state';
import { Section } from '@/components/ui/section';
import { SentenceList } from '@/components/ui/sentence-list';
import { SimpleTable, type SimpleColumn } from '@/components/ui/simple-table';
import { StatusBadge, type StatusTone } from '@/components/ui/status-badge';
import { formatDate, formatNumber, formatPercent, formatQuantity } from '@/lib/format';
import { wearTone } from '@/lib/wear';
import { useVehicleWear, type DamperWear, type LifeSource, type RouteDuty, type WearPrediction } from '../api/get-vehicle-wear';
import { DamperWearChart } from './damper-wear-chart';

const tone = (u: number, th: number): StatusTone => wearTone(u, th);
const toneWord: Record<StatusTone, string> = { ok: 'Within life', watch: 'Approaching', due: 'Past threshold', overdue: 'Past end of life', neutral: '' };

const LIFE_SOURCE_WORDS: Record<LifeSource, string> = {
  prior: "from the trade's prior (no removal for wear on record yet)",
  fleet: "fitted to the fleet's own removals",
  'test-lane': 'calibrated by a test-lane result on this damper',
};

/** The end-of-life date in words: the median, its P10–P90 range, and whether the calendar limit sets it. */
function EndOfLife({ p }: { p: WearPrediction }) {
  if (!p.endOfLifeDate) return <>not predicted</>;
  const spread = p.endOfLifeP10Date && p.endOfLifeP90Date && p.endOfLifeP10Date !== p.endOfLifeP90Date;
  return (
    <>
      {formatDate(p.endOfLifeDate)}
      {p.governedBy === 'calendar' ? <span className="text-slate"> (calendar limit)</span> : null}
      {spread ? (
        <span className="block text-xs text-slate">
          P10–P90: {formatDate(p.endOfLifeP10Date)} – {formatDate(p.endOfLifeP90Date)}
        </span>
      ) : null}
    </>
  );
}

function DamperCard({ d, th }: { d: DamperWear; th: number }) {
  const p = d.prediction;
  const t = tone(d.lifeUsedFraction, th);
  const recordedKm = d.history.reduce((s, h) => s + h.distanceKm, 0);
  const openingKm = d.opening?.km ?? 0;
  const days = p?.windowDays ?? 30;
  // P10–P90 of the life in km at its own recent road mix, like the median
  const perKm = p?.severity ?? null;
  const lifeRange = p && perKm && p.lifeP10WearKm !== null && p.lifeP90WearKm !== null ? [p.lifeP10WearKm / perKm, p.lifeP90WearKm / perKm] : null;
  return (
    <div className="rounded-md border border-line bg-surface p-3">
      <div className="flex items-center justify-between gap-2">
        <h3 className="font-semibold text-ink">{d.position} damper</h3>
        <StatusBadge tone={t}>
          {toneWord[t]} · {formatPercent(d.lifeUsedFraction)}
        </StatusBadge>
      </div>
      <DamperWearChart damper={d} thresholdFraction={th} />
      <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="text-slate">Life used</dt>
        <dd className="tabular text-right">
          {formatPercent(d.lifeUsedFraction)} of its expected life
          {p ? (
            <span className="block text-xs text-slate">
              by distance {formatPercent(p.distanceLifeUsed)}, by age {formatPercent(p.calendarLifeUsed)}
            </span>
          ) : null}
        </dd>
        <dt className="text-slate">Still to go on its recent roads</dt>
        <dd className="tabular text-right">
          {p?.lifeKm ? `about ${formatQuantity(Math.max(0, 1 - p.distanceLifeUsed) * p.lifeKm, 'km')}` : '—'}
          {p?.lifeKm ? <span className="block text-xs text-slate">to the median end of life by distance, at the last {days} days’ road mix</span> : null}
        </dd>
        <dt className="text-slate">A new damper’s life on these roads</dt>
        <dd className="tabular text-right">
          {p?.lifeKm ? formatQuantity(p.lifeKm, 'km') : '—'}
          {lifeRange ? (
            <span className="block text-xs text-slate">
              P10–P90: {formatNumber(lifeRange[0])}–{formatNumber(lifeRange[1])} km
            </span>
          ) : null}
        </dd>
        <dt className="text-slate">Driven since fitted</dt>
        <dd className="tabular text-right">
          {formatQuantity(recordedKm + openingKm, 'km')}
          {openingKm >= 1 ? <span className="block text-xs text-slate">{formatQuantity(openingKm, 'km')} before the trips on record</span> : null}
        </dd>
        <dt className="text-slate">Driving (last {days} days)</dt>
        <dd className="tabular text-right">{p ? `${formatNumber(p.kmPerDay)} km/day` : '—'}</dd>
        <dt className="text-slate">Road severity (last {days} days)</dt>
        <dd className="tabular text-right">
          {p?.severity ? `${formatNumber(p.severity, 2)}×` : '—'}
          <span className="block text-xs text-slate">1 = ISO 8608 class B at 80 km/h</span>
        </dd>
        <dt className="text-slate">Reaches {formatPercent(th)}</dt>
        <dd className="tabular text-right">{p?.thresholdDate ? formatDate(p.thresholdDate) : 'not predicted'}</dd>
        <dt className="text-slate">End of life</dt>
        <dd className="tabular text-right">{p ? <EndOfLife p={p} /> : 'not predicted'}</dd>
        {d.opening && d.opening.km >= 1 ? (
          <>
            <dt className="text-slate">Worn before the records</dt>
            <dd className="tabular text-right">
              {formatPercent(d.opening.share)} of its life
              {d.opening.shareHigh - d.opening.shareLow >= 0.005 ? (
                <span className="block text-xs text-slate">
                  range {formatNumber(d.opening.shareLow * 100)}–{formatNumber(d.opening.shareHigh * 100)} %
                </span>
              ) : null}
            </dd>
          </>
        ) : null}
        <dt className="text-slate">Estimated damping</dt>
        <dd className="tabular text-right">
          {formatNumber(d.dampingNsPerM)} N·s/m <span className="text-slate">of {formatNumber(d.nominalDampingNsPerM)}</span>
        </dd>
        <dt className="text-slate">Spring fatigue (Miner)</dt>
        <dd className="tabular text-right">{formatNumber(d.springDamage, 4)}</dd>
      </dl>
      {p ? (
        <p className="mt-2 text-xs text-slate">Because: {p.basis ? p.basis.life : `the life is ${LIFE_SOURCE_WORDS[p.lifeSource] ?? p.lifeSource}`}.</p>
      ) : null}
      {p?.basis ? (
        <details className="mt-1 text-xs text-slate">
          <summary className="cursor-pointer">How the dates were worked out</summary>
          <ul className="mt-1 list-disc pl-4">
            <li>{p.basis.window}</li>
            <li>{p.basis.method}</li>
            <li>{p.basis.calendar}</li>
            {d.opening && d.opening.km >= 1 ? <li>opening wear: {p.basis.opening}</li> : null}
            <li>{p.basis.damping}</li>
          </ul>
        </details>
      ) : null}
    </div>
  );
}

/**
 * Each route's share of the fitted dampers' wear: its distance weighted by its mean road
 * severity to the power `b` (the spec's road sensitivity), over all rows. An estimate: the
 * route's mean severity stands for each of its trips'.
 */
function wearShares(rows: RouteDuty[], b: number | null): Map<RouteDuty, number> | null {
  if (b === null) return null;
  const w = rows.map((r) => r.km * Math.max(0, r.severity) ** b);
  const total = w.reduce((s, x) => s + x, 0);
  return total > 0 ? new Map(rows.map((r, i) => [r, w[i] / total])) : null;
}

const axleWord = (i: number) => (i === 0 ? 'front' : i === 1 ? 'rear' : `axle ${i + 1}`);

/** Wear of each fitted damper, the predicted path, which routes wear it, and the next inspection. */
export function VehicleWear({ vehicleId }: { vehicleId: number }) {
  const wear = useVehicleWear(vehicleId);
  if (wear.isPending) return <LoadingState label="Loading wear…" />;
  if (wear.error) return <ErrorState error={wear.error} what="the wear of this vehicle" onRetry={() => void wear.refetch()} />;
  const w = wear.data;
  const th = w.thresholdFraction;
  const estimated = w.dampers.some((d) => d.prediction);
  const b = w.dampers.map((d) => d.prediction?.roadSensitivity).find((x): x is number => typeof x === 'number') ?? null;
  const shares = wearShares(w.dutyByRoute, b);
  const routeColumns: SimpleColumn<RouteDuty>[] = [
    { key: 'route', header: 'Route', rowHeader: true, cell: (r) => r.routeName },
    { key: 'axle', header: 'Axle', cell: (r) => axleWord(r.axleIndex) },
    { key: 'trips', header: 'Trips', numeric: true, cell: (r) => formatNumber(r.trips) },
    { key: 'km', header: 'Distance', unit: 'km', numeric: true, cell: (r) => formatNumber(r.km) },
    { key: 'sev', header: 'Road severity', unit: '×', numeric: true, cell: (r) => formatNumber(r.severity, 2) },
    ...(shares ? [{ key: 'share', header: 'Share of wear', unit: '%', numeric: true, cell: (r: RouteDuty) => formatNumber((shares.get(r) ?? 0) * 100, 1) }] : []),
    { key: 'aw', header: 'Weighted body accel.', unit: 'm/s²', numeric: true, cell: (r) => formatNumber(r.avgWeightedAccel, 2) },
  ];
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
      <Section
        title="Damper wear"
        description={`Life used from the roads driven, against the life expected on those roads. Dashed: projected at the last ${w.windowDays} days’ rate to the ${formatPercent(th)} inspection point and end of life; shaded: end of life between P10 and P90.`}
      >
        {/* The general safety caution is with the first wear figures on the page (Dampers by corner); this one is about the dates. */}
        <Caution className="mb-4">
          The dates assume the last {w.windowDays} days&rsquo; driving goes on: a new route, load or season moves them. The shaded range is where most dampers like
          these reach the end of their life, not a promise for this one.
        </Caution>
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
              <SentenceList items={w.assumptions} className="mt-1 list-disc pl-5" />
            </details>
          </>
        )}
      </Section>
      <Section title="Duty by route" description="Which roads are wearing the fitted dampers. Road severity 1 is ISO 8608 class B at 80 km/h; about 2 on class C, 4 on class D.">
        {w.dutyByRoute.length ? (
          <SimpleTable
            label="Damper duty by route"
            columns={routeColumns}
            rows={w.dutyByRoute}
            getRowKey={(r) => `${r.routeId}-${r.axleIndex}`}
            footer={
              shares
                ? `Share of wear: each route's distance weighted by its mean road severity to the power ${formatNumber(b, 2)} (the spec's fitted road sensitivity), over all routes and axles; an estimate from the route's mean.`
                : undefined
            }
          />
        ) : (
          <p className="text-sm text-slate">No processed trips yet.</p>
        )}
      </Section>
    </>
  );
}
