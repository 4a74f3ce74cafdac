/**
 * Runs a job by name from the command line:
 *
 *     npm run job -- nightly [--as-of YYYY-MM-DD]
 *
 * Uses the same configuration (.env) and database as the app; e-mail goes through SMTP_URL, or
 * is stored in the app's mail table by a catcher started for the run. Ctrl-C cancels cleanly
 * (work committed so far is kept). Exit code 0 on success, 1 on failure, 2 on bad usage.
 */
import 'dotenv/config';
import { ConfigError, loadConfig } from '../server/config';
import { createLogger } from '../server/logger';
import { prepareDatabase } from '../server/boot';
import { createMailer } from '../server/mail/mailer';
import { LockBusyError } from '../server/jobs/repository';
import * as nightly from './nightly';
import { isoDay } from '../server/http/validate';

const JOBS = { nightly } as const;

function usage(msg?: string): never {
  if (msg) console.error(msg);
  console.error('usage: npm run job -- <job> [--as-of YYYY-MM-DD]\njobs: ' + Object.keys(JOBS).join(', '));
  process.exit(2);
}

async function main() {
  const args = process.argv.slice(2);
  const jobName = args[0];
  if (!jobName || !(jobName in JOBS)) usage(jobName ? `unknown job "${jobName}"` : 'no job named');
  let asOf: string | undefined;
  for (let i = 1; i < args.length; i++) {
    if (args[i] === '--as-of') {
      asOf = args[++i];
      if (!asOf || !isoDay.safeParse(asOf).success) usage('--as-of needs a real date like 2026-11-30');
    } else usage(`unknown option "${args[i]}"`);
  }
  let config;
  try {
    // the CLI's own mail catcher takes any free port so it never clashes with a running app
    config = loadConfig({ ...process.env, FAKE_SMTP_PORT: process.env.SMTP_URL ? process.env.FAKE_SMTP_PORT : '0' });
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
  const abort = new AbortController();
  process.on('SIGINT', () => abort.abort());
  process.on('SIGTERM', () => abort.abort());
  let code = 0;
  try {
    const r = await JOBS[jobName as keyof typeof JOBS].run({ now: new Date(), asOf, signal: abort.signal, log, db, config, mailer, trigger: 'cli' });
    console.log(JSON.stringify(r, null, 2));
    code = r.status === 'succeeded' || r.status === 'completed_with_errors' ? 0 : 1;
  } catch (err) {
    console.error(err instanceof LockBusyError ? `not started: ${err.message}` : err);
    code = 1;
  } finally {
    await mailer.close();
    await db.close();
  }
  process.exit(code);
}

void main();
