import 'dotenv/config';
import type { Server } from 'node:http';
import { ConfigError, loadConfig } from './config';
import { createApp } from './app';
import { createLogger } from './logger';
import { defaultWebDir, prepareDatabase } from './boot';
import { createMailer } from './mail/mailer';
import { startScheduler } from '../jobs/scheduler';

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
  const db = await prepareDatabase(config, log);
  const { mailer } = await createMailer(config, log);
  const built = createApp({ config, db, log, webDir: defaultWebDir, mailer });
  const scheduler = startScheduler({ config, db, log, mailer });
  const server: Server = built.app.listen(config.port, config.host, () => {
    log.info(`Reboundry is running at ${config.publicUrl} (data in ${config.dataDir})`);
  });

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
