import type { ReactNode } from 'react';
import { cx } from '@/lib/class-names';

/**
 * A short, always-visible caution next to a number that could hurt someone if trusted blindly
 * (wear predictions, vibration exposure). Never collapsed behind a click.
 */
export function Caution({ title = 'Caution', children, className }: { title?: string; children: ReactNode; className?: string }) {
  return (
    // a note, not a landmark: a page may carry several, and landmarks must each have their own name
    <div
      role="note"
      aria-label={title}
      className={cx('flex gap-3 rounded-md border border-watch/45 border-l-4 border-l-watch bg-watch-tint/70 px-3.5 py-2.5 text-sm', className)}
    >
      <svg aria-hidden="true" viewBox="0 0 16 16" className="mt-0.5 size-4 shrink-0 text-watch">
        <path d="M8 1 15.2 14.5H0.8z" fill="currentColor" />
        <rect x="7.2" y="5.4" width="1.6" height="5" fill="#fff" />
        <rect x="7.2" y="11.3" width="1.6" height="1.6" fill="#fff" />
      </svg>
      <div className="text-ink">
        <span className="font-semibold">{title}. </span>
        {children}
      </div>
    </div>
  );
}
