/**
 * Server load helpers: start the app in a child process, sign in, and drive it with a fixed
 * number of connections for a bounded time.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import http from 'node:http';
import { ApiClient, DEMO } from '../../support/client';

const here = import.meta.dirname;

export async function startChild(): Promise<{ url: string; child: ChildProcess }> {
  const child = spawn(process.execPath, [...(process.env.BENCH_CHILD_CPU_PROF ? ['--cpu-prof', `--cpu-prof-dir=${process.env.BENCH_CHILD_CPU_PROF}`] : []), '--import', 'tsx', path.join(here, 'child.ts')], { stdio: ['pipe', 'pipe', 'inherit'] });
  const url = await new Promise<string>((resolve, reject) => {
    let buf = '';
    child.stdout!.on('data', (d: Buffer) => {
      buf += d.toString();
      const line = buf.split('\n').find((l) => l.startsWith('{'));
      if (line) resolve((JSON.parse(line) as { url: string }).url);
    });
    child.on('exit', (code) => reject(new Error(`server child exited with ${code}`)));
  });
  return { url, child };
}

export function stopChild(child: ChildProcess) {
  child.stdin!.end();
}

/** Percentile `p` (0–1) of sorted values. */
export const pct = (sorted: number[], p: number) => (sorted.length ? sorted[Math.min(sorted.length - 1, Math.floor(p * sorted.length))] : NaN);

/** The session cookie of a signed-in demo manager. */
export async function managerCookie(url: string) {
  const c = new ApiClient(url);
  await c.login(DEMO.manager);
  return (c as unknown as { cookieHeader(): string }).cookieHeader();
}

/**
 * `connections` clients, each sending the next request as soon as the last one answered, over
 * `paths` in turn, for `seconds`. Returns requests per second, latency percentiles [ms] and errors.
 */
export async function drive(url: string, cookie: string, paths: string[], connections: number, seconds: number) {
  const agent = new http.Agent({ keepAlive: true, maxSockets: connections });
  const get = (p: string) =>
    new Promise<{ status: number; bytes: number }>((resolve, reject) => {
      const req = http.get(url + p, { agent, headers: { cookie } }, (res) => {
        let bytes = 0;
        res.on('data', (d: Buffer) => (bytes += d.length));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, bytes }));
        res.on('error', reject);
      });
      req.on('error', reject);
    });
  const lat: number[] = [];
  let errors = 0;
  let bytes = 0;
  const end = performance.now() + seconds * 1000;
  let k = 0;
  await Promise.all(
    Array.from({ length: connections }, async () => {
      while (performance.now() < end) {
        const p = paths[k++ % paths.length];
        const t = performance.now();
        try {
          const r = await get(p);
          bytes += r.bytes;
          if (r.status >= 400) errors++;
        } catch {
          errors++;
        }
        lat.push(performance.now() - t);
      }
    }),
  );
  agent.destroy();
  lat.sort((a, b) => a - b);
  return { rps: lat.length / seconds, p50: pct(lat, 0.5), p95: pct(lat, 0.95), p99: pct(lat, 0.99), errors, requests: lat.length, kbPerResponse: bytes / 1024 / Math.max(1, lat.length) };
}
