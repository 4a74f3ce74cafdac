import type { ReactNode } from 'react';
import { useId } from 'react';
import { cx } from '@/lib/class-names';

/** A titled part of a page; the heading names the region for screen readers. */
export function Section({
  title,
  description,
  actions,
  children,
  className,
  level = 2,
}: {
  title: ReactNode;
  description?: ReactNode;
  actions?: ReactNode;
  children: ReactNode;
  className?: string;
  level?: 2 | 3;
}) {
  const id = useId();
  const Heading = level === 2 ? 'h2' : 'h3';
  return (
    <section aria-labelledby={id} className={cx('mt-8 first:mt-0', className)}>
      <div className="mb-3 flex flex-wrap items-end justify-between gap-2 border-b border-line pb-2">
        <div>
          <Heading id={id} className={level === 2 ? 'text-lg font-semibold text-ink' : 'text-base font-semibold text-ink'}>
            {title}
          </Heading>
          {description ? <p className="mt-0.5 text-sm text-slate">{description}</p> : null}
        </div>
        {actions ? <div className="flex flex-wrap gap-2">{actions}</div> : null}
      </div>
      {children}
    </section>
  );
}
