import type { ReactNode } from 'react';
import { cx } from '@/lib/class-names';

/** What to show when there is nothing yet: what this place is for, and what to do next. */
export function EmptyState({ title, children, action, className }: { title: string; children?: ReactNode; action?: ReactNode; className?: string }) {
  return (
    <div className={cx('rounded-md border border-dashed border-line-strong bg-surface/60 px-5 py-8 text-center', className)}>
      <p className="font-semibold text-ink">{title}</p>
      {children ? <div className="mx-auto mt-1.5 max-w-prose text-sm text-slate">{children}</div> : null}
      {action ? <div className="mt-4 flex justify-center">{action}</div> : null}
    </div>
  );
}
