import { cx } from '@/lib/class-names';
import { isRoughnessClass, ROUGHNESS_CLASSES, roughnessColours, roughnessWords, UNKNOWN_ROUGHNESS_COLOUR } from '@/lib/roughness';

/** An ISO 8608 class: a swatch of its colour, then its letter and word (text never sits on the colour). */
export function RoughnessClassBadge({ value }: { value: string | null | undefined }) {
  if (!isRoughnessClass(value)) return <span className="text-slate">Not known</span>;
  return (
    <span className="inline-flex items-center gap-1.5 whitespace-nowrap">
      <span aria-hidden="true" className="inline-block size-3.5 shrink-0 rounded-sm" style={{ backgroundColor: roughnessColours[value] }} />
      <span>
        <span className="font-semibold">{value}</span> {roughnessWords[value]}
      </span>
    </span>
  );
}

/** The legend of the roughness scale, shown wherever the scale is used. */
export function RoughnessLegend({ className, unknown = true }: { className?: string; /** Show the dashed "not known" entry (maps draw such segments). */ unknown?: boolean }) {
  return (
    <figure className={cx('text-[0.8125rem] text-slate', className)}>
      <figcaption className="mb-1 font-medium text-ink">Road roughness, ISO 8608 class</figcaption>
      <ol className="flex flex-wrap gap-x-3 gap-y-1">
        {ROUGHNESS_CLASSES.map((c) => (
          <li key={c} className="inline-flex items-center gap-1.5">
            <span aria-hidden="true" className="inline-block h-3 w-5 rounded-sm" style={{ backgroundColor: roughnessColours[c] }} />
            <span>
              <span className="font-semibold text-ink">{c}</span> {roughnessWords[c]}
            </span>
          </li>
        ))}
        {unknown ? (
          <li className="inline-flex items-center gap-1.5">
            <svg aria-hidden="true" viewBox="0 0 20 12" className="h-3 w-5">
              <line x1="0" y1="6" x2="20" y2="6" stroke={UNKNOWN_ROUGHNESS_COLOUR} strokeWidth="4" strokeDasharray="6 4" />
            </svg>
            <span>dashed: not known yet</span>
          </li>
        ) : null}
      </ol>
    </figure>
  );
}
