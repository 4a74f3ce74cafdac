/**
 * A private Redis for the queue tests: Debian's `redis-server` started on a free loopback port
 * with a temporary folder and no persistence, stopped and removed when the test is done. Found
 * the way the browser tests find Chromium: REDIS_SERVER_PATH, or redis-server on the PATH, or
 * /usr/bin/redis-server; without it the test fails with a message naming the package.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';

export function redisServerPath(): string {
  const given = process.env.REDIS_SERVER_PATH;
  if (given) {
    if (!fs.existsSync(given)) throw new Error(`REDIS_SERVER_PATH=${given} does not exist`);
    return given;
  }
  const found = spawnSync('sh', ['-c', 'command -v redis-server'], { encoding: 'utf8' }).stdout.trim();
  if (found) return found;
  if (fs.existsSync('/usr/bin/redis-server')) return '/usr/bin/redis-server';
  throw new Error("redis-server not found: install Debian's `redis-server` package (apt-get install redis-server) or set REDIS_SERVER_PATH");
}

/** A port nobody listens on now (the kernel's pick, released at once). */
export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

export interface PrivateRedis {
  url: string;
  stop(): Promise<void>;
}

/** Starts a private Redis and resolves once it answers. */
export async function startRedis(): Promise<PrivateRedis> {
  const bin = redisServerPath();
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'reboundry-redis-'));
  const port = await freePort();
  const proc: ChildProcess = spawn(bin, ['--port', String(port), '--bind', '127.0.0.1', '--dir', dir, '--save', '', '--appendonly', 'no', '--protected-mode', 'yes'], {
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  proc.stdout?.on('data', (b: Buffer) => (output += b.toString()));
  proc.stderr?.on('data', (b: Buffer) => (output += b.toString()));
  const stop = async () => {
    if (proc.exitCode === null && proc.signalCode === null) {
      const exited = new Promise((res) => proc.once('exit', res));
      proc.kill('SIGTERM');
      await exited;
    }
    fs.rmSync(dir, { recursive: true, force: true });
  };
  const deadline = Date.now() + 15_000;
  for (;;) {
    if (proc.exitCode !== null) {
      await stop();
      throw new Error(`redis-server stopped at start (exit ${proc.exitCode}):\n${output}`);
    }
    const answered = await new Promise<boolean>((resolve) => {
      const sock = net.connect(port, '127.0.0.1', () => sock.write('PING\r\n'));
      sock.once('data', (b) => {
        sock.destroy();
        resolve(b.toString().startsWith('+PONG'));
      });
      sock.once('error', () => resolve(false));
    });
    if (answered) break;
    if (Date.now() > deadline) {
      await stop();
      throw new Error(`redis-server did not answer on port ${port} within 15 s:\n${output}`);
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  return { url: `redis://127.0.0.1:${port}`, stop };
}
