import type { ReactNode } from 'react';
import { cx } from '@/lib/class-names';
import { Button } from './button';

/** A form's foot on the right: Cancel (`onCancel`) and the primary submit button (`children`), busy while its request runs. */
export function FormActions({ onCancel, busy, children, className }: { onCancel: () => void; busy: boolean; children: ReactNode; className?: string }) {
  return (
    <div className={cx('flex justify-end gap-2', className)}>
      <Button onClick={onCancel}>Cancel</Button>
      <Button type="submit" variant="primary" busy={busy}>
        {children}
      </Button>
    </div>
  );
}
