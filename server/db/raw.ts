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
 *
 * Bulk rows go as one JSON text per few thousand rows ({@link jsonRows}, {@link fromJsonRows}),
 * not as one bound parameter per value: binding costs about a microsecond per value on the
 * job's thread, reading the JSON costs SQLite a fraction of that on its own thread.
 */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { joinJsonRows, jsonRows } from './json-rows';

export { joinJsonRows, jsonRows };

interface RawSqlite {
  all(sql: string, params: unknown[], cb: (err: Error | null, rows: unknown[]) => void): void;
  run(sql: string, params: unknown[], cb: (this: { changes?: number }, err: Error | null) => void): void;
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

/**
 * A statement that returns no rows (INSERT, UPDATE, DELETE) with positional `?` parameters.
 * Resolves to the number of rows it changed.
 */
export async function runSql(sequelize: Sequelize, sql: string, params: unknown[] = [], transaction?: Transaction): Promise<number> {
  const conn = await connectionOf(sequelize, transaction);
  if (!conn) {
    const [, meta] = await sequelize.query(sql, { replacements: params as never, transaction });
    return Number((meta as { changes?: number } | null)?.changes ?? 0);
  }
  return new Promise<number>((resolve, reject) =>
    conn.run(sql, params, function (this: { changes?: number }, err) {
      if (err) reject(err);
      else resolve(this.changes ?? 0);
    }),
  );
}

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
 * A row set read from one JSON parameter made by {@link jsonRows} (json-rows.ts):
 * `SELECT value->>0 AS a, … FROM jsonb_each(?)` (or a numbered `param` such as `?1`). One parameter instead of one per value: binding
 * costs about a microsecond per value on the calling thread, while SQLite reads the text on its
 * own thread in a fraction of that. Needs SQLite 3.45 or later (the one sqlite3 bundles is newer).
 */
export const fromJsonRows = (names: readonly string[], literals: readonly (readonly [string, string | number | null])[] = [], param = '?') =>
  `SELECT ${[...names.map((n, i) => `value->>${i} AS ${n}`), ...literals.map(([n, v]) => `${sqlLiteral(v)} AS ${n}`)].join(', ')} FROM jsonb_each(${param})`;

/** Rows per JSON parameter (a few megabytes of text). */
export const JSON_ROWS = 5000;

type InsertOptions = { orReplace?: boolean; fixed?: Record<string, string | number | null> };

const insertSql = (table: string, cols: string[], opts: InsertOptions) => {
  const fixed = Object.entries(opts.fixed ?? {});
  return `INSERT ${opts.orReplace ? 'OR REPLACE ' : ''}INTO ${table} (${[...cols, ...fixed.map(([k]) => k)].join(',')}) ${fromJsonRows(cols, fixed)}`;
};

/**
 * INSERT (optionally OR REPLACE) of `rows`, each in `cols` order, from JSON parameters of
 * {@link JSON_ROWS} rows. `fixed` columns take the same value on every row and go into the
 * statement as literals.
 */
export async function insertRows(sequelize: Sequelize, table: string, cols: string[], rows: unknown[][], transaction?: Transaction, opts: InsertOptions = {}): Promise<void> {
  const sql = insertSql(table, cols, opts);
  for (let i = 0; i < rows.length; i += JSON_ROWS) {
    await runSql(sequelize, sql, [jsonRows(rows.slice(i, i + JSON_ROWS))], transaction);
  }
}

/**
 * {@link insertRows} of rows already packed as {@link jsonRows} texts (`count` rows each), joined
 * into parameters of about {@link JSON_ROWS} rows.
 */
export async function insertPackedRows(
  sequelize: Sequelize,
  table: string,
  cols: string[],
  packed: readonly { json: string; count: number }[],
  transaction?: Transaction,
  opts: InsertOptions = {},
): Promise<void> {
  const sql = insertSql(table, cols, opts);
  let part: string[] = [];
  let n = 0;
  const flush = async () => {
    if (n) await runSql(sequelize, sql, [joinJsonRows(part)], transaction);
    part = [];
    n = 0;
  };
  for (const p of packed) {
    part.push(p.json);
    n += p.count;
    if (n >= JSON_ROWS) await flush();
  }
  await flush();
}

/** A comma-separated list of integer ids for an `IN (…)` clause (`NULL` when empty). */
export const inList = (ids: readonly number[]) => ids.map((n) => Math.trunc(Number(n))).join(',') || 'NULL';
