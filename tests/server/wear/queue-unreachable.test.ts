/**
 * The duty queue when its Redis is down (no Redis needed: the address is a loopback port nobody
 * listens on). The nightly job's runner gives up after its wait and says why, so the night
 * computes the duty itself instead of waiting for ever; a worker says once that it cannot reach
 * the Redis and keeps retrying, instead of printing every failed attempt as an unhandled error.
 */
import { spawn } from 'node:child_process';
import net from 'node:net';
import { describe, expect, it } from 'vitest';
import { createQueueDutyRunner } from '../../../server/wear/duty-queue';

/** A loopback address with nothing listening: a port taken from the system and let go again. */
async function closedRedisUrl(): Promise<string> {
  const srv = net.createServer();
  await new Promise<void>((resolve) => srv.listen(0, '127.0.0.1', resolve));
  const { port } = srv.address() as net.AddressInfo;
  await new Promise<void>((resolve) => srv.close(() => resolve()));
  return `redis://:secret@127.0.0.1:${port}`;
}

describe('the duty queue with its Redis down', () => {
  it('when the Redis does not answer, then the runner is null after the wait and the reason names the address without its password and the error', async () => {
    const url = await closedRedisUrl();
    const t0 = Date.now();
    const r = await createQueueDutyRunner(new Map(), url, 400);
    expect(r.runner).toBeNull();
    expect(r.workersSeen).toBe(0);
    expect(r.unreachable).toMatch(/^the duty queue's Redis at redis:\/\/…@127\.0\.0\.1:\d+ did not answer within 0\.4 s \(.*ECONNREFUSED.*\)$/);
    expect(r.unreachable).not.toContain('secret');
    expect(Date.now() - t0).toBeGreaterThanOrEqual(400);
  });

  it('when a worker cannot reach the Redis, then it says so once, without the password, and goes on retrying', async () => {
    const url = await closedRedisUrl();
    const proc = spawn(process.execPath, ['--import', 'tsx', 'jobs/worker.ts'], {
      env: { ...process.env, QUEUE_URL: url, LOG_LEVEL: 'info' },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let out = '';
    proc.stdout!.on('data', (b: Buffer) => (out += b.toString()));
    proc.stderr!.on('data', (b: Buffer) => (out += b.toString()));
    try {
      // ioredis retries within a few hundred milliseconds: wait for the message and a few retries
      await expect.poll(() => out, { timeout: 20_000 }).toMatch(/cannot reach the queue's Redis/);
      await new Promise((r) => setTimeout(r, 1500));
      expect(proc.exitCode).toBeNull();
      expect(out.match(/cannot reach the queue's Redis at redis:\/\/…@127\.0\.0\.1:\d+ \(.*ECONNREFUSED.*\); retrying/g)).toHaveLength(1);
      expect(out).not.toMatch(/Unhandled error event/);
      expect(out).not.toContain('secret');
    } finally {
      proc.kill('SIGKILL');
    }
  }, 30_000);
});
