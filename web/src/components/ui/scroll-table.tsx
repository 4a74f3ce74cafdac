import type { ReactNode } from 'react';
import { cx } from '@/lib/class-names';

/**
 * A plain table in a box of at most `height` that scrolls with its head row kept in view, as a
 * file's report reads row by row; `head` names the columns (`numeric` ones align right) and
 * `children` are the body's rows.
 */
export function ScrollTable({ label, height, head, children }: { label: string; height: 'max-h-72' | 'max-h-96'; head: { label: string; numeric?: boolean }[]; children: ReactNode }) {
  return (
    <div className={cx('mt-2 overflow-auto rounded-md border border-line', height)}>
      <table className="w-full text-sm" aria-label={label}>
        <thead className="sticky top-0 bg-mist text-left">
          <tr>
            {head.map((h) => (
              <th key={h.label} className={h.numeric ? 'px-2 py-1 text-right' : 'px-2 py-1'}>
                {h.label}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>{children}</tbody>
      </table>
    </div>
  );
}
