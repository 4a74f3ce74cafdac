import type { ReactNode } from 'react';
import { cx } from '@/lib/class-names';

/** The grid's columns unless a page gives its own: 2, 3 from `sm`, 6 from `lg`. */
const DEFAULT_COLUMNS = 'grid-cols-2 sm:grid-cols-3 lg:grid-cols-6';

/**
 * A compact list of labelled facts about a record (a `<dl>`), in a responsive grid. `columns`
 * replaces the default column classes (the class list is not merged, so giving other
 * `grid-cols-*` in `className` would leave both in force and the stylesheet's order decide).
 */
export function Facts({ items, className, columns = DEFAULT_COLUMNS }: { items: Array<{ label: ReactNode; value: ReactNode; numeric?: boolean }>; className?: string; columns?: string }) {
  return (
    <dl className={cx('grid gap-x-6 gap-y-3', columns, className)}>
      {items.map((item, i) => (
        <div key={i} className="min-w-0">
          <dt className="text-[0.8125rem] text-slate">{item.label}</dt>
          <dd className={cx('mt-0.5 font-medium break-words text-ink', item.numeric && 'tabular')}>{item.value}</dd>
        </div>
      ))}
    </dl>
  );
}
