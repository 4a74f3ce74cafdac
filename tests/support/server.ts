import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { AddressInfo } from 'node:net';
import { inject } from 'vitest';
import { Sequelize } from 'sequelize';
import { loadConfig } from '../../server/config';
import { createApp, type AppDeps } from '../../server/app';
import { createLogger } from '../../server/logger';
import { prepareDatabase, defaultWebDir } from '../../server/boot';
import type { Db } from '../../server/db';
import type { Config } from '../../server/config';
import type { Logger } from '../../server/logger';
import { createMailer, type Mailer } from '../../server/mail/mailer';
import { startNightly } from '../../jobs/nightly';
import { ApiClient, DEMO } from './client';

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
  stop(): Promise<void>;
}

/** A fixed "today" for tests, so seeded dates and due dates are stable. */
export const TEST_NOW = new Date('2026-11-30T12:00:00Z');

/** Every server source file, hashed: a template seeded by other code is never reused. */
function serverCodeHash(): string {
  const h = crypto.createHash('sha256');
  const walk = (dir: string) => {
    for (const e of fs.readdirSync(dir, { withFileTypes: true }).sort((a, b) => a.name.localeCompare(b.name))) {
      const p = path.join(dir, e.name);
      if (e.isDirectory()) walk(p);
      else if (/\.(ts|mjs|json)$/.test(e.name)) h.update(p).update(fs.readFileSync(p));
    }
  };
  walk(path.resolve('server'));
  h.update(TEST_NOW.toISOString());
  return h.digest('hex').slice(0, 16);
}

let templateDir: Promise<string> | null = null;

/**
 * A data folder holding the migrated database with the demo fleet seeded as of {@link TEST_NOW},
 * shared by every test file of a run (and of later runs while the server code is unchanged).
 * Seeded into a private folder, closed (so the WAL is folded into the database file) and moved
 * into place by one rename, so concurrent test workers never see a half-written template.
 */
function demoTemplate(): Promise<string> {
  templateDir ??= (async () => {
    const dir = path.join(os.tmpdir(), `reboundry-demo-template-${serverCodeHash()}`);
    if (fs.existsSync(path.join(dir, 'reboundry.sqlite'))) return dir;
    const work = fs.mkdtempSync(path.join(os.tmpdir(), 'reboundry-demo-seeding-'));
    const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: work, SEED_DEMO: 'true', LOG_LEVEL: 'error' });
    const db = await prepareDatabase(config, createLogger(config.logLevel), TEST_NOW);
    await db.close();
    try {
      fs.renameSync(work, dir);
    } catch {
      // another worker put its template in place first: use that one
      fs.rmSync(work, { recursive: true, force: true });
    }
    return dir;
  })();
  return templateDir;
}

/** The private PostgreSQL server of the `pg` test project and its seeded template (postgres-global.ts). */
export interface PostgresTarget {
  baseUrl: string;
  templateDb: string;
  templateDataDir: string;
}

/** Migrates and seeds the demo fleet (as of {@link TEST_NOW}) into an empty PostgreSQL database. */
export async function seedPostgresTemplate(url: string, dataDir: string) {
  const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: dataDir, DATABASE_URL: url, SEED_DEMO: 'true', LOG_LEVEL: 'error' });
  const db = await prepareDatabase(config, createLogger(config.logLevel), TEST_NOW);
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

/** A new PostgreSQL database for one test server: a copy of the seeded template, or empty. */
async function createPostgresDatabase(target: PostgresTarget, seeded: boolean): Promise<{ url: string; drop(): Promise<void> }> {
  const name = `reboundry_test_${process.pid}_${++pgDatabases}_${crypto.randomBytes(3).toString('hex')}`;
  const admin = new Sequelize(`${target.baseUrl}postgres`, { dialect: 'postgres', logging: false });
  try {
    for (let attempt = 0; ; attempt++) {
      try {
        await admin.query(`CREATE DATABASE ${name}${seeded ? ` TEMPLATE ${target.templateDb}` : ''}`);
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

/**
 * Boots the real app on port 0 against a fresh SQLite file in a temp folder (with the demo
 * fleet unless `seed: false`), serving the built client from dist/web when present.
 */
export async function startTestServer(
  opts: { seed?: boolean; auth?: AppDeps['auth']; env?: Record<string, string>; webDir?: string; database?: TestDatabase } = {},
): Promise<TestServer> {
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'reboundry-test-'));
  // In the `pg` project (or when asked) the database is a copy of the private PostgreSQL server's template.
  const target = (opts.database ?? defaultTestDatabase()) === 'postgres' ? postgresTarget() : undefined;
  if (opts.database === 'postgres' && !target) throw new Error('no PostgreSQL server for the tests: run the `pg` project (vitest --project pg)');
  const pg = target ? await createPostgresDatabase(target, opts.seed !== false) : null;
  // The demo fleet is seeded once per version of the server code and copied into each test's folder.
  if (opts.seed !== false) fs.cpSync(target ? target.templateDataDir : await demoTemplate(), dataDir, { recursive: true });
  const config = loadConfig({
    NODE_ENV: 'test', DATA_DIR: dataDir, SEED_DEMO: opts.seed === false ? 'false' : 'true', FAKE_SMTP_PORT: '0', LOG_LEVEL: 'error',
    ...(pg ? { DATABASE_URL: pg.url } : {}),
    ...opts.env,
  });
  const log = createLogger(config.logLevel);
  const db = await prepareDatabase(config, log, TEST_NOW);
  const { mailer } = await createMailer(config, log);
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
