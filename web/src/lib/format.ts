import { differenceInMinutes, format, isValid, parseISO } from 'date-fns';

/**
 * Formatting of numbers with their units, and of dates. One locale for the whole app so that
 * figures line up the same way in every table: thousands with a comma, a point for decimals,
 * and a no-break space between a number and its unit (SI style, `12,400 km`, `42 %`).
 */

const LOCALE = 'en-GB';
const NBSP = '\u00a0';
export const NO_VALUE = '—';

const formatters = new Map<number, Intl.NumberFormat>();
function numberFormat(digits: number) {
  let f = formatters.get(digits);
  if (!f) {
    f = new Intl.NumberFormat(LOCALE, { minimumFractionDigits: digits, maximumFractionDigits: digits });
    formatters.set(digits, f);
  }
  return f;
}

type Num = number | null | undefined;

function isNum(value: Num): value is number {
  return typeof value === 'number' && Number.isFinite(value);
}

/** `12345.6` → `12,346` (digits = 0). Missing values show as an em dash. */
export function formatNumber(value: Num, digits = 0): string {
  return isNum(value) ? numberFormat(digits).format(value) : NO_VALUE;
}

/** `12345, 'km'` → `12,345 km`. */
export function formatQuantity(value: Num, unit: string, digits = 0): string {
  return isNum(value) ? `${formatNumber(value, digits)}${NBSP}${unit}` : NO_VALUE;
}

/**
 * A distance given in metres, in the unit a person reads it in: `37` → `37 m`, `1520` → `1.5 km`,
 * `159403` → `159 km`.
 */
export function formatDistance(metres: Num): string {
  if (!isNum(metres)) return NO_VALUE;
  if (Math.abs(metres) < 1000) return formatQuantity(metres, 'm');
  return formatQuantity(metres / 1000, 'km', Math.abs(metres) < 10_000 ? 1 : 0);
}

/** A fraction shown as a percentage: `0.423` → `42 %`. */
export function formatPercent(fraction: Num, digits = 0): string {
  return isNum(fraction) ? `${formatNumber(fraction * 100, digits)}${NBSP}%` : NO_VALUE;
}

function toDate(value: string | Date | null | undefined): Date | null {
  if (!value) return null;
  const d = typeof value === 'string' ? parseISO(value) : value;
  return isValid(d) ? d : null;
}

/** `2025-03-04` → `4 Mar 2025`. */
export function formatDate(value: string | Date | null | undefined): string {
  const d = toDate(value);
  return d ? format(d, 'd MMM yyyy') : NO_VALUE;
}

/** `2025-03-04T14:05:00Z` → `4 Mar 2025, 14:05` (local time). */
export function formatDateTime(value: string | Date | null | undefined): string {
  const d = toDate(value);
  return d ? format(d, 'd MMM yyyy, HH:mm') : NO_VALUE;
}

/** Machine-readable date for `<time dateTime>` and CSV: `2025-03-04`. */
export function isoDate(value: string | Date | null | undefined): string {
  const d = toDate(value);
  return d ? format(d, 'yyyy-MM-dd') : '';
}

/** Minutes between two instants, or null when either is missing. */
export function minutesBetween(start: string | null | undefined, end: string | null | undefined): number | null {
  const a = toDate(start);
  const b = toDate(end);
  return a && b ? differenceInMinutes(b, a) : null;
}

/** `135` → `2:15`, for a column headed "(h:min)". */
export function formatHoursMinutes(minutes: Num): string {
  if (!isNum(minutes)) return NO_VALUE;
  const total = Math.round(minutes);
  return `${Math.floor(total / 60)}:${String(total % 60).padStart(2, '0')}`;
}
