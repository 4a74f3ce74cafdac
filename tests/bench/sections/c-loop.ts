/**
 * Reference: the same 4-state recurrence (same Ad, Bd, same statistics) compiled from C with
 * -O2, when a C compiler is on PATH; otherwise reported as unavailable.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { prepareSimulation } from '../../../server/physics/simulate';
import type { BenchResult, BenchSection } from '../registry';
import { BENCH_CORNER, BENCH_DX_M, BENCH_SPEED_MPS, benchProfile } from '../workload';

const C_SOURCE = String.raw`
#include <stdio.h>
#include <stdlib.h>
#include <time.h>
static double now(void) { struct timespec t; clock_gettime(CLOCK_MONOTONIC, &t); return t.tv_sec + 1e-9 * t.tv_nsec; }
int main(int argc, char **argv) {
  if (argc < 27) return 2;
  double a[16], b[4], c[4], invDt;
  for (int i = 0; i < 16; i++) a[i] = atof(argv[1 + i]);
  for (int i = 0; i < 4; i++) b[i] = atof(argv[17 + i]);
  for (int i = 0; i < 4; i++) c[i] = atof(argv[21 + i]);
  invDt = atof(argv[25]);
  const char *path = argv[26];
  FILE *fp = fopen(path, "rb"); if (!fp) return 3;
  fseek(fp, 0, SEEK_END); long bytes = ftell(fp); fseek(fp, 0, SEEK_SET);
  long n = bytes / 8; double *e = malloc(bytes);
  if (fread(e, 8, n, fp) != (size_t)n) return 4;
  fclose(fp);
  double best = 1e30, sink = 0;
  for (int rep = 0; rep < 15; rep++) {
    double t0 = now();
    double x0 = 0, x1 = 0, x2 = 0, x3 = 0, sa = 0, st = 0, sv = 0, sf = 0;
    for (long k = 0; k + 1 < n; k++) {
      double u = (e[k + 1] - e[k]) * invDt;
      double n0 = a[0]*x0 + a[1]*x1 + a[2]*x2 + a[3]*x3 + b[0]*u;
      double n1 = a[4]*x0 + a[5]*x1 + a[6]*x2 + a[7]*x3 + b[1]*u;
      double n2 = a[8]*x0 + a[9]*x1 + a[10]*x2 + a[11]*x3 + b[2]*u;
      double n3 = a[12]*x0 + a[13]*x1 + a[14]*x2 + a[15]*x3 + b[3]*u;
      x0 = n0; x1 = n1; x2 = n2; x3 = n3;
      double acc = c[0]*x0 + c[1]*x1 + c[2]*x2 + c[3]*x3;
      double rv = x1 - x3;
      sa += acc*acc; st += x0*x0; sv += rv*rv; sf += x2*x2;
    }
    double t = now() - t0;
    if (t < best) best = t;
    sink += sa + st + sv + sf;
  }
  printf("{\"stepsPerSec\": %.6g, \"checksum\": %.17g}\n", (double)(n - 1) / best, sink);
  return 0;
}
`;

function findCompiler(): string | null {
  for (const cc of ['cc', 'gcc', 'clang']) {
    const r = spawnSync(cc, ['--version'], { encoding: 'utf8' });
    if (r.status === 0) return cc;
  }
  return null;
}

export const cLoopSection: BenchSection = {
  key: 'c-loop',
  name: 'reference: same recurrence in C (-O2)',
  run(ctx): BenchResult {
    const cc = findCompiler();
    if (!cc) {
      return {
        rows: [{ label: 'steps per second', value: null, unit: 'steps/s', note: 'unavailable: no C compiler (cc/gcc/clang) on PATH' }],
        metrics: { cLoopStepsPerSec: null, cLoopStatus: 'unavailable' },
      };
    }
    const dir = mkdtempSync(join(tmpdir(), 'reboundry-bench-'));
    try {
      const p = prepareSimulation(BENCH_CORNER, BENCH_DX_M, BENCH_SPEED_MPS);
      const z = benchProfile();
      writeFileSync(join(dir, 'loop.c'), C_SOURCE);
      writeFileSync(join(dir, 'profile.bin'), new Uint8Array(z.buffer, z.byteOffset, z.byteLength));
      const exe = join(dir, 'loop');
      const build = spawnSync(cc, ['-O2', '-o', exe, join(dir, 'loop.c')], { encoding: 'utf8' });
      if (build.status !== 0) {
        return {
          rows: [{ label: 'steps per second', value: null, unit: 'steps/s', note: `unavailable: compile failed (${build.stderr.trim().slice(0, 120)})` }],
          metrics: { cLoopStepsPerSec: null, cLoopStatus: 'compile-failed' },
        };
      }
      const args = [...p.Ad, ...p.Bd, ...p.rows.bodyAccel, 1 / p.dtS].map((v) => v.toPrecision(17));
      const run = spawnSync(exe, [...args, join(dir, 'profile.bin')], { encoding: 'utf8' });
      const out = JSON.parse(run.stdout) as { stepsPerSec: number };
      const engine = ctx.metrics.timeDomainStepsPerSec;
      const ratio = typeof engine === 'number' ? out.stepsPerSec / engine : null;
      return {
        rows: [
          { label: 'steps per second', value: out.stepsPerSec, unit: 'steps/s', note: `${cc} -O2, ${z.length - 1} steps, best of 15` },
          { label: 'C / engine time ratio', value: ratio, unit: '×', note: 'target ≤ 2× (engine within 2× of C)' },
        ],
        metrics: { cLoopStepsPerSec: out.stepsPerSec, cLoopStatus: 'measured', cOverEngine: ratio },
      };
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  },
};
