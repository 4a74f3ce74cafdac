import { z } from 'zod';
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

export interface Paging<S extends string> {
  offset: number;
  pageSize: number;
  sort: { field: S; dir: 'ASC' | 'DESC' };
}

/** Offset and sort order from a parsed {@link listQuery}. */
export function paging<S extends string>(q: { page: number; pageSize: number; sort: string }): Paging<S> {
  const desc = q.sort.startsWith('-');
  return {
    offset: (q.page - 1) * q.pageSize,
    pageSize: q.pageSize,
    sort: { field: q.sort.replace(/^-/, '') as S, dir: desc ? 'DESC' : 'ASC' },
  };
}

/** Boolean query values as people write them. */
export const queryBool = z
  .enum(['true', 'false', '1', '0'], { message: 'must be true or false' })
  .transform((v) => v === 'true' || v === '1');
