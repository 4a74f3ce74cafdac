import type { ReactNode } from 'react';
import { Link } from 'react-router';
import { cx } from '@/lib/class-names';

interface PageHeaderProps {
  title: ReactNode;
  /** One line on what this page is for. */
  description?: ReactNode;
  /** A way back up, e.g. `{ to: '/vehicles', label: 'Vehicles' }`. */
  back?: { to: string; label: string };
  /** Small text above the title, e.g. a record's kind. */
  eyebrow?: ReactNode;
  actions?: ReactNode;
  /** Status badges and the like, shown beside the title. */
  badges?: ReactNode;
  className?: string;
}

export function PageHeader({ title, description, back, eyebrow, actions, badges, className }: PageHeaderProps) {
  return (
    <header className={cx('mb-6 flex flex-col gap-3 sm:flex-row sm:items-end sm:justify-between', className)}>
      <div className="min-w-0">
        {back ? (
          <Link
            to={back.to}
            className="mb-2 inline-flex items-center gap-1 text-sm text-slate hover:text-ink pointer-coarse:py-2"
          >
            <span aria-hidden="true">←</span> {back.label}
          </Link>
        ) : null}
        {eyebrow ? <p className="text-sm font-medium text-slate">{eyebrow}</p> : null}
        <div className="flex flex-wrap items-center gap-x-3 gap-y-1.5">
          <h1 className="text-2xl font-semibold tracking-tight text-ink">{title}</h1>
          {badges}
        </div>
        {description ? <p className="mt-1 max-w-3xl text-[0.9375rem] text-slate">{description}</p> : null}
      </div>
      {actions ? <div className="flex shrink-0 flex-wrap gap-2">{actions}</div> : null}
    </header>
  );
}
