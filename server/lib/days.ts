/**
 * Calendar days: the one module for day strings (`YYYY-MM-DD`), the local day of an instant in
 * the fleet's time zone, the instant a local day starts, and the SQLite text form of a time.
 *
 * Day strings name calendar days, not instants, so adding days to one is exact arithmetic on
 * UTC midnights (no zone, no daylight-saving shift can move it); it runs in the nightly job's
 * inner loops, which is why it is not a date-fns call. Everything that depends on a time zone
 * goes through @date-fns/tz, which reads the zone rules from the runtime's ICU data.
 */
import { TZDate } from '@date-fns/tz';

export const DAY_MS = 86_400_000;

/** UTC midnight of a day string [ms since the epoch]. */
export const dayMs = (day: string) => Date.UTC(Number(day.slice(0, 4)), Number(day.slice(5, 7)) - 1, Number(day.slice(8, 10)));

/** The day `n` days after (before, when negative) a day. */
export const plusDays = (day: string, n: number) => new Date(dayMs(day) + n * DAY_MS).toISOString().slice(0, 10);

/** Whole days from one day to another (negative when `to` is earlier). */
export const daysBetween = (from: string, to: string) => Math.round((dayMs(to) - dayMs(from)) / DAY_MS);

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/** A day string as people read it in text the server writes (an inspection's reason): "12 Oct 2026", the client's date style. */
export const readableDay = (day: string) => `${Number(day.slice(8, 10))} ${MONTHS[Number(day.slice(5, 7)) - 1]} ${day.slice(0, 4)}`;

const dayFormats = new Map<string, Intl.DateTimeFormat>();

/** The local calendar day of an instant in a time zone (YYYY-MM-DD). */
export function localDay(d: Date, timeZone: string): string {
  let f = dayFormats.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' });
    dayFormats.set(timeZone, f);
  }
  return f.format(d);
}

/** The instant a local day starts in a time zone (its first moment, even where that is not 00:00 on the clock). */
export function startOfLocalDay(day: string, timeZone: string): Date {
  return new Date(new TZDate(Number(day.slice(0, 4)), Number(day.slice(5, 7)) - 1, Number(day.slice(8, 10)), timeZone).getTime());
}

/** Sequelize's SQLite text form of an instant (`2026-11-30 12:00:00.000 +00:00`), as raw bulk writes must store it. */
export function sqlStamp(d: Date): string {
  return d.toISOString().replace('T', ' ').replace('Z', ' +00:00');
}
