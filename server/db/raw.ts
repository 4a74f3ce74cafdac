/**
 * Plain SQL on the sqlite3 connection underneath Sequelize, for the nightly job's bulk paths.
 *
 * Sequelize formats `replacements` into the SQL text with a tokenizer that walks the whole
 * statement on every call: tens of milliseconds for a statement with a 2 000-id `IN` list, and
 * seconds over a 10 000-vehicle night. sqlite3 binds parameters natively, so these helpers hand
 * the statement and its values straight to the connection Sequelize would have used: the
 * transaction's own connection inside a transaction, the shared default one outside. Rows come
 * back exactly as SQLite stores them (as with `QueryTypes.SELECT`). Where the connection is not
 * a sqlite3 database the helpers fall back to Sequelize.
 */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';

interface RawSqlite {
  all(sql: string, params: unknown[], cb: (err: Error | null, rows: unknown[]) => void): void;
  run(sql: string, params: unknown[], cb: (err: Error | null) => void): void;
}

const isRaw = (c: unknown): c is RawSqlite => !!c && typeof (c as RawSqlite).all === 'function' && typeof (c as RawSqlite).run === 'function';

async function connectionOf(sequelize: Sequelize, transaction?: Transaction): Promise<RawSqlite | null> {
  const c = transaction
    ? (transaction as unknown as { connection?: unknown }).connection
    : await (sequelize.connectionManager as unknown as { getConnection(o: object): Promise<unknown> }).getConnection({});
  return isRaw(c) ? c : null;
}

/** SELECT with positional `?` parameters; rows as stored. */
export async function selectRows<T extends object>(sequelize: Sequelize, sql: string, params: unknown[] = [], transaction?: Transaction): Promise<T[]> {
  const conn = await connectionOf(sequelize, transaction);
  if (!conn) return sequelize.query<T>(sql, { replacements: params as never, type: QueryTypes.SELECT, transaction });
  return new Promise<T[]>((resolve, reject) => conn.all(sql, params, (err, rows) => (err ? reject(err) : resolve(rows as T[]))));
}

/** A statement that returns no rows (INSERT, UPDATE, DELETE) with positional `?` parameters. */
export async function runSql(sequelize: Sequelize, sql: string, params: unknown[] = [], transaction?: Transaction): Promise<void> {
  const conn = await connectionOf(sequelize, transaction);
  if (!conn) {
    await sequelize.query(sql, { replacements: params as never, transaction });
    return;
  }
  await new Promise<void>((resolve, reject) => conn.run(sql, params, (err) => (err ? reject(err) : resolve())));
}

/** Rows per multi-row INSERT: SQLite allows 32 766 parameters per statement. */
const rowsPerInsert = (cols: number) => Math.max(1, Math.min(400, Math.floor(32_000 / cols)));

/** A value as SQL literal text (numbers, strings, null); for values the same on every row. */
export function sqlLiteral(v: string | number | null): string {
  if (v === null) return 'NULL';
  if (typeof v === 'number') {
    if (!Number.isFinite(v)) throw new Error(`not a finite number: ${v}`);
    return String(v);
  }
  return `'${v.replaceAll("'", "''")}'`;
}

/**
 * Multi-row INSERT (optionally OR REPLACE) of `rows`, each in `cols` order. `fixed` columns
 * take the same value on every row and go into the statement as literals, not parameters
 * (binding costs about a microsecond per value on the job's thread).
 */
export async function insertRows(
  sequelize: Sequelize,
  table: string,
  cols: string[],
  rows: unknown[][],
  transaction?: Transaction,
  opts: { orReplace?: boolean; fixed?: Record<string, string | number | null> } = {},
): Promise<void> {
  const fixed = Object.entries(opts.fixed ?? {});
  const per = rowsPerInsert(cols.length);
  const ph = `(${[...cols.map(() => '?'), ...fixed.map(([, v]) => sqlLiteral(v))].join(',')})`;
  const head = `INSERT ${opts.orReplace ? 'OR REPLACE ' : ''}INTO ${table} (${[...cols, ...fixed.map(([k]) => k)].join(',')}) VALUES `;
  for (let i = 0; i < rows.length; i += per) {
    const part = rows.slice(i, i + per);
    await runSql(sequelize, head + part.map(() => ph).join(','), part.flat(), transaction);
  }
}

/** A comma-separated list of integer ids for an `IN (…)` clause (`NULL` when empty). */
export const inList = (ids: readonly number[]) => ids.map((n) => Math.trunc(Number(n))).join(',') || 'NULL';
