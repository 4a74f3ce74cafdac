import crypto from 'node:crypto';
import { processAlive } from '../../server/lib/lock-file';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, inject } from 'vitest';
import { Sequelize } from 'sequelize';
import { loadConfig } from '../../server/config';
import { createApp, type AppDeps } from '../../server/app';
import { createLogger } from '../../server/logger';
import { prepareDatabase, defaultWebDir } from '../../server/boot';
import type { Db } from '../../server/db';
import type { Config } from '../../server/config';
import type { Logger } from '../../server/logger';
import { createMailer, type Mailer } from '../../server/mail/mailer';
import { run as runNightly, startNightly } from '../../jobs/nightly';
import { ApiClient, DEMO } from './client';
import { sourceHash } from './code-hash';

export interface TestServer {
  url: string;
  db: Db;
  dataDir: string;
  api: ReturnType<typeof createApp>['api'];
  /** Deletes expired session rows now. */
  pruneSessions(): Promise<void>;
  /** The app's configuration, logger and mailer (the built-in mail catcher on a free port). */
  config: Config;
  log: Logger;
  mailer: Mailer;
  /** With `afterNightly`: the counts of the nightly run the data comes from. */
  nightlyCounts?: Record<string, number>;
  stop(): Promise<void>;
}

/** A fixed "today" for tests, so seeded dates and due dates are stable. */
export const TEST_NOW = new Date('2026-11-30T12:00:00Z');

/** The source files under these folders, hashed with {@link TEST_NOW} and `extra`: a template built by other code is never reused. */
export function codeHash(dirs: string[], extra = ''): string {
  return sourceHash(dirs, TEST_NOW.toISOString() + extra);
}

/**
 * Makes the folder `dir` once for all test workers of this run and later ones: the first worker to
 * ask takes a lock folder (holding its pid) and builds into a private folder, moved into place by
 * one rename, so no worker sees a half-built one; the others wait for it instead of building it
 * too. A lock whose process has ended is taken over.
 */
export async function buildOnce(dir: string, build: (work: string) => Promise<void>): Promise<string> {
  const lock = `${dir}.lock`;
  for (;;) {
    if (fs.existsSync(dir)) return dir;
    try {
      fs.mkdirSync(lock);
    } catch {
      let pid = 0;
      try {
        pid = Number(fs.readFileSync(path.join(lock, 'pid'), 'utf8'));
      } catch {
        // the lock was just taken (its pid not yet written) or just let go
      }
      if (pid && !processAlive(pid)) fs.rmSync(lock, { recursive: true, force: true });
      await new Promise((res) => setTimeout(res, 200));
      continue;
    }
    try {
      fs.writeFileSync(path.join(lock, 'pid'), String(process.pid));
      if (fs.existsSync(dir)) return dir;
      const work = fs.mkdtempSync(path.join(os.tmpdir(), 'reboundry-building-'));
      try {
        await build(work);
        fs.renameSync(work, dir);
      } finally {
        fs.rmSync(work, { recursive: true, force: true });
      }
      return dir;
    } finally {
      fs.rmSync(lock, { recursive: true, force: true });
    }
  }
}

/**
 * Which fleet a test server starts from: the whole demo fleet, or its small cut
 * ({@link SMALL_FLEET}) for the tests that run the nightly job several times and compare tables,
 * where what counts is that the runs agree, not the size of the fleet.
 */
export type TestFleet = 'demo' | 'small';

/** The small cut of the demo fleet: its first four vehicles of each spec (12 vehicles, about 450 trips). */
export const SMALL_FLEET = { vehiclesPerSpec: 4 };

const demoOptions = (fleet: TestFleet) => (fleet === 'small' ? SMALL_FLEET : {});
/** What a template's code hash takes in beside the code: nothing for the whole demo fleet. */
export const fleetTag = (fleet: TestFleet) => (fleet === 'small' ? JSON.stringify(SMALL_FLEET) : '');
/** What a template's folder name says of its fleet: nothing for the whole demo fleet. */
export const fleetSuffix = (fleet: TestFleet) => (fleet === 'small' ? '-small' : '');

/** `make` called once per fleet in this process, its promise kept. */
function oncePerFleet(make: (fleet: TestFleet) => Promise<string>): (fleet?: TestFleet) => Promise<string> {
  const made = new Map<TestFleet, Promise<string>>();
  return (fleet = 'demo') => {
    let p = made.get(fleet);
    if (!p) made.set(fleet, (p = make(fleet)));
    return p;
  };
}

/**
 * A data folder holding the migrated database with the demo fleet (or its small cut) seeded as of
 * {@link TEST_NOW}, shared by every test file of a run (and of later runs while the server code
 * is unchanged), closed so the WAL is folded into the database file.
 */
const demoTemplate = oncePerFleet((fleet) =>
  buildOnce(path.join(os.tmpdir(), `reboundry-${fleet}-template-${codeHash(['server'], fleetTag(fleet))}`), async (work) => {
    const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: work, SEED_DEMO: 'true', LOG_LEVEL: 'error' });
    const db = await prepareDatabase(config, createLogger(config.logLevel), TEST_NOW, { demo: demoOptions(fleet) });
    await db.close();
  }),
);

/**
 * The nightly job's settings every reference and comparison run uses (several batches on the
 * demo fleet). A run on the default settings (one batch) leaves the same tables.
 */
export const NIGHTLY_TEST_ENV = { NIGHTLY_BATCH_TRIPS: '400' };

/** The file in the nightly template's folder that holds the counts of its run. */
const RUN_FILE = 'nightly-run.json';

/**
 * The demo fleet (or its small cut) after one clean nightly run as of {@link TEST_NOW} on
 * {@link NIGHTLY_TEST_ENV}, its mail sent to the built-in catcher: built once per version of the
 * server and job code, like the demo template, for every test that starts by running the job on
 * that fleet.
 */
const nightlyTemplate = oncePerFleet((fleet) =>
  demoTemplate(fleet).then((demo) =>
    buildOnce(path.join(os.tmpdir(), `reboundry-nightly${fleetSuffix(fleet)}-template-${codeHash(['server', 'jobs'], JSON.stringify(NIGHTLY_TEST_ENV) + fleetTag(fleet))}`), async (work) => {
      fs.cpSync(demo, work, { recursive: true });
      const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: work, SEED_DEMO: 'true', FAKE_SMTP_PORT: '0', LOG_LEVEL: 'error', ...NIGHTLY_TEST_ENV });
      const log = createLogger(config.logLevel);
      const db = await prepareDatabase(config, log, TEST_NOW);
      const { mailer } = await createMailer(config, log);
      try {
        const r = await runNightly({ db, config, log, mailer, now: TEST_NOW, trigger: 'test' });
        if (r.status !== 'succeeded') throw new Error(`the template's nightly run ${r.status}: ${JSON.stringify(r.errors.slice(0, 5))}`);
        fs.writeFileSync(path.join(work, RUN_FILE), JSON.stringify({ counts: r.counts }));
      } finally {
        await mailer.close();
        await db.close();
      }
    }),
  ),
);

/** The private PostgreSQL server of the `pg` test project and its seeded template (postgres-global.ts). */
export interface PostgresTarget {
  baseUrl: string;
  /** The seeded template database of each fleet it has, and the data folder (survey files) beside it. */
  templates: Partial<Record<TestFleet, { db: string; dataDir: string }>>;
}

/** Migrates and seeds the demo fleet, or its small cut (as of {@link TEST_NOW}), into an empty PostgreSQL database. */
export async function seedPostgresTemplate(url: string, dataDir: string, fleet: TestFleet = 'demo') {
  const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: dataDir, DATABASE_URL: url, SEED_DEMO: 'true', LOG_LEVEL: 'error' });
  const db = await prepareDatabase(config, createLogger(config.logLevel), TEST_NOW, { demo: demoOptions(fleet) });
  await db.close();
}

/** The PostgreSQL server tests run against: set in the `pg` project only. */
function postgresTarget(): PostgresTarget | undefined {
  try {
    return inject('reboundryPostgres');
  } catch {
    return undefined; // not inside a vitest worker (benchmarks)
  }
}

/** Which database a test server runs on: PostgreSQL in the `pg` project, else SQLite; a test may ask for one. */
export type TestDatabase = 'sqlite' | 'postgres';
export const defaultTestDatabase = (): TestDatabase => (postgresTarget() ? 'postgres' : 'sqlite');

let pgDatabases = 0;

/** The target's seeded template of a fleet; a target started without it cannot give that fleet. */
function pgTemplate(target: PostgresTarget, fleet: TestFleet): { db: string; dataDir: string } {
  const t = target.templates[fleet];
  if (!t) throw new Error(`this PostgreSQL server has no template of the ${fleet} fleet: start it with startPostgresTarget([..., '${fleet}'])`);
  return t;
}

/** A new PostgreSQL database for one test server: a copy of a fleet's seeded template, or empty. */
async function createPostgresDatabase(target: PostgresTarget, seeded: TestFleet | null): Promise<{ url: string; drop(): Promise<void> }> {
  const name = `reboundry_test_${process.pid}_${++pgDatabases}_${crypto.randomBytes(3).toString('hex')}`;
  const admin = new Sequelize(`${target.baseUrl}postgres`, { dialect: 'postgres', logging: false });
  try {
    for (let attempt = 0; ; attempt++) {
      try {
        await admin.query(`CREATE DATABASE ${name}${seeded ? ` TEMPLATE ${pgTemplate(target, seeded).db}` : ''}`);
        break;
      } catch (e) {
        // two copies of one template at the same moment: the second waits for the first
        if (attempt > 50 || !/being accessed by other users/.test(String(e))) throw e;
        await new Promise((r) => setTimeout(r, 100));
      }
    }
  } finally {
    await admin.close();
  }
  return {
    url: `${target.baseUrl}${name}`,
    async drop() {
      const a = new Sequelize(`${target.baseUrl}postgres`, { dialect: 'postgres', logging: false });
      await a.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`).finally(() => a.close());
    },
  };
}

/** An empty PostgreSQL database on the `pg` project's server (dropped by `drop`), or undefined outside that project. */
export async function emptyPostgresDatabase(): Promise<{ url: string; drop(): Promise<void> } | undefined> {
  const target = postgresTarget();
  return target ? createPostgresDatabase(target, null) : undefined;
}

/**
 * Boots the real app on port 0 against a fresh SQLite file in a temp folder (with the demo
 * fleet unless `seed: false`), serving the built client from dist/web when present. With
 * `afterNightly`, the demo fleet is as one clean nightly run left it (the tables of running the
 * job first in the test, computed once instead of in every file that needs them). With
 * `postgres`, the database is a copy of that server's seeded template, in any project.
 */
export async function startTestServer(
  opts: { seed?: boolean; afterNightly?: boolean; fleet?: TestFleet; auth?: AppDeps['auth']; env?: Record<string, string>; webDir?: string; database?: TestDatabase; postgres?: PostgresTarget } = {},
): Promise<TestServer> {
  const fleet = opts.fleet ?? 'demo';
  if (opts.afterNightly && opts.seed === false) throw new Error('afterNightly starts from the demo fleet');
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'reboundry-test-'));
  // In the `pg` project (or when asked) the database is a copy of the private PostgreSQL server's
  // template: the project's, or one a test file started itself (`postgres`, startPostgresTarget()).
  const target = opts.postgres ?? ((opts.database ?? defaultTestDatabase()) === 'postgres' ? postgresTarget() : undefined);
  if (opts.database === 'postgres' && !target) throw new Error('no PostgreSQL server for the tests: run the `pg` project (vitest --project pg)');
  const pg = target ? await createPostgresDatabase(target, opts.seed !== false ? fleet : null) : null;
  // SQLite: the demo fleet (or the fleet after one nightly run) is built once per version of the code
  // and copied into each test's folder. PostgreSQL: the database is a copy of the seeded template,
  // and `afterNightly` runs the job on it below.
  const template = target ? (opts.seed !== false ? pgTemplate(target, fleet).dataDir : null) : opts.afterNightly ? await nightlyTemplate(fleet) : opts.seed !== false ? await demoTemplate(fleet) : null;
  if (template) fs.cpSync(template, dataDir, { recursive: true });
  const baseEnv = { NODE_ENV: 'test', DATA_DIR: dataDir, SEED_DEMO: opts.seed === false ? 'false' : 'true', FAKE_SMTP_PORT: '0', LOG_LEVEL: 'error', ...(pg ? { DATABASE_URL: pg.url } : {}) };
  const config = loadConfig({ ...baseEnv, ...opts.env });
  const log = createLogger(config.logLevel);
  const db = await prepareDatabase(config, log, TEST_NOW);
  const { mailer } = await createMailer(config, log);
  let nightlyCounts: Record<string, number> | undefined;
  if (opts.afterNightly && pg) {
    const r = await runNightly({ db, config: loadConfig({ ...baseEnv, ...NIGHTLY_TEST_ENV }), log, mailer, now: TEST_NOW, trigger: 'test' });
    if (r.status !== 'succeeded') throw new Error(`the nightly run before the test ${r.status}: ${JSON.stringify(r.errors.slice(0, 5))}`);
    nightlyCounts = r.counts;
  } else if (opts.afterNightly) {
    nightlyCounts = (JSON.parse(fs.readFileSync(path.join(dataDir, RUN_FILE), 'utf8')) as { counts: Record<string, number> }).counts;
  }
  const built = createApp({ config, db, log, now: () => TEST_NOW, auth: opts.auth, webDir: opts.webDir ?? defaultWebDir, mailer, startNightly });
  const server = await new Promise<import('node:http').Server>((resolve) => {
    const s = built.app.listen(0, '127.0.0.1', () => resolve(s));
  });
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}`,
    db,
    dataDir,
    api: built.api,
    pruneSessions: built.pruneSessions,
    config,
    log,
    mailer,
    nightlyCounts,
    async stop() {
      await new Promise<void>((resolve) => server.close(() => resolve()));
      server.closeAllConnections?.();
      built.close();
      await mailer.close();
      await db.close();
      await pg?.drop();
      fs.rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

/** The demo app with a fleet manager signed in: the usual start of an API test file. */
export async function startWithManager(opts: Parameters<typeof startTestServer>[0] = {}): Promise<{ srv: TestServer; manager: ApiClient }> {
  const srv = await startTestServer(opts);
  const manager = new ApiClient(srv.url);
  await manager.login(DEMO.manager);
  return { srv, manager };
}

/**
 * Stands for a value a file's `beforeAll` has yet to make, so the file can name it once at the
 * top (`const srv = serverForFile()`) instead of declaring it and assigning it in a hook. Methods
 * are bound to the real value; reading it before it is made fails with `what` in the message.
 */
export function lateBound<T extends object>(current: () => T | undefined, what: string): T {
  const real = (): T => {
    const v = current();
    if (v === undefined) throw new Error(`${what} is not started yet: read it inside a test or hook`);
    return v;
  };
  return new Proxy({} as T, {
    get(_, key) {
      const target = real();
      const v: unknown = Reflect.get(target, key, target);
      // a method it inherits is bound to it; a function it holds as a field of its own (the app's
      // router, whose `bind` is a route method) is handed out as it is
      if (typeof v !== 'function' || Object.prototype.hasOwnProperty.call(target, key)) return v;
      return Function.prototype.bind.call(v, target);
    },
    has: (_, key) => Reflect.has(real(), key),
  });
}

/** The file's own test server (`startTestServer()`), started before its tests and stopped after them. */
export function serverForFile(): TestServer {
  let started: TestServer | undefined;
  beforeAll(async () => {
    started = await startTestServer();
  });
  afterAll(() => started?.stop());
  return lateBound(() => started, 'the test server');
}

/**
 * The demo app with a fleet manager signed in ({@link startWithManager}), started before the tests
 * of the file, or of the `describe` it is called in, and stopped after them.
 */
export function managerForFile(opts: Parameters<typeof startTestServer>[0] = {}): { srv: TestServer; manager: ApiClient } {
  let started: { srv: TestServer; manager: ApiClient } | undefined;
  beforeAll(async () => {
    started = await startWithManager(opts);
  });
  afterAll(() => started?.srv.stop());
  return { srv: lateBound(() => started?.srv, 'the test server'), manager: lateBound(() => started?.manager, 'the manager') };
}
