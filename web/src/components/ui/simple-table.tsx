import type { ReactNode } from 'react';
import { cx } from '@/lib/class-names';

export interface SimpleColumn<T> {
  key: string;
  header: ReactNode;
  /** Unit shown in the header, never in the cells. */
  unit?: string;
  /** Right-aligned tabular figures. */
  numeric?: boolean;
  cell: (row: T) => ReactNode;
  /** Marks the cell that names the row (rendered as a row header). */
  rowHeader?: boolean;
  className?: string;
}

/** How rows are keyed: by their `id` unless told otherwise (a row with no `id` must be told). */
type RowKeyProp<T> = T extends { id: string | number }
  ? { getRowKey?: (row: T) => string | number }
  : { getRowKey: (row: T) => string | number };

/**
 * A small table shown in full (no paging): a vehicle's trips, a spec's corners. Same look as the
 * paged DataTable — units in the headers, numbers right-aligned.
 */
export function SimpleTable<T>({
  label,
  columns,
  rows,
  getRowKey,
  footer,
  className,
}: {
  label: string;
  columns: SimpleColumn<T>[];
  rows: T[];
  footer?: ReactNode;
  className?: string;
} & RowKeyProp<T>) {
  const keyOf = getRowKey ?? ((row: T) => (row as { id: string | number }).id);
  return (
    // focusable, so a keyboard can scroll a table wider than the screen
    <div role="group" aria-label={label} tabIndex={0} className={cx('overflow-x-auto rounded-md border border-line bg-surface', className)}>
      <table className="w-full border-collapse text-sm">
        <caption className="sr-only">{label}</caption>
        <thead>
          <tr className="border-b border-line-strong bg-mist/70">
            {columns.map((c) => (
              <th
                key={c.key}
                scope="col"
                className={cx('px-3 py-2 align-bottom text-[0.8125rem] leading-snug font-semibold text-ink', c.numeric ? 'text-right' : 'text-left')}
              >
                {c.header}
                {c.unit ? <span className="font-normal whitespace-nowrap text-slate"> ({c.unit})</span> : null}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((row) => (
            <tr key={keyOf(row)} className="border-b border-line last:border-b-0">
              {columns.map((c) => {
                const cls = cx(
                  'px-3 py-2 align-middle pointer-coarse:py-3',
                  c.numeric ? 'tabular text-right whitespace-nowrap' : 'text-left',
                  c.rowHeader && 'font-medium',
                  c.className,
                );
                return c.rowHeader ? (
                  <th key={c.key} scope="row" className={cls}>
                    {c.cell(row)}
                  </th>
                ) : (
                  <td key={c.key} className={cls}>
                    {c.cell(row)}
                  </td>
                );
              })}
            </tr>
          ))}
        </tbody>
      </table>
      {footer ? <div className="border-t border-line px-3 py-2 text-[0.8125rem] text-slate">{footer}</div> : null}
    </div>
  );
}
