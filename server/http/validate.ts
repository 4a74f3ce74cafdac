import { z } from 'zod';
import { DAY_MAX, DAY_MIN, isRealDay } from '../contracts/common';
import { AppError, zodFields } from '../errors';

/** Parses `data` with `schema` or throws a 400 AppError naming every bad field. */
export function parse<S extends z.ZodType>(schema: S, data: unknown, what = 'request'): z.output<S> {
  const result = schema.safeParse(data);
  if (!result.success) {
    throw AppError.badRequest(`Some values in the ${what} are not valid.`, zodFields(result.error));
  }
  return result.data;
}

export const idParam = z.object({ id: z.coerce.number({ message: 'must be a number' }).int().positive('must be a positive id') });

/**
 * The shared list query: `page` (1-based), `pageSize` (1–200, default 25) and `sort` (`field` or
 * `-field` for descending), with the allowed sort fields named so a bad one is a clear 400, plus
 * the list's own filters. Unknown keys are refused.
 */
export function listQuery<F extends z.ZodRawShape>(sortable: readonly string[], defaultSort: string, filters: F) {
  return z
    .object({
      page: z.coerce.number({ message: 'must be a number' }).int('must be a whole number').min(1, 'must be 1 or more').default(1),
      pageSize: z.coerce.number({ message: 'must be a number' }).int('must be a whole number').min(1).max(200, 'must be 200 or less').default(25),
      sort: z
        .string()
        .default(defaultSort)
        .refine((s) => sortable.includes(s.replace(/^-/, '')), {
          message: `must be one of ${sortable.join(', ')} (prefix - for descending)`,
        }),
    })
    .extend(filters)
    .strict();
}

/**
 * What a list's CSV export (`GET /api/<list>/export`) leaves out of its {@link listQuery}:
 * `list.omit(NO_PAGING)` has the same sort and filters, no `page` or `pageSize` (the export holds
 * every matching row), and still refuses unknown keys, paging among them.
 */
export const NO_PAGING = { page: true, pageSize: true } as const;

/** The sort order of a parsed list or export query. */
export function sortOf<S extends string>(q: { sort: string }): Paging<S>['sort'] {
  return { field: q.sort.replace(/^-/, '') as S, dir: q.sort.startsWith('-') ? 'DESC' : 'ASC' };
}

export interface Paging<S extends string> {
  offset: number;
  pageSize: number;
  sort: { field: S; dir: 'ASC' | 'DESC' };
}

/** Offset and sort order from a parsed {@link listQuery}. */
export function paging<S extends string>(q: { page: number; pageSize: number; sort: string }): Paging<S> {
  return { offset: (q.page - 1) * q.pageSize, pageSize: q.pageSize, sort: sortOf<S>(q) };
}

/** Boolean query values as people write them. */
export const queryBool = z
  .enum(['true', 'false', '1', '0'], { message: 'must be true or false' })
  .transform((v) => v === 'true' || v === '1');

export { DAY_MAX, DAY_MIN, isRealDay, isoDay } from '../contracts/common';

/** Throws a 400 naming `field` when the day `value` is after `today`. */
export function notAfter(value: string | null | undefined, today: string, field: string) {
  if (value && value > today) throw AppError.badRequest(`The ${field} cannot be in the future.`, { [field]: `must be on or before ${today}` });
}

const ISO_DT = /^\d{4}-\d{2}-\d{2}[T ]\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:?\d{2})?$/;

/**
 * An ISO 8601 date-time whose day and time exist, as a Date (UTC when no offset is given), or
 * null: 2026-02-30T08:00 and 25:00 are refused, not rolled over into the next month or day.
 */
export function parseIsoDateTime(s: string): Date | null {
  const t = s.trim();
  if (!ISO_DT.test(t) || !isRealDay(t.slice(0, 10))) return null;
  const day = t.slice(0, 10);
  if (day < DAY_MIN || day > DAY_MAX) return null;
  const [hh, mm, ss] = t.slice(11, 19).split(':').map(Number);
  if (hh > 23 || mm > 59 || (ss ?? 0) > 59) return null;
  const withT = t.replace(' ', 'T');
  const d = new Date(/(Z|[+-]\d{2}:?\d{2})$/.test(withT) ? withT : `${withT}Z`);
  return Number.isNaN(d.getTime()) ? null : d;
}

/** A date-time field: an ISO 8601 string that {@link parseIsoDateTime} accepts, as a Date. */
export const isoDateTime = z
  .string({ message: 'must be an ISO 8601 date-time' })
  .transform((s, ctx) => {
    const d = parseIsoDateTime(s);
    if (!d) {
      ctx.addIssue({ code: 'custom', message: 'must be a real ISO 8601 date-time (e.g. 2026-11-02T07:30:00Z)' });
      return z.NEVER;
    }
    return d;
  });

export { NO_HIDDEN_MESSAGE, hasHiddenChars, noHiddenChars } from '../contracts/common';
