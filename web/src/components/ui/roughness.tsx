import { cx } from '@/lib/class-names';
import { isRoughnessClass, ROUGHNESS_CLASSES, roughnessColours, roughnessWords } from '@/lib/roughness';

/** An ISO 8608 class: its letter on its colour swatch, with the word for screen readers and tooltips. */
export function RoughnessClassBadge({ value }: { value: string | null | undefined }) {
  if (!isRoughnessClass(value)) return <span className="text-slate">Not known</span>;
  const dark = ROUGHNESS_CLASSES.indexOf(value) >= 4;
  return (
    // `relative` keeps the screen-reader text inside the badge: without it, in a scrolled table, that
    // absolutely placed text escapes the scroll box and makes the whole page taller.
    <span className="relative inline-flex items-center gap-2 whitespace-nowrap">
      <span
        aria-hidden="true"
        className={cx('inline-flex size-5 items-center justify-center rounded-sm text-xs font-semibold', dark ? 'text-white' : 'text-ink')}
        style={{ backgroundColor: roughnessColours[value] }}
      >
        {value}
      </span>
      <span>
        <span className="sr-only">Class {value}, </span>
        {roughnessWords[value]}
      </span>
    </span>
  );
}

/** The legend of the roughness scale, shown wherever the scale is used. */
export function RoughnessLegend({ className }: { className?: string }) {
  return (
    <figure className={cx('text-[0.8125rem] text-slate', className)}>
      <figcaption className="mb-1 font-medium text-ink">Road roughness, ISO 8608 class</figcaption>
      <ol className="flex flex-wrap gap-x-3 gap-y-1">
        {ROUGHNESS_CLASSES.map((c) => (
          <li key={c} className="inline-flex items-center gap-1.5">
            <span aria-hidden="true" className="inline-block h-3 w-5 rounded-sm border border-ink/10" style={{ backgroundColor: roughnessColours[c] }} />
            <span>
              <span className="font-semibold text-ink">{c}</span> {roughnessWords[c]}
            </span>
          </li>
        ))}
      </ol>
    </figure>
  );
}
