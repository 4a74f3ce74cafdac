import { cx } from '@/lib/class-names';

/** A calm placeholder while data loads; announced once to screen readers. */
export function LoadingState({ label = 'Loading…', className }: { label?: string; className?: string }) {
  return (
    <div role="status" className={cx('flex items-center gap-2.5 py-8 text-sm text-slate', className)}>
      <span aria-hidden="true" className="inline-block size-4 animate-spin rounded-full border-2 border-line-strong border-t-accent" />
      {label}
    </div>
  );
}
