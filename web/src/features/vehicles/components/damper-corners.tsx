import { Caution } from '@/components/ui/caution';
import { StatusBadge } from '@/components/ui/status-badge';
import { cx } from '@/lib/class-names';
import { formatDate, formatPercent, formatQuantity } from '@/lib/format';
import { axleLabel, type SpecAxle } from '@/lib/suspension';
import { DEFAULT_INSPECTION_THRESHOLD, wearBands, wearRule, wearTone, wearWords } from '@/lib/wear';
import { hasWearEstimate, type Damper } from '../api/get-vehicle';

const sideNames: Record<string, string> = { L: 'left', R: 'right' };
const rowNames: Record<string, string> = { F: 'Front', M: 'Middle', R: 'Rear' };

/** `FL` → `Front left`; unknown codes are shown as they are. */
export function positionName(position: string): string {
  const row = rowNames[position.charAt(0)];
  const side = sideNames[position.charAt(position.length - 1)];
  return row && side ? `${row} ${side}` : position;
}

interface DamperCornersProps {
  dampers: Damper[];
  axles: SpecAxle[];
  /** Larger figures and fewer details, for the driver's phone. */
  compact?: boolean;
  /** Fraction of life at which inspection is due (the server's setting). */
  threshold?: number;
}

/**
 * The dampers now fitted, laid out as seen from above (front axle at the top, left on the left),
 * each with its estimated life used, and when, at what odometer reading and how far ago it was fitted.
 */
export function DamperCorners({ dampers, axles, compact, threshold = DEFAULT_INSPECTION_THRESHOLD }: DamperCornersProps) {
  const fitted = dampers.filter((d) => !d.removedAt);
  if (fitted.length === 0) {
    return (
      <p className="text-sm text-slate">
        No dampers are recorded as fitted to this vehicle. A mechanic records them when fitting or replacing one.
      </p>
    );
  }

  const axleIndexes = [...new Set([...axles.map((a) => a.axleIndex), ...fitted.map((d) => d.axleIndex)])].sort((a, b) => a - b);
  const anyEstimate = fitted.some(hasWearEstimate);

  return (
    <div>
      <div className="flex flex-col gap-4">
        {axleIndexes.map((index) => {
          const axle = axles.find((a) => a.axleIndex === index);
          const onAxle = fitted.filter((d) => d.axleIndex === index);
          const left = onAxle.find((d) => d.position.endsWith('L'));
          const right = onAxle.find((d) => d.position.endsWith('R'));
          const name = axle ? `${axleLabel(axle.label)} axle` : `Axle ${index + 1}`;
          return (
            <div key={index} role="group" aria-label={name}>
              <p className="mb-1.5 flex flex-wrap items-baseline gap-x-2 text-[0.8125rem] text-slate">
                <span className="font-semibold text-ink">{name}</span>
                {axle ? <span>rated damper life {formatQuantity(axle.ratedDamperLifeKm, 'km')}</span> : null}
              </p>
              <div className="grid grid-cols-2 gap-2 sm:gap-3">
                <DamperCard damper={left} fallback={`${name}, left`} ratedLifeKm={axle?.ratedDamperLifeKm} compact={compact} threshold={threshold} />
                <DamperCard damper={right} fallback={`${name}, right`} ratedLifeKm={axle?.ratedDamperLifeKm} compact={compact} threshold={threshold} />
              </div>
            </div>
          );
        })}
      </div>
      <p className="mt-3 text-[0.8125rem] text-slate">
        {anyEstimate
          ? `Life used is the wear model's estimate from the roads, speeds and loads of this vehicle's trips, against the life the spec's model expects on those roads (see Damper wear below). ${wearRule(threshold)}`
          : 'The nightly wear run has not estimated these dampers yet; until it has, the distance driven on each against its rated life is the guide.'}
      </p>
      <Caution className="mt-3">
        Wear figures are estimates. They support, and do not replace, inspection by a qualified mechanic and the
        manufacturer&rsquo;s and local regulations&rsquo; requirements.
      </Caution>
    </div>
  );
}

function DamperCard({ damper, fallback, ratedLifeKm, compact, threshold }: { damper?: Damper; fallback: string; ratedLifeKm?: number; compact?: boolean; threshold: number }) {
  if (!damper) {
    return (
      <div className="rounded-md border border-dashed border-line-strong px-3 py-3 text-sm text-slate">
        <p className="font-medium text-ink">{fallback}</p>
        <p className="mt-1">No damper recorded.</p>
      </div>
    );
  }
  const estimated = hasWearEstimate(damper);
  const kmShare = ratedLifeKm ? damper.distanceKm / ratedLifeKm : null;
  const tone = estimated ? wearTone(damper.lifeUsedFraction ?? 0, threshold) : 'neutral';
  const bands = wearBands(threshold);
  // km it ran before the trips on record: included in life used at an estimated rate
  const opening = estimated && damper.openingKm ? damper.openingKm : 0;
  // One life figure per damper, with what it rests on: the wear model's estimate once the wear run
  // has made one; until then the distance driven against the axle's rated life.
  const headline = estimated
    ? { label: 'Life used', value: formatPercent(damper.lifeUsedFraction), fraction: damper.lifeUsedFraction ?? 0, basis: compact ? 'wear model' : 'wear model, from its roads, speeds and loads' }
    : { label: 'Life used', value: formatPercent(kmShare), fraction: kmShare ?? 0, basis: ratedLifeKm ? `distance driven against the rated ${formatQuantity(ratedLifeKm, 'km')}; the wear run has not estimated it yet` : 'not estimated yet' };
  const barColour = { ok: 'bg-ok', watch: 'bg-watch', due: 'bg-due', overdue: 'bg-overdue', neutral: 'bg-slate/70' }[tone];
  const name = positionName(damper.position);

  return (
    <article aria-label={`${name} damper`} className="min-w-0 rounded-md border border-line bg-surface px-3 py-3">
      <header className="flex flex-wrap items-center justify-between gap-x-2 gap-y-1">
        <h3 className="text-sm font-semibold text-ink">
          {name} <span className="font-normal text-slate">{damper.position}</span>
        </h3>
        <StatusBadge tone={tone}>{estimated ? wearWords[tone] : 'Not estimated yet'}</StatusBadge>
      </header>
      <p className="mt-2 flex items-baseline justify-between gap-2">
        <span className="text-[0.8125rem] text-slate">{headline.label}</span>
        <span className={cx('tabular font-semibold text-ink', compact ? 'text-xl' : 'text-lg')}>{headline.value}</span>
      </p>
      <div aria-hidden="true" className="relative mt-1 h-1.5 rounded-full bg-mist">
        <div className={cx('h-full rounded-full', barColour)} style={{ width: `${Math.min(100, Math.max(0, headline.fraction * 100))}%` }} />
        {estimated
          ? [bands.watchFrom, bands.dueFrom].map((mark) => (
              <span key={mark} className="absolute -top-0.5 h-2.5 w-px bg-slate/60" style={{ left: `${mark * 100}%` }} />
            ))
          : null}
      </div>
      <p className="mt-1 text-xs text-slate" data-testid="life-basis">
        Basis: {headline.basis}
        {estimated && damper.wearUpdatedAt ? `, estimated ${formatDate(damper.wearUpdatedAt)}` : ''}.
      </p>
      {opening >= 1 ? (
        <p className="mt-1 text-xs text-slate" title={damper.openingBasis ?? undefined}>
          Includes an estimate for {formatQuantity(opening, 'km')} driven before the trips on record.
        </p>
      ) : null}
      {compact ? (
        <dl className="mt-2.5 flex flex-col gap-1.5 text-sm">
          <div>
            <dt className="text-[0.8125rem] text-slate">Fitted</dt>
            <dd className="tabular text-ink">
              <time dateTime={damper.installedAt}>{formatDate(damper.installedAt)}</time>
            </dd>
          </div>
          <div>
            <dt className="text-[0.8125rem] text-slate">Driven on it</dt>
            <dd className="tabular text-ink">{formatQuantity(damper.distanceKm, 'km')}</dd>
          </div>
        </dl>
      ) : (
        <dl className="mt-2.5 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-[0.8125rem]">
          <dt className="text-slate">Fitted</dt>
          <dd className="tabular text-right text-ink">
            <time dateTime={damper.installedAt}>{formatDate(damper.installedAt)}</time>
          </dd>
          <dt className="text-slate">at odometer</dt>
          <dd className="tabular text-right text-ink">{formatQuantity(damper.installedOdometerKm, 'km')}</dd>
          <dt className="text-slate">Driven on it</dt>
          <dd className="tabular text-right text-ink">{formatQuantity(damper.distanceKm, 'km')}</dd>
          {damper.dampingNsPerM ? (
            <>
              <dt className="text-slate">Damping est.</dt>
              <dd className="tabular text-right text-ink">{formatQuantity(damper.dampingNsPerM, 'N·s/m')}</dd>
            </>
          ) : null}
          {damper.partNumber ? (
            <>
              <dt className="text-slate">Part</dt>
              <dd className="truncate text-right font-mono text-xs leading-5 text-ink">{damper.partNumber}</dd>
            </>
          ) : null}
        </dl>
      )}
    </article>
  );
}
