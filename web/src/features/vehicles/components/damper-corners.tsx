import { Caution } from '@/components/ui/caution';
import { StatusBadge } from '@/components/ui/status-badge';
import { cx } from '@/lib/class-names';
import { formatDate, formatPercent, formatQuantity } from '@/lib/format';
import { axleLabel, type SpecAxle } from '@/lib/suspension';
import { WEAR_BANDS, wearRule, wearTone, wearWords } from '@/lib/wear';
import type { Damper, DamperPosition } from '../api/get-vehicle';

export const positionNames: Record<DamperPosition, string> = {
  FL: 'Front left',
  FR: 'Front right',
  ML: 'Middle left',
  MR: 'Middle right',
  RL: 'Rear left',
  RR: 'Rear right',
};

const axleRows: Array<{ key: 'F' | 'M' | 'R'; left: DamperPosition; right: DamperPosition }> = [
  { key: 'F', left: 'FL', right: 'FR' },
  { key: 'M', left: 'ML', right: 'MR' },
  { key: 'R', left: 'RL', right: 'RR' },
];

/** The spec axle that a corner position belongs to: by name, else by order (first, middle, last). */
function axleFor(axles: SpecAxle[], key: 'F' | 'M' | 'R'): SpecAxle | undefined {
  const byName = axles.find((a) => a.axle.toLowerCase().startsWith({ F: 'front', M: 'mid', R: 'rear' }[key]));
  if (byName) return byName;
  if (key === 'F') return axles[0];
  if (key === 'R') return axles[axles.length - 1];
  return axles.length === 3 ? axles[1] : undefined;
}

interface DamperCornersProps {
  dampers: Damper[];
  axles: SpecAxle[];
  odometerKm: number;
  /** Single column with large type, for the driver's phone. */
  compact?: boolean;
}

/**
 * The dampers now fitted, laid out as seen from above (front at the top, left on the left), each
 * with its estimated life used, when and at what odometer reading it was fitted.
 */
export function DamperCorners({ dampers, axles, odometerKm, compact }: DamperCornersProps) {
  const fitted = dampers.filter((d) => !d.removedAt);
  const byPosition = new Map(fitted.map((d) => [d.position, d]));
  const rows = axleRows.filter((r) => byPosition.has(r.left) || byPosition.has(r.right) || (r.key !== 'M' && axles.length > 0));

  if (fitted.length === 0) {
    return <p className="text-sm text-slate">No dampers are recorded as fitted to this vehicle. A mechanic records them when fitting or replacing one.</p>;
  }

  return (
    <div>
      <div className="flex flex-col gap-3">
        {rows.map((row) => {
          const axle = axleFor(axles, row.key);
          return (
            <div key={row.key} role="group" aria-label={`${axle ? axleLabel(axle.axle) : positionNames[row.left].split(' ')[0]} axle`}>
              <p className="mb-1.5 flex items-baseline gap-2 text-[0.8125rem] text-slate">
                <span className="font-semibold text-ink">{axle ? axleLabel(axle.axle) : positionNames[row.left].split(' ')[0]} axle</span>
                {axle ? <span>rated damper life {formatQuantity(axle.ratedDamperLifeKm, 'km')}</span> : null}
              </p>
              <div className="grid grid-cols-2 gap-2 sm:gap-3">
                {[row.left, row.right].map((pos) => (
                  <DamperCard key={pos} position={pos} damper={byPosition.get(pos)} odometerKm={odometerKm} compact={compact} />
                ))}
              </div>
            </div>
          );
        })}
      </div>
      <p className="mt-3 text-[0.8125rem] text-slate">
        Life used is estimated by the duty model from the roads this vehicle drove, against the rated damper life of its
        axle. {wearRule}
      </p>
      <Caution className="mt-3">
        These are model estimates. They support, and do not replace, inspection by a qualified mechanic and the
        manufacturer&rsquo;s and local regulations&rsquo; requirements.
      </Caution>
    </div>
  );
}

function DamperCard({ position, damper, odometerKm, compact }: { position: DamperPosition; damper?: Damper; odometerKm: number; compact?: boolean }) {
  if (!damper) {
    return (
      <div className="rounded-md border border-dashed border-line-strong px-3 py-3 text-sm text-slate">
        <p className="font-medium text-ink">{positionNames[position]}</p>
        <p className="mt-1">No damper recorded.</p>
      </div>
    );
  }
  const tone = wearTone(damper.lifeUsedFraction);
  const fraction = damper.lifeUsedFraction ?? 0;
  const sinceFitted = odometerKm - damper.installedOdometerKm;
  const barColour = { ok: 'bg-ok', watch: 'bg-watch', due: 'bg-due', overdue: 'bg-overdue', neutral: 'bg-line-strong' }[tone];

  return (
    <article aria-label={`${positionNames[position]} damper`} className="rounded-md border border-line bg-surface px-3 py-3">
      <header className="flex flex-wrap items-center justify-between gap-x-2 gap-y-1">
        <h3 className="text-sm font-semibold text-ink">
          {positionNames[position]} <span className="font-normal text-slate">{position}</span>
        </h3>
        <StatusBadge tone={tone}>{wearWords[tone]}</StatusBadge>
      </header>
      <p className="mt-2 flex items-baseline justify-between gap-2">
        <span className="text-[0.8125rem] text-slate">Life used</span>
        <span className={cx('tabular font-semibold text-ink', compact ? 'text-xl' : 'text-lg')}>{formatPercent(damper.lifeUsedFraction)}</span>
      </p>
      <div aria-hidden="true" className="relative mt-1 h-1.5 rounded-full bg-mist">
        <div className={cx('h-full rounded-full', barColour)} style={{ width: `${Math.min(100, Math.max(0, fraction * 100))}%` }} />
        {[WEAR_BANDS.watchFrom, WEAR_BANDS.dueFrom].map((mark) => (
          <span key={mark} className="absolute top-[-2px] h-2.5 w-px bg-slate/60" style={{ left: `${mark * 100}%` }} />
        ))}
      </div>
      <dl className="mt-2.5 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-[0.8125rem]">
        <dt className="text-slate">Fitted</dt>
        <dd className="tabular text-right text-ink">
          <time dateTime={damper.installedAt}>{formatDate(damper.installedAt)}</time>
        </dd>
        <dt className="text-slate">at odometer</dt>
        <dd className="tabular text-right text-ink">{formatQuantity(damper.installedOdometerKm, 'km')}</dd>
        <dt className="text-slate">Driven since</dt>
        <dd className="tabular text-right text-ink">{formatQuantity(sinceFitted, 'km')}</dd>
        {!compact && damper.dampingNsPerM ? (
          <>
            <dt className="text-slate">Damping est.</dt>
            <dd className="tabular text-right text-ink">{formatQuantity(damper.dampingNsPerM, 'N·s/m')}</dd>
          </>
        ) : null}
      </dl>
    </article>
  );
}
