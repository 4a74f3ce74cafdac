import type { ReactNode } from 'react';
import { cx } from '@/lib/class-names';

/** A single summary figure with its unit, e.g. "31 vehicles in service". */
export function FigureCard({
  label,
  value,
  unit,
  icon,
  footer,
  className,
}: {
  label: ReactNode;
  value: ReactNode;
  unit: string;
  icon?: ReactNode;
  footer?: ReactNode;
  className?: string;
}) {
  return (
    <div className={cx('rounded-md border border-line bg-surface px-4 py-3.5', className)}>
      <div className="flex items-center gap-2 text-sm font-medium text-ink">
        {icon}
        {label}
      </div>
      <p className="mt-1.5 flex items-baseline gap-1.5">
        <span className="tabular text-3xl font-semibold tracking-tight text-ink">{value}</span>
        <span className="text-sm text-slate">{unit}</span>
      </p>
      {footer ? <div className="mt-2 text-sm text-slate">{footer}</div> : null}
    </div>
  );
}
