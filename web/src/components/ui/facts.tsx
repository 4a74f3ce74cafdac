import type { ReactNode } from 'react';
import { cx } from '@/lib/class-names';

/** A compact list of labelled facts about a record (a `<dl>`), in a responsive grid. */
export function Facts({ items, className }: { items: Array<{ label: ReactNode; value: ReactNode; numeric?: boolean }>; className?: string }) {
  return (
    <dl className={cx('grid grid-cols-2 gap-x-6 gap-y-3 sm:grid-cols-3 lg:grid-cols-6', className)}>
      {items.map((item, i) => (
        <div key={i} className="min-w-0">
          <dt className="text-[0.8125rem] text-slate">{item.label}</dt>
          <dd className={cx('mt-0.5 font-medium break-words text-ink', item.numeric && 'tabular')}>{item.value}</dd>
        </div>
      ))}
    </dl>
  );
}
