/**
 * Field rules shared by the server's validation and the client's forms (imported by both; this
 * folder imports nothing but zod, so it runs the same in Node and in the browser).
 */
import { z } from 'zod';

/** Earliest and latest calendar day any date field accepts (no fleet record is older or later). */
export const DAY_MIN = '2000-01-01';
export const DAY_MAX = '2099-12-31';

/** Whether `s` is YYYY-MM-DD naming a day that exists (2026-02-31 and 9999-99-99 do not). */
export function isRealDay(s: string): boolean {
  if (!/^\d{4}-\d{2}-\d{2}$/.test(s)) return false;
  const [y, m, d] = s.split('-').map(Number);
  const t = new Date(Date.UTC(y, m - 1, d));
  return t.getUTCFullYear() === y && t.getUTCMonth() === m - 1 && t.getUTCDate() === d;
}

/**
 * The one date schema of the API: a calendar day YYYY-MM-DD that exists, from {@link DAY_MIN} to
 * {@link DAY_MAX}. Fields that cannot lie in the future are also checked against the app's clock
 * by the server.
 */
export const isoDay = z
  .string({ message: 'must be a date YYYY-MM-DD' })
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'must be a date YYYY-MM-DD')
  .refine(isRealDay, { message: 'must be a real calendar date (e.g. 2026-02-28, not 2026-02-31)', abort: true })
  .refine((s) => s >= DAY_MIN && s <= DAY_MAX, { message: `must be between ${DAY_MIN} and ${DAY_MAX}` });

/**
 * Control characters (C0, DEL, C1) and the invisible bidirectional marks and overrides (U+061C,
 * U+200E–U+200F, U+202A–U+202E, U+2066–U+2069): in a name they can hide or reorder what a reader
 * sees (a vehicle listed under a reversed plate, a NUL cutting a name short in a log).
 */
// eslint-disable-next-line no-control-regex
const HIDDEN = /[\u0000-\u001f\u007f-\u009f\u061c\u200e\u200f\u202a-\u202e\u2066-\u2069]/;
export const hasHiddenChars = (s: string) => HIDDEN.test(s);
export const NO_HIDDEN_MESSAGE = 'must not contain control characters or invisible direction marks';
/** Refinement for names and other one-line texts. */
export const noHiddenChars = [(s: string) => !hasHiddenChars(s), { message: NO_HIDDEN_MESSAGE }] as const;

/** Bytes of a text in UTF-8 (the same in Node and the browser). */
export const utf8Bytes = (s: string) => new TextEncoder().encode(s).length;

/** A refused body's issues as `{ field: message }`, by dotted path (`corners.0.adhesionPct`; `_` for the whole body). */
export function issueFields(err: z.ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of err.issues) {
    const key = issue.path.length ? issue.path.join('.') : '_';
    if (!fields[key]) fields[key] = issue.message;
  }
  return fields;
}
