import type { ReactNode } from 'react';
import { cx } from '@/lib/class-names';

/**
 * Status is never colour alone: each tone has its own shape as well as its colour, and the badge
 * always carries a word.
 *   ok — filled circle · watch — triangle · due — diamond · overdue — square with a bar · neutral — hollow circle
 */
export type StatusTone = 'ok' | 'watch' | 'due' | 'overdue' | 'neutral';

const toneClasses: Record<StatusTone, string> = {
  ok: 'border-ok/45 bg-ok-tint',
  watch: 'border-watch/50 bg-watch-tint',
  due: 'border-due/50 bg-due-tint',
  overdue: 'border-overdue/50 bg-overdue-tint',
  neutral: 'border-line-strong bg-mist',
};

export function StatusShape({ tone, className }: { tone: StatusTone; className?: string }) {
  const cls = cx('size-3 shrink-0', className);
  switch (tone) {
    case 'ok':
      return (
        <svg aria-hidden="true" viewBox="0 0 12 12" className={cx(cls, 'text-ok')}>
          <circle cx="6" cy="6" r="5" fill="currentColor" />
        </svg>
      );
    case 'watch':
      return (
        <svg aria-hidden="true" viewBox="0 0 12 12" className={cx(cls, 'text-watch')}>
          <path d="M6 0.8 11.4 11H0.6z" fill="currentColor" />
        </svg>
      );
    case 'due':
      return (
        <svg aria-hidden="true" viewBox="0 0 12 12" className={cx(cls, 'text-due')}>
          <path d="M6 0.3 11.7 6 6 11.7 0.3 6z" fill="currentColor" />
        </svg>
      );
    case 'overdue':
      return (
        <svg aria-hidden="true" viewBox="0 0 12 12" className={cx(cls, 'text-overdue')}>
          <rect x="0.5" y="0.5" width="11" height="11" rx="1.5" fill="currentColor" />
          <rect x="5.1" y="2.4" width="1.8" height="4.8" fill="#fff" />
          <rect x="5.1" y="8.2" width="1.8" height="1.6" fill="#fff" />
        </svg>
      );
    default:
      return (
        <svg aria-hidden="true" viewBox="0 0 12 12" className={cx(cls, 'text-slate')}>
          <circle cx="6" cy="6" r="4.2" fill="none" stroke="currentColor" strokeWidth="1.6" />
        </svg>
      );
  }
}

interface StatusBadgeProps {
  tone: StatusTone;
  children: ReactNode;
  size?: 'sm' | 'md';
  className?: string;
}

export function StatusBadge({ tone, children, size = 'sm', className }: StatusBadgeProps) {
  return (
    <span
      className={cx(
        'inline-flex items-center gap-1.5 rounded border font-medium whitespace-nowrap text-ink',
        size === 'sm' ? 'px-1.5 py-px text-[0.8125rem]' : 'px-2.5 py-1 text-sm',
        toneClasses[tone],
        className,
      )}
    >
      <StatusShape tone={tone} className={size === 'sm' ? 'size-2.5' : 'size-3'} />
      {children}
    </span>
  );
}
