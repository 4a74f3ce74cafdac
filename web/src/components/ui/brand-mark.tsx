import { cx } from '@/lib/class-names';

/**
 * Reboundry's mark: a damped oscillation — a wheel's rebound settling — in paper on rebound
 * orange, beside the name.
 */
export function BrandMark({ className, withName = true }: { className?: string; withName?: boolean }) {
  return (
    <span className={cx('inline-flex items-center gap-2', className)}>
      <svg viewBox="0 0 32 32" aria-hidden="true" className="size-7 shrink-0">
        <rect width="32" height="32" rx="7" fill="#D9622B" />
        <path
          d="M5 16 C 8 4, 10 4, 12 16 S 15 25, 17 16 S 20 11, 22 16 S 25 18.5, 27 16"
          fill="none"
          stroke="#FAF8F3"
          strokeWidth="2.6"
          strokeLinecap="round"
        />
      </svg>
      {withName ? <span className="text-[1.0625rem] font-semibold tracking-tight text-ink">Reboundry</span> : null}
    </span>
  );
}
