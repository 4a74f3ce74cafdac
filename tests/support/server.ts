import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { AddressInfo } from 'node:net';
import { loadConfig } from '../../server/config';
import { createApp, type AppDeps } from '../../server/app';
import { createLogger } from '../../server/logger';
import { prepareDatabase, defaultWebDir } from '../../server/boot';
import type { Db } from '../../server/db';
import type { Config } from '../../server/config';
import type { Logger } from '../../server/logger';
import { createMailer, type Mailer } from '../../server/mail/mailer';

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

/**
 * Boots the real app on port 0 against a fresh SQLite file in a temp folder (with the demo
 * fleet unless `seed: false`), serving the built client from dist/web when present.
 */
export async function startTestServer(opts: { seed?: boolean; auth?: AppDeps['auth']; env?: Record<string, string>; webDir?: string } = {}): Promise<TestServer> {
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'reboundry-test-'));
  const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: dataDir, SEED_DEMO: opts.seed === false ? 'false' : 'true', FAKE_SMTP_PORT: '0', LOG_LEVEL: 'error', ...opts.env });
  const log = createLogger(config.logLevel);
  const db = await prepareDatabase(config, log, TEST_NOW);
  const { mailer } = await createMailer(config, log);
  const built = createApp({ config, db, log, now: () => TEST_NOW, auth: opts.auth, webDir: opts.webDir ?? defaultWebDir, mailer });
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
      fs.rmSync(dataDir, { recursive: true, force: true });
    },
  };
}
