import type { ReactNode } from 'react';
import { cx } from '@/lib/class-names';
import { StatusShape } from './status-badge';

/** An inline message: `info` for a note, `ok` for a success, `error` for a failure to act on. */
export function Notice({
  tone = 'info',
  title,
  children,
  className,
  id,
}: {
  tone?: 'info' | 'ok' | 'error';
  title?: ReactNode;
  children?: ReactNode;
  className?: string;
  id?: string;
}) {
  const styles = {
    info: 'border-line-strong bg-surface',
    ok: 'border-ok/45 bg-ok-tint',
    error: 'border-overdue/45 bg-overdue-tint',
  }[tone];
  return (
    <div
      id={id}
      role={tone === 'error' ? 'alert' : 'status'}
      className={cx('flex gap-3 rounded-md border px-3.5 py-2.5 text-sm text-ink', styles, className)}
    >
      {tone === 'info' ? (
        <svg aria-hidden="true" viewBox="0 0 16 16" className="mt-0.5 size-4 shrink-0 text-slate">
          <circle cx="8" cy="8" r="7" fill="currentColor" />
          <rect x="7.2" y="7" width="1.6" height="5" fill="#fff" />
          <rect x="7.2" y="4" width="1.6" height="1.7" fill="#fff" />
        </svg>
      ) : (
        <StatusShape tone={tone === 'ok' ? 'ok' : 'overdue'} className="mt-0.5 size-4" />
      )}
      <div className="min-w-0">
        {title ? <p className="font-semibold">{title}</p> : null}
        {children ? <div className={title ? 'mt-0.5' : undefined}>{children}</div> : null}
      </div>
    </div>
  );
}
