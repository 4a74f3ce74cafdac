/**
 * Benchmark of the physics engine. `npm run bench` prints a table; `npm run bench -- --json`
 * prints one JSON object with the metrics (timeDomainStepsPerSec, baselineStepsPerSec,
 * closedFormEvalsPerSec, cLoopStepsPerSec, …). `npm run bench -- --only client` runs only the sections
 * whose key (see `SECTIONS` in registry.ts) is listed, comma-separated.
 */
import os from 'node:os';
import { SECTIONS, type BenchContext, type BenchRow } from './registry';

const fmt = (r: BenchRow): string => {
  if (r.value === null) return 'n/a';
  const v = r.value;
  if (r.unit === '×') return `${v.toFixed(2)}×`;
  if (Math.abs(v) >= 1e4) return `${(v / 1e6).toFixed(3)} M ${r.unit}`;
  if (Math.abs(v) < 1e-2) return `${v.toExponential(2)} ${r.unit}`;
  return `${v.toFixed(2)} ${r.unit}`;
};

async function main(): Promise<void> {
  const json = process.argv.includes('--json');
  const onlyAt = process.argv.indexOf('--only');
  const only = onlyAt > 0 ? new Set((process.argv[onlyAt + 1] ?? '').split(',')) : null;
  const ctx: BenchContext = { metrics: {} };
  const tables: { name: string; rows: BenchRow[] }[] = [];
  for (const s of SECTIONS.filter((x) => !only || (x.key !== undefined && only.has(x.key)))) {
    const res = await s.run(ctx);
    Object.assign(ctx.metrics, res.metrics);
    tables.push({ name: s.name, rows: res.rows });
  }
  const env = { node: process.version, cpu: os.cpus()[0]?.model ?? 'unknown', cores: os.cpus().length };
  if (json) {
    process.stdout.write(`${JSON.stringify({ ...ctx.metrics, env })}\n`);
    return;
  }
  const lines: string[] = [`Reboundry benchmark — node ${env.node}, ${env.cpu} (${env.cores} cores)`, ''];
  for (const t of tables) {
    lines.push(t.name);
    for (const r of t.rows) lines.push(`  ${r.label.padEnd(44)} ${fmt(r).padStart(20)}   ${r.note ?? ''}`);
    lines.push('');
  }
  process.stdout.write(`${lines.join('\n')}\n`);
}

main().catch((e: unknown) => {
  process.stderr.write(`bench: ${(e as Error).stack ?? String(e)}\n`);
  process.exitCode = 1;
});
