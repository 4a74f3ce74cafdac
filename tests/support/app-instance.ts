/**
 * Several app instances on one database, each in a process of its own
 * (tests/support/app-instance-main.ts), as behind a proxy: {@link startAppInstance} starts one
 * on the database of a test server (its SQLite file or its PostgreSQL database) and hands back
 * its address and the two things its scheduler and jobs would do on their own.
 */
import { spawn } from 'node:child_process';
import type { TestServer } from './server';
import type { InstanceCommand, InstanceReady, InstanceReply, InstanceRequest } from './app-instance-main';
import type { ScheduledOutcome } from '../../jobs/scheduler';

export interface AppInstance {
  url: string;
  pid: number;
  /** `sendPending` in the instance, with `now` stamping what it sends. */
  sendPending(now: Date): Promise<{ sent: number; failed: { item: string; message: string }[] }>;
  /** One firing of the instance's nightly schedule at `now` (jobs/scheduler.ts `fireNightly`). */
  fireNightly(now: Date): Promise<ScheduledOutcome>;
  /** What it wrote to stdout and stderr. */
  output(): string;
  stop(): Promise<void>;
}

/** Starts an instance on `srv`'s database, with `srv`'s settings and `env` over them. */
export async function startAppInstance(srv: TestServer, now: Date, env: Record<string, string> = {}): Promise<AppInstance> {
  const proc = spawn(process.execPath, ['--import', 'tsx', 'tests/support/app-instance-main.ts'], {
    env: {
      ...process.env,
      NODE_ENV: 'test',
      DATA_DIR: srv.dataDir,
      ...(srv.config.databaseUrl ? { DATABASE_URL: srv.config.databaseUrl } : {}),
      SEED_DEMO: 'false',
      FAKE_SMTP_PORT: '0',
      LOG_LEVEL: 'error',
      TZ: srv.config.timeZone,
      INSTANCE_NOW: now.toISOString(),
      ...env,
    },
    stdio: ['ignore', 'pipe', 'pipe', 'ipc'],
  });
  let out = '';
  proc.stdout!.on('data', (b: Buffer) => (out += b.toString()));
  proc.stderr!.on('data', (b: Buffer) => (out += b.toString()));
  const waiting = new Map<number, { resolve(v: unknown): void; reject(e: Error): void }>();
  let nextId = 0;
  let exited = false;
  const gone = new Promise<void>((resolve) =>
    proc.once('exit', (code, signal) => {
      exited = true;
      for (const w of waiting.values()) w.reject(new Error(`the app instance ended (${signal ?? code}):\n${out}`));
      waiting.clear();
      resolve();
    }),
  );
  const url = await new Promise<string>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`the app instance did not start within 60 s:\n${out}`)), 60_000);
    proc.once('exit', (code) => reject(new Error(`the app instance stopped at start (exit ${code}):\n${out}`)));
    proc.on('message', (m: InstanceReady | InstanceReply) => {
      if ('ready' in m) {
        clearTimeout(timer);
        resolve(m.url);
        return;
      }
      const w = waiting.get(m.id);
      waiting.delete(m.id);
      if (m.ok) w?.resolve(m.result);
      else w?.reject(new Error(m.error));
    });
  });
  const ask = <T>(req: InstanceCommand) =>
    new Promise<T>((resolve, reject) => {
      if (exited) return reject(new Error(`the app instance has ended:\n${out}`));
      const id = ++nextId;
      waiting.set(id, { resolve: resolve as (v: unknown) => void, reject });
      proc.send({ ...req, id } satisfies InstanceRequest);
    });
  return {
    url,
    pid: proc.pid!,
    sendPending: (at) => ask({ cmd: 'sendPending', now: at.toISOString() }),
    fireNightly: (at) => ask({ cmd: 'fireNightly', now: at.toISOString() }),
    output: () => out,
    async stop() {
      if (exited) return;
      const stopped = ask({ cmd: 'stop' }).catch(() => undefined);
      const killer = setTimeout(() => proc.kill('SIGKILL'), 15_000);
      await stopped;
      await gone;
      clearTimeout(killer);
    },
  };
}
