import type { ReactNode } from 'react';
import { Button } from './button';

/**
 * Steps through a list kept newest first, `pageSize` at a time from page 1: Newer and Older
 * (`onStep` −1 or +1, each disabled at its end), then `count`, how many there are in words.
 */
export function NewerOlder({ page, pageSize, total, onStep, count }: { page: number; pageSize: number; total: number; onStep: (by: -1 | 1) => void; count: ReactNode }) {
  return (
    <div className="mt-3 flex items-center gap-2 text-sm text-slate">
      <Button size="sm" disabled={page <= 1} onClick={() => onStep(-1)}>
        Newer
      </Button>
      <Button size="sm" disabled={page * pageSize >= total} onClick={() => onStep(1)}>
        Older
      </Button>
      <span>{count}</span>
    </div>
  );
}
