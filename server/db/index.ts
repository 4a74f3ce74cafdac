import { QueryTypes, Sequelize, Transaction, type QueryInterface, type QueryOptionsWithType } from 'sequelize';
import { Umzug, SequelizeStorage, type RunnableMigration } from 'umzug';
import path from 'node:path';
import fs from 'node:fs';
import { initModels } from './models';
import { stampText, type Dialect } from './dialect';
import { withLockFile } from '../lib/lock-file';
import * as m0001 from './migrations/0001-initial';
import * as m0002 from './migrations/0002-roads-and-imports';
import * as m0003 from './migrations/0003-nightly-duty';
import * as m0004 from './migrations/0004-workshop';
import * as m0005 from './migrations/0005-drivers';
import * as m0006 from './migrations/0006-opening-wear';
import * as m0007 from './migrations/0007-drop-unused-duty-indexes';
import * as m0008 from './migrations/0008-damper-life-model';
import * as m0009 from './migrations/0009-inspection-follow-up';
import * as m0010 from './migrations/0010-ride-report-class-after';
import * as m0012 from './migrations/0012-lane-plate-amplitude';
import * as m0013 from './migrations/0013-lane-phase-shift';
import * as m0014 from './migrations/0014-seat-factors';
import * as m0017 from './migrations/0017-trip-import-file-hash';
import * as m0018 from './migrations/0018-must-change-password';
import * as m0019 from './migrations/0019-duty-day-summary';
import * as m0020 from './migrations/0020-mail-claims';
import * as m0021 from './migrations/0021-sign-in-counts';
import * as m0022 from './migrations/0022-sign-in-delays';

export interface Db {
  sequelize: Sequelize;
  /** Which database this is: the SQLite file (the default) or PostgreSQL (DATABASE_URL). */
  dialect: Dialect;
  /** The SQLite file; null on PostgreSQL. */
  file: string | null;
  close(): Promise<void>;
}

/** A PostgreSQL connection URL (postgres:// or postgresql://) rather than a SQLite file path. */
export const isPostgresUrl = (location: string) => /^postgres(ql)?:\/\//i.test(location);

/** Every migration, in order. Add new ones at the end; never edit one that has shipped. */
export const MIGRATIONS: RunnableMigration<QueryInterface>[] = [
  { name: '0001-initial', up: m0001.up, down: m0001.down },
  { name: '0002-roads-and-imports', up: m0002.up, down: m0002.down },
  { name: '0003-nightly-duty', up: m0003.up, down: m0003.down },
  { name: '0004-workshop', up: m0004.up, down: m0004.down },
  { name: '0005-drivers', up: m0005.up, down: m0005.down },
  { name: '0006-opening-wear', up: m0006.up, down: m0006.down },
  { name: '0007-drop-unused-duty-indexes', up: m0007.up, down: m0007.down },
  { name: '0008-damper-life-model', up: m0008.up, down: m0008.down },
  { name: '0009-inspection-follow-up', up: m0009.up, down: m0009.down },
  { name: '0010-ride-report-class-after', up: m0010.up, down: m0010.down },
  { name: '0012-lane-plate-amplitude', up: m0012.up, down: m0012.down },
  { name: '0013-lane-phase-shift', up: m0013.up, down: m0013.down },
  { name: '0014-seat-factors', up: m0014.up, down: m0014.down },
  { name: '0017-trip-import-file-hash', up: m0017.up, down: m0017.down },
  { name: '0018-must-change-password', up: m0018.up, down: m0018.down },
  { name: '0019-duty-day-summary', up: m0019.up, down: m0019.down },
  { name: '0020-mail-claims', up: m0020.up, down: m0020.down },
  { name: '0021-sign-in-counts', up: m0021.up, down: m0021.down },
  { name: '0022-sign-in-delays', up: m0022.up, down: m0022.down },
];

/**
 * Opens the database at `location` — a PostgreSQL URL, or else a SQLite file path — and
 * registers the models. Call {@link migrate} before use.
 */
export async function openDb(location: string, opts: { log?: (sql: string) => void } = {}): Promise<Db> {
  return isPostgresUrl(location) ? openPostgres(location, opts) : openSqlite(location, opts);
}

/**
 * PostgreSQL through a pool. Transactions are serialised by one transaction-scoped advisory
 * lock taken at BEGIN, as SQLite's IMMEDIATE transactions are by its write lock: the checks
 * that guard a write (last active manager, trip overlaps, a repeated import) run inside the
 * writing transaction and count on no other transaction writing meanwhile.
 */
async function openPostgres(url: string, opts: { log?: (sql: string) => void }): Promise<Db> {
  const sequelize = new Sequelize(url, {
    dialect: 'postgres',
    logging: opts.log ?? false,
    define: { underscored: true },
    pool: { max: 10, min: 0, idle: 10_000, acquire: 60_000 },
  });
  // COUNT(*) and SUM of integers come back as BIGINT, which pg hands over as text; the code
  // counts with them as numbers (as SQLite gives them), and no count here passes 2^53.
  (sequelize.connectionManager as unknown as { oidParserMap: Map<number, (v: string) => unknown> }).oidParserMap.set(PG_INT8, Number);
  const qi = sequelize.getQueryInterface();
  const startTransaction = qi.startTransaction.bind(qi);
  qi.startTransaction = async (t, o) => {
    await startTransaction(t, o);
    // nested transactions (savepoints) already hold it through their parent
    if (!(t as unknown as { parent?: unknown }).parent) await sequelize.query(`SELECT pg_advisory_xact_lock(${TRANSACTION_LOCK})`, { transaction: t });
  };
  rawRowsAsSqlite(sequelize);
  await sequelize.authenticate();
  initModels(sequelize);
  return { sequelize, dialect: 'postgres', file: null, close: () => sequelize.close() };
}

/**
 * Rows of raw queries (no model) in the forms SQLite holds: stamps as its text
 * (`2026-11-30 12:00:00.000 +00:00`) instead of the Date objects pg makes of them, booleans as 1
 * and 0 instead of true and false. The raw SQL of the repositories reads stamps as text (slices
 * days off them, compares them with stamp texts) and flags as the numbers it declares, as the
 * SQLite file stores them. Queries for a model keep pg's Dates and booleans.
 */
function rawRowsAsSqlite(sequelize: Sequelize) {
  const query = sequelize.query.bind(sequelize) as (sql: unknown, options?: QueryOptionsWithType<QueryTypes> & { model?: unknown; instance?: unknown }) => Promise<unknown>;
  const fix = (rows: unknown) => {
    if (!Array.isArray(rows)) return;
    for (const row of rows) {
      if (!row || typeof row !== 'object') continue;
      const r = row as Record<string, unknown>;
      for (const k in r) {
        const v = r[k];
        if (v instanceof Date) r[k] = stampText(v);
        else if (typeof v === 'boolean') r[k] = Number(v);
      }
    }
  };
  (sequelize as { query: unknown }).query = async (sql: unknown, options?: QueryOptionsWithType<QueryTypes> & { model?: unknown; instance?: unknown }) => {
    const result = await query(sql, options);
    if (options?.model || options?.instance) return result;
    if (options?.type === QueryTypes.SELECT) fix(result);
    else if (!options?.type || options.type === QueryTypes.RAW) fix(Array.isArray(result) ? result[0] : undefined);
    return result;
  };
}

/** pg's type id of BIGINT (int8). */
const PG_INT8 = 20;
/** The advisory lock key every PostgreSQL transaction of the app takes ("RBDY"). */
const TRANSACTION_LOCK = 0x52424459;

/** The SQLite file (created if missing), switched to WAL mode. */
async function openSqlite(file: string, opts: { log?: (sql: string) => void }): Promise<Db> {
  fs.mkdirSync(path.dirname(file), { recursive: true });
  const sequelize = new Sequelize({
    dialect: 'sqlite',
    storage: file,
    logging: opts.log ?? false,
    // IMMEDIATE takes the write lock at BEGIN, so two writers wait instead of deadlocking.
    transactionType: Transaction.TYPES.IMMEDIATE,
    define: { underscored: true },
  });
  // Every sqlite3 connection (Sequelize opens one per transaction) waits for the lock rather
  // than failing at once with SQLITE_BUSY, and syncs as WAL mode allows: at checkpoints, not at
  // every commit (a crash or power cut can lose the last commits, never corrupt the file).
  // These are settings of the connection, not of the file, so each new one gets them.
  const cm = sequelize.connectionManager as unknown as {
    getConnection: (o?: unknown) => Promise<{ configure(k: 'busyTimeout', ms: number): void; run(sql: string): void; __rb?: boolean }>;
  };
  const getConnection = cm.getConnection.bind(cm);
  cm.getConnection = async (o?: unknown) => {
    const conn = await getConnection(o);
    if (!conn.__rb) {
      conn.configure('busyTimeout', 15000);
      // queued on the connection, so it runs before anything the caller sends
      conn.run('PRAGMA synchronous = NORMAL');
      conn.__rb = true;
    }
    return conn;
  };
  await sequelize.query('PRAGMA journal_mode = WAL');
  initModels(sequelize);
  return { sequelize, dialect: 'sqlite', file, close: () => sequelize.close() };
}

export function migrator(db: Db) {
  return new Umzug({
    migrations: MIGRATIONS,
    context: db.sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize: db.sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  });
}

/**
 * Applies every pending migration, one process at a time: app instances started together on one
 * database would otherwise each find the same migrations pending and run them twice (the later
 * one failing on a table the other has just made). On PostgreSQL the run holds a session
 * advisory lock on a connection of its own; on SQLite a lock file beside the database names the
 * process holding it, and one left by a process that has died is taken over.
 */
export async function migrate(db: Db) {
  const run = () => migrator(db).up();
  if (db.dialect === 'postgres') return withPostgresLock(db, MIGRATION_LOCK, run);
  return db.file ? withLockFile(`${db.file}.migrating`, run) : run();
}

/** The advisory lock key a migration run takes on PostgreSQL ("RBDM"). */
const MIGRATION_LOCK = 0x5242444d;

interface PgClient {
  query(sql: string): Promise<unknown>;
}

async function withPostgresLock<T>(db: Db, key: number, fn: () => Promise<T>): Promise<T> {
  const cm = db.sequelize.connectionManager as unknown as { getConnection(): Promise<PgClient>; releaseConnection(c: PgClient): Promise<void> };
  const conn = await cm.getConnection();
  try {
    await conn.query(`SELECT pg_advisory_lock(${key})`);
    try {
      return await fn();
    } finally {
      await conn.query(`SELECT pg_advisory_unlock(${key})`);
    }
  } finally {
    await cm.releaseConnection(conn);
  }
}

export function dbFile(dataDir: string) {
  return path.join(dataDir, 'reboundry.sqlite');
}

/** Where the configured database is: DATABASE_URL when set, else the SQLite file under DATA_DIR. */
export function dbLocation(config: { databaseUrl?: string; dataDir: string }) {
  return config.databaseUrl ?? dbFile(config.dataDir);
}
