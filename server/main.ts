import 'dotenv/config';
import type { Server } from 'node:http';
import { ConfigError, loadConfig } from './config';
import { createApp } from './app';
import { createLogger } from './logger';
import { defaultWebDir, prepareDatabase } from './boot';
import { createMailer } from './mail/mailer';
import { startScheduler } from '../jobs/scheduler';
import { startNightly } from '../jobs/nightly';

async function main() {
  let config;
  try {
    config = loadConfig();
  } catch (err) {
    if (err instanceof ConfigError) {
      console.error(err.message);
      process.exit(2);
    }
    throw err;
  }
  const log = createLogger(config.logLevel);
  let seeded = false;
  const db = await prepareDatabase(config, log, new Date(), { onSeeded: () => (seeded = true) });
  const { mailer } = await createMailer(config, log);
  const built = createApp({ config, db, log, webDir: defaultWebDir, mailer, startNightly });
  const scheduler = startScheduler({ config, db, log, mailer });
  const server: Server = built.app.listen(config.port, config.host, () => {
    log.info(`Reboundry is running at ${config.publicUrl} (data in ${config.dataDir})`);
  });
  if (seeded) {
    // A freshly seeded demo fleet has trips but no duty yet: run the nightly job once, in the
    // background, so wear, predictions and due inspections are there to look at.
    log.info('demo: running the nightly job once over the seeded trips (see Job runs)');
    startNightly({ now: new Date(), log, db, config, mailer, trigger: 'seed' })
      .then(({ done }) => done)
      .catch((err) => log.error('demo: the first nightly run failed', err));
  }

  let stopping = false;
  const stop = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    log.info(`${signal}: shutting down`);
    server.close();
    built.close();
    await scheduler.stop();
    await mailer.close();
    await db.close();
    process.exit(0);
  };
  process.on('SIGINT', () => void stop('SIGINT'));
  process.on('SIGTERM', () => void stop('SIGTERM'));
  process.on('unhandledRejection', (reason) => log.error('unhandled rejection', reason));
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
