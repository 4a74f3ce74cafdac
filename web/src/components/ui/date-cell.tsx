import { formatDate, formatDateTime } from '@/lib/format';

/** A day (or with `withTime`, a moment) in a table cell: the app's wording, the ISO value for machines, never wrapped. */
export function DateCell({ value, withTime = false }: { value: string; withTime?: boolean }) {
  return (
    <time dateTime={value} className="tabular whitespace-nowrap">
      {withTime ? formatDateTime(value) : formatDate(value)}
    </time>
  );
}
