/**
 * One app instance in a process of its own, as a test starts several on one database
 * (tests/support/app-instance.ts): the real app on a free loopback port with its own mail
 * catcher, and no scheduler of its own; the parent asks it over the IPC channel to send the
 * outbox or to fire the nightly schedule, as its node-cron task would. Its settings come from
 * the environment (DATA_DIR or DATABASE_URL naming the shared database); INSTANCE_NOW is the
 * app's "today" and INSTANCE_SEND_DELAY_MS slows each send, so two instances sending at once
 * work through the outbox side by side.
 */
import type { AddressInfo } from 'node:net';
import { loadConfig } from '../../server/config';
import { createApp } from '../../server/app';
import { createLogger } from '../../server/logger';
import { prepareDatabase } from '../../server/boot';
import { createMailer, type Mailer } from '../../server/mail/mailer';
import { sendPending } from '../../server/mail/service';
import { startNightly } from '../../jobs/nightly';
import { fireNightly } from '../../jobs/scheduler';

export type InstanceCommand = { cmd: 'sendPending' | 'fireNightly'; now: string } | { cmd: 'stop' };
export type InstanceRequest = InstanceCommand & { id: number };
export type InstanceReply = { id: number; ok: true; result: unknown } | { id: number; ok: false; error: string };
export type InstanceReady = { ready: true; url: string };

async function main() {
  if (!process.send) throw new Error('app-instance-main.ts runs as a child process with an IPC channel');
  const send = process.send.bind(process);
  const now = new Date(process.env.INSTANCE_NOW ?? Date.now());
  const delayMs = Number(process.env.INSTANCE_SEND_DELAY_MS ?? 0);
  const config = loadConfig(process.env);
  const log = createLogger(config.logLevel);
  const db = await prepareDatabase(config, log, now);
  const created = await createMailer(config, log);
  const mailer: Mailer = delayMs > 0 ? { ...created.mailer, send: async (m) => (await new Promise((r) => setTimeout(r, delayMs)), created.mailer.send(m)) } : created.mailer;
  const built = createApp({ config, db, log, now: () => now, mailer, startNightly });
  const server = await new Promise<import('node:http').Server>((resolve) => {
    const s = built.app.listen(0, '127.0.0.1', () => resolve(s));
  });
  const stop = async () => {
    await new Promise<void>((resolve) => server.close(() => resolve()));
    server.closeAllConnections?.();
    built.close();
    await created.mailer.close();
    await db.close();
  };
  process.on('message', (msg: InstanceRequest) => {
    void (async (): Promise<InstanceReply> => {
      try {
        if (msg.cmd === 'sendPending') return { id: msg.id, ok: true, result: await sendPending(mailer, new Date(msg.now), log) };
        if (msg.cmd === 'fireNightly') {
          const r = await fireNightly({ config, db, log, mailer }, new Date(msg.now));
          return { id: msg.id, ok: true, result: r.outcome === 'not started' ? { outcome: r.outcome, error: String(r.error) } : r };
        }
        await stop();
        return { id: msg.id, ok: true, result: null };
      } catch (err) {
        return { id: msg.id, ok: false, error: (err as Error).stack ?? String(err) };
      }
    })().then((reply) => {
      send(reply);
      if (msg.cmd === 'stop') process.disconnect();
    });
  });
  send({ ready: true, url: `http://127.0.0.1:${(server.address() as AddressInfo).port}` } satisfies InstanceReady);
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
