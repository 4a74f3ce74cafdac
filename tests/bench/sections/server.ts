/**
 * The running app on the demo fleet, over loopback, in a process of its own: `/api/health`
 * latency while a 10 000-row trip file is imported (target p99 under 200 ms), then mixed reads
 * at 50 and 200 connections (requests per second and p50/p95/p99), each bounded in time.
 */
import type { BenchSection } from '../registry';
import { drive, managerCookie, pct, startChild, stopChild } from '../server/load';

const SECONDS = Number(process.env.BENCH_LOAD_SECONDS ?? 8);

/** A clean trip file of `n` rows over the given vehicles, each trip 40 min, two hours apart, from January 2026 (before the demo's trips). */
export function tripFile(n: number, fleet: string[]) {
  const lines = ['vehicle,route,driver_email,start,end,distance_km,mean_speed_kmh,payload_kg'];
  const t0 = Date.parse('2026-01-05T00:00:00Z');
  for (let i = 0; i < n; i++) {
    const vehicle = fleet[i % fleet.length];
    const slot = Math.floor(i / fleet.length);
    const start = new Date(t0 + slot * 2 * 3_600_000);
    const end = new Date(start.getTime() + 40 * 60_000);
    lines.push(`${vehicle},Tanner Way town loop,,${start.toISOString()},${end.toISOString()},14,30,300`);
  }
  return lines.join('\n');
}

export const serverSection: BenchSection = {
  key: 'server',
  name: `Server on the demo fleet (loopback, ${SECONDS} s per load step)`,
  async run() {
    const { url, child } = await startChild();
    try {
      const cookie = await managerCookie(url);
      // health checks during a 10 000-row import
      const { ApiClient, DEMO } = await import('../../support/client');
      const m = new ApiClient(url);
      await m.login(DEMO.manager);
      const fleet = (await m.get<{ items: { fleetNumber: string }[] }>('/api/vehicles?pageSize=200&status=in_service')).body.items.map((v) => v.fleetNumber);
      const form = new FormData();
      form.set('file', new Blob([tripFile(10_000, fleet)], { type: 'text/csv' }), 'bench-10k.csv');
      const health: number[] = [];
      let importing = true;
      const t0 = performance.now();
      const imp = m.raw('POST', '/api/trips/import', { form }).then(async (r) => {
        importing = false;
        return { status: r.status, s: (performance.now() - t0) / 1000, body: await r.text() };
      });
      while (importing) {
        const t = performance.now();
        await fetch(`${url}/api/health`);
        health.push(performance.now() - t);
        await new Promise((r) => setTimeout(r, 20));
      }
      const done = await imp;
      if (done.status !== 201) throw new Error(`bench import failed: ${done.status} ${done.body.slice(0, 300)}`);
      health.sort((a, b) => a - b);
      const vehicles = (await m.get<{ items: { id: number }[] }>('/api/vehicles?pageSize=10')).body.items.map((v) => v.id);
      const paths = [
        '/api/vehicles?pageSize=25',
        `/api/vehicles/${vehicles[0]}`,
        `/api/vehicles/${vehicles[1]}/wear`,
        `/api/vehicles/${vehicles[2]}/workshop`,
        '/api/inspections/due',
        '/api/map/segments',
        '/api/routes/1',
        '/api/trips?pageSize=25',
      ];
      const at50 = await drive(url, cookie, paths, 50, SECONDS);
      const at200 = await drive(url, cookie, paths, 200, SECONDS);
      const seg = await drive(url, cookie, ['/api/map/segments'], 50, Math.max(2, SECONDS / 2));
      const row = (label: string, r: typeof at50) => [
        { label: `${label}: throughput`, value: r.rps, unit: 'req/s', note: `${r.requests} requests, ${r.errors} errors, ${r.kbPerResponse.toFixed(0)} kB a response` },
        { label: `${label}: p50 / p95 / p99`, value: r.p50, unit: 'ms', note: `p95 ${r.p95.toFixed(0)} ms, p99 ${r.p99.toFixed(0)} ms` },
      ];
      return {
        rows: [
          { label: '10 000-row trip import', value: done.s, unit: 's', note: `${health.length} health checks meanwhile` },
          { label: 'health during import: p50', value: pct(health, 0.5), unit: 'ms' },
          { label: 'health during import: p99', value: pct(health, 0.99), unit: 'ms', note: `max ${health[health.length - 1]?.toFixed(0)} ms (target p99 < 200 ms)` },
          ...row('mixed reads, 50 connections', at50),
          ...row('mixed reads, 200 connections', at200),
          ...row('map segments alone, 50 connections', seg),
        ],
        metrics: {
          importS: done.s,
          healthDuringImportP99Ms: pct(health, 0.99),
          mixed50Rps: at50.rps,
          mixed50P95Ms: at50.p95,
          mixed200Rps: at200.rps,
          mixed200P95Ms: at200.p95,
          mixed200P99Ms: at200.p99,
          mapSegmentsRps: seg.rps,
        },
      };
    } finally {
      stopChild(child);
    }
  },
};
