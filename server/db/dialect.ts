/**
 * What differs between the two databases the app runs on — the embedded SQLite file (the
 * default) and PostgreSQL (DATABASE_URL) — in the plain SQL the repositories write. Every such
 * difference is a function or a word here, picked by the Sequelize instance's dialect, so the
 * repositories hold one statement each rather than one per database.
 */
import { Op, type Sequelize } from 'sequelize';

export type Dialect = 'sqlite' | 'postgres';

export const dialectOf = (sequelize: Sequelize): Dialect => (sequelize.getDialect() === 'postgres' ? 'postgres' : 'sqlite');

export const isPostgres = (sequelize: Sequelize) => dialectOf(sequelize) === 'postgres';

export interface SqlWords {
  dialect: Dialect;
  /**
   * The set of rows of one JSON parameter (an array of arrays, json-rows.ts) as a FROM item
   * whose rows are `value`: SQLite's `jsonb_each`, PostgreSQL's `jsonb_array_elements`.
   */
  jsonArray(param: string): string;
  /**
   * Element `i` of a row `value` of {@link jsonArray}, as a value of `type` (a PostgreSQL type
   * name; SQLite's `->>` already gives numbers as numbers and texts as texts).
   */
  jsonCell(i: number, type: string | undefined): string;
  /** The first ten characters (the day) of a stamp column: SQLite keeps stamps as text. */
  dayOf(expr: string): string;
  /** A stamp or day column as text that sorts and compares as SQLite's stored text does. */
  asText(expr: string): string;
  /** A stamp `days` days before a stamp (parameter or column). */
  daysBefore(expr: string, days: number): string;
  /** The larger of its arguments (SQLite's MAX with two or more, PostgreSQL's GREATEST). */
  greatest: string;
  /** The hidden row address a DELETE can name rows by (rowid / ctid). */
  rowId: string;
  /** `DISTINCT x` joined with commas (SQLite's group_concat, PostgreSQL's string_agg). */
  distinctList(expr: string): string;
  /**
   * A condition: the field at `path` of a JSON text column equals the next `?` parameter (a
   * number or a text; rows whose text is not JSON match nothing).
   */
  jsonFieldIs(expr: string, path: string[]): string;
  /**
   * SUM of doubles whose result must not hang on the order the plan reads the rows in.
   * PostgreSQL adds them plainly in that order, so the same rows read another way (some of them
   * rewritten by a run cancelled and run again, or another plan for another batch) can sum to
   * another last bit: there it adds them in `orderBy` order (the values themselves when not
   * given). SQLite's SUM compensates (Kahan–Babuška–Neumaier), which the order hardly moves, and
   * reads these rows through their keys: it stays a plain SUM, as it was.
   */
  sumInOrder(expr: string, orderBy?: string): string;
  /** Boolean literals (SQLite keeps booleans as 0 and 1). */
  true: string;
  false: string;
}

const sqlite: SqlWords = {
  dialect: 'sqlite',
  jsonArray: (param) => `jsonb_each(${param})`,
  jsonCell: (i) => `value->>${i}`,
  dayOf: (expr) => `substr(${expr}, 1, 10)`,
  asText: (expr) => expr,
  daysBefore: (expr, days) => `datetime(${expr}, '-${Number(days)} days')`,
  greatest: 'MAX',
  rowId: 'rowid',
  distinctList: (expr) => `group_concat(DISTINCT ${expr})`,
  jsonFieldIs: (expr, path) => `json_valid(${expr}) AND json_extract(${expr}, '$.${path.join('.')}') = ?`,
  sumInOrder: (expr) => `SUM(${expr})`,
  true: '1',
  false: '0',
};

const postgres: SqlWords = {
  dialect: 'postgres',
  jsonArray: (param) => `jsonb_array_elements(${param}::jsonb) AS rows_of_json(value)`,
  jsonCell: (i, type) => (type ? `(value->>${i})::${type}` : `value->>${i}`),
  // the session runs in UTC (Sequelize sets it), as SQLite's stored stamps are
  dayOf: (expr) => `to_char(${expr}, 'YYYY-MM-DD')`,
  asText: (expr) => `${expr}::text`,
  daysBefore: (expr, days) => `(CAST(${expr} AS timestamptz) - interval '${Number(days)} days')`,
  greatest: 'GREATEST',
  rowId: 'ctid',
  distinctList: (expr) => `string_agg(DISTINCT (${expr})::text, ',')`,
  // the app writes only JSON there (express-session's data); the field's text against the value's
  jsonFieldIs: (expr, path) => `(${expr})::jsonb #>> '{${path.join(',')}}' = CAST(? AS text)`,
  sumInOrder: (expr, orderBy) => `SUM(${expr} ORDER BY ${orderBy ?? expr})`,
  true: 'TRUE',
  false: 'FALSE',
};

/**
 * Sequelize's operator for a search by part of a text that ignores letter case, as SQLite's LIKE
 * does (PostgreSQL's LIKE heeds case; its ILIKE does not).
 */
export const likeOp = (sequelize: Sequelize): typeof Op.like | typeof Op.iLike => (isPostgres(sequelize) ? Op.iLike : Op.like);

/** The SQL words of the database a Sequelize instance is open on. */
export const sqlFor = (sequelize: Sequelize): SqlWords => (isPostgres(sequelize) ? postgres : sqlite);

/**
 * A stamp read by a raw Sequelize query as SQLite gives it: PostgreSQL hands back a Date,
 * SQLite the text Sequelize stores (`2026-11-30 12:00:00.000 +00:00`).
 */
export function stampText(v: string | Date): string;
export function stampText(v: string | Date | null): string | null;
export function stampText(v: string | Date | null): string | null {
  if (v === null || typeof v === 'string') return v;
  return v.toISOString().replace('T', ' ').replace('Z', ' +00:00');
}
