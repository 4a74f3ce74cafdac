/**
 * Plain SQL on the sqlite3 connection underneath Sequelize, for the nightly job's bulk paths.
 *
 * Sequelize formats `replacements` into the SQL text with a tokenizer that walks the whole
 * statement on every call: tens of milliseconds for a statement with a 2 000-id `IN` list, and
 * seconds over a 10 000-vehicle night. sqlite3 binds parameters natively, so these helpers hand
 * the statement and its values straight to the connection Sequelize would have used: the
 * transaction's own connection inside a transaction, the shared default one outside. Rows come
 * back exactly as SQLite stores them (as with `QueryTypes.SELECT`).
 *
 * On PostgreSQL the same statements go to the pg client underneath Sequelize (the
 * transaction's, or one borrowed from the pool), with `?` and `?N` written as `$N`, and rows
 * come back in SQLite's forms: stamps as Sequelize's SQLite text, days as `YYYY-MM-DD`, JSON as
 * its text, BIGINT and NUMERIC as numbers (booleans stay booleans). Where neither client is found the helpers fall back to Sequelize.
 *
 * Bulk rows go as one JSON text per few thousand rows ({@link jsonRows}, {@link fromJsonRows}),
 * not as one bound parameter per value: binding costs about a microsecond per value on the
 * job's thread, reading the JSON costs SQLite a fraction of that on its own thread.
 */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { joinJsonRows, jsonRows } from './json-rows';
import { isPostgres, sqlFor, stampText } from './dialect';

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

interface PgTypes {
  getTypeParser(oid: number, format?: string): (v: string) => unknown;
}

interface RawPg {
  query(q: { text: string; values: unknown[]; types: PgTypes }): Promise<{ rows: unknown[]; rowCount: number | null }>;
}

type PoolManager = PgTypes & { getConnection(o: object): Promise<RawPg>; releaseConnection(c: RawPg): Promise<void> | void };

/** A PostgreSQL timestamp's text (in the session's UTC) as Sequelize's SQLite text of the same instant. */
const pgStampText = (v: string) => {
  const iso = v.replace(' ', 'T').replace(/([+-]\d\d)$/, '$1:00');
  return stampText(new Date(/[+-]\d\d:\d\d$/.test(iso) ? iso : `${iso}Z`));
};

const pgTypeSets = new WeakMap<Sequelize, PgTypes>();

/** Rows from PostgreSQL in the forms SQLite gives (see the module's comment); other types as Sequelize reads them. */
function pgTypesOf(sequelize: Sequelize): PgTypes {
  let t = pgTypeSets.get(sequelize);
  if (!t) {
    const cm = sequelize.connectionManager as unknown as PoolManager;
    t = {
      getTypeParser(oid, format) {
        switch (oid) {
          case 20: // int8
          case 1700: // numeric
            return Number;
          case 1082: // date
          case 114: // json
          case 3802: // jsonb
            return (v) => v;
          case 1114: // timestamp
          case 1184: // timestamptz
            return pgStampText;
          default:
            return cm.getTypeParser(oid, format);
        }
      },
    };
    pgTypeSets.set(sequelize, t);
  }
  return t;
}

/**
 * A statement with SQLite's `?` (in order) and `?N` (numbered) parameters in PostgreSQL's `$N`
 * form; quoted texts and names are left alone.
 */
export function pgParams(sql: string): string {
  let out = '';
  let next = 0;
  for (let i = 0; i < sql.length; i++) {
    const ch = sql[i];
    if (ch === "'" || ch === '"') {
      const end = sql.indexOf(ch, i + 1);
      const stop = end < 0 ? sql.length : end + 1;
      out += sql.slice(i, stop);
      i = stop - 1;
    } else if (ch === '?') {
      const m = /^\d+/.exec(sql.slice(i + 1, i + 12));
      if (m) {
        out += `$${m[0]}`;
        i += m[0].length;
      } else out += `$${++next}`;
    } else out += ch;
  }
  return out;
}

/** The pg client a statement runs on (the transaction's, else one from the pool, given back after). */
async function onPg<T>(sequelize: Sequelize, transaction: Transaction | undefined, run: (c: RawPg) => Promise<T>): Promise<T> {
  if (transaction) return run((transaction as unknown as { connection: RawPg }).connection);
  const cm = sequelize.connectionManager as unknown as PoolManager;
  const c = await cm.getConnection({ type: 'SELECT' });
  try {
    return await run(c);
  } finally {
    await cm.releaseConnection(c);
  }
}

/** SELECT with positional `?` parameters; rows as stored. */
export async function selectRows<T extends object>(sequelize: Sequelize, sql: string, params: unknown[] = [], transaction?: Transaction): Promise<T[]> {
  if (isPostgres(sequelize)) return onPg(sequelize, transaction, async (c) => (await c.query({ text: pgParams(sql), values: params, types: pgTypesOf(sequelize) })).rows as T[]);
  const conn = await connectionOf(sequelize, transaction);
  if (!conn) return sequelize.query<T>(sql, { replacements: params as never, type: QueryTypes.SELECT, transaction });
  return new Promise<T[]>((resolve, reject) => conn.all(sql, params, (err, rows) => (err ? reject(err) : resolve(rows as T[]))));
}

/**
 * A statement that returns no rows (INSERT, UPDATE, DELETE) with positional `?` parameters.
 * Resolves to the number of rows it changed.
 */
export async function runSql(sequelize: Sequelize, sql: string, params: unknown[] = [], transaction?: Transaction): Promise<number> {
  if (isPostgres(sequelize)) return onPg(sequelize, transaction, async (c) => (await c.query({ text: pgParams(sql), values: params, types: pgTypesOf(sequelize) })).rowCount ?? 0);
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
 *
 * Each name may carry its PostgreSQL type after a space (`'id integer'`, `'first date'`):
 * PostgreSQL's `->>` gives text, which it does not compare with or store into other types; SQLite
 * needs no type. `literals` go in as they are (or cast to their type, `['stamp timestamptz', …]`).
 */
export const fromJsonRows = (
  sequelize: Sequelize,
  names: readonly string[],
  literals: readonly (readonly [string, string | number | null])[] = [],
  param = '?',
) => {
  const sql = sqlFor(sequelize);
  const split = (n: string) => {
    const at = n.indexOf(' ');
    return at < 0 ? [n, undefined] as const : [n.slice(0, at), n.slice(at + 1)] as const;
  };
  const cells = names.map((n, i) => {
    const [name, type] = split(n);
    return `${sql.jsonCell(i, type)} AS ${name}`;
  });
  const fixed = literals.map(([n, v]) => {
    const [name, type] = split(n);
    return `${type && sql.dialect === 'postgres' ? `CAST(${sqlLiteral(v)} AS ${type})` : sqlLiteral(v)} AS ${name}`;
  });
  return `SELECT ${[...cells, ...fixed].join(', ')} FROM ${sql.jsonArray(param)}`;
};

/** Rows per JSON parameter (a few megabytes of text). */
export const JSON_ROWS = 5000;

type InsertOptions = { orReplace?: boolean; fixed?: Record<string, string | number | null> };

interface TableShape {
  types: Map<string, string>;
  primaryKey: string[];
}
const shapes = new WeakMap<Sequelize, Map<string, Promise<TableShape>>>();

/** A PostgreSQL table's column types and primary key, read once per connection pool. */
function tableShape(sequelize: Sequelize, table: string): Promise<TableShape> {
  let known = shapes.get(sequelize);
  if (!known) shapes.set(sequelize, (known = new Map()));
  let shape = known.get(table);
  if (!shape) {
    shape = (async () => {
      const cols = await selectRows<{ name: string; type: string; pk: boolean }>(
        sequelize,
        `SELECT a.attname AS name, format_type(a.atttypid, a.atttypmod) AS type,
                EXISTS (SELECT 1 FROM pg_index i WHERE i.indrelid = a.attrelid AND i.indisprimary AND a.attnum = ANY (i.indkey)) AS pk
         FROM pg_attribute a WHERE a.attrelid = ?::regclass AND a.attnum > 0 AND NOT a.attisdropped ORDER BY a.attnum`,
        [table],
      );
      if (!cols.length) throw new Error(`no table ${table}`);
      return { types: new Map(cols.map((c) => [c.name, c.type])), primaryKey: cols.filter((c) => c.pk).map((c) => c.name) };
    })();
    shape.catch(() => known.delete(table));
    known.set(table, shape);
  }
  return shape;
}

/**
 * The INSERT of {@link insertRows}. On PostgreSQL each value is cast to its column's type, and
 * OR REPLACE becomes ON CONFLICT on the primary key, updating every column sent.
 */
async function insertSql(sequelize: Sequelize, table: string, cols: string[], opts: InsertOptions) {
  const fixed = Object.entries(opts.fixed ?? {});
  const all = [...cols, ...fixed.map(([k]) => k)].join(',');
  if (!isPostgres(sequelize)) return `INSERT ${opts.orReplace ? 'OR REPLACE ' : ''}INTO ${table} (${all}) ${fromJsonRows(sequelize, cols, fixed)}`;
  const shape = await tableShape(sequelize, table);
  const typed = (c: string) => `${c} ${shape.types.get(c) ?? 'text'}`;
  const select = fromJsonRows(sequelize, cols.map(typed), fixed.map(([k, v]) => [typed(k), v] as const));
  const update = [...cols, ...fixed.map(([k]) => k)].filter((c) => !shape.primaryKey.includes(c));
  const onConflict = !opts.orReplace
    ? ''
    : ` ON CONFLICT (${shape.primaryKey.join(',')}) DO ${update.length ? `UPDATE SET ${update.map((c) => `${c} = EXCLUDED.${c}`).join(', ')}` : 'NOTHING'}`;
  return `INSERT INTO ${table} (${all}) ${select}${onConflict}`;
}

/**
 * INSERT (optionally OR REPLACE) of `rows`, each in `cols` order, from JSON parameters of
 * {@link JSON_ROWS} rows. `fixed` columns take the same value on every row and go into the
 * statement as literals.
 */
export async function insertRows(sequelize: Sequelize, table: string, cols: string[], rows: unknown[][], transaction?: Transaction, opts: InsertOptions = {}): Promise<void> {
  const sql = await insertSql(sequelize, table, cols, opts);
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
  const sql = await insertSql(sequelize, table, cols, opts);
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

/** Vehicle ids from `from` to `to`, both included: the phases that read the fleet a part at a time read it in these. */
export interface VehicleRange {
  from: number;
  to: number;
}

/** ` AND <col> BETWEEN ? AND ?` for a range (nothing without one), with {@link rangeParams} as its parameters. */
export const inRange = (col: string, range?: VehicleRange) => (range ? ` AND ${col} BETWEEN ? AND ?` : '');
export const rangeParams = (range?: VehicleRange) => (range ? [range.from, range.to] : []);

/** Consecutive ranges of `ids` (sorted), `size` ids each: together they cover every id of the list. */
export function idRanges(ids: readonly number[], size: number): VehicleRange[] {
  const out: VehicleRange[] = [];
  for (let i = 0; i < ids.length; i += size) out.push({ from: ids[i], to: ids[Math.min(ids.length, i + size) - 1] });
  return out;
}

/** A comma-separated list of integer ids for an `IN (…)` clause (`NULL` when empty). */
export const inList = (ids: readonly number[]) => ids.map((n) => Math.trunc(Number(n))).join(',') || 'NULL';
