import path from 'node:path';
import { BaseSequencer, type TestSpecification } from 'vitest/node';

/**
 * Seconds the slowest files take on a quiet two-core machine (a full `npm run test:all`, after
 * the templates of tests/support/server.ts were built). Without timings of its own (a fresh checkout
 * has no vitest cache), vitest would start the biggest files first, and a short file that runs
 * long — the accessibility sweep, a nightly crash test — would start last and run on alone
 * while the other core idles.
 */
const SLOW: Record<string, number> = {
  'e2e:tests/e2e/accessibility.test.ts': 67,
  'e2e:tests/e2e/damper-life.test.ts': 32,
  'e2e:tests/e2e/routes-editing.test.ts': 31,
  'e2e:tests/e2e/roles.test.ts': 28,
  'e2e:tests/e2e/drivers.test.ts': 26,
  'unit:tests/server/nightly-job.test.ts': 23,
  'unit:tests/jobs/nightly-cancel-phases.test.ts': 21,
  'unit:tests/jobs/nightly-crash.test.ts': 21,
  'unit:tests/server/wear/duty-retention.test.ts': 19,
  'e2e:tests/e2e/sign-in.test.ts': 18,
  'e2e:tests/e2e/people.test.ts': 17,
  'e2e:tests/e2e/roads-and-imports.test.ts': 17,
  'e2e:tests/e2e/vehicles.test.ts': 17,
  'unit:tests/jobs/nightly-threads.test.ts': 17,
  'e2e:tests/e2e/nightly.test.ts': 16,
  'unit:tests/physics/cli.test.ts': 15,
  'e2e:tests/e2e/workshop.test.ts': 13,
  'unit:tests/server/multi-instance.test.ts': 12,
  'e2e:tests/e2e/map.test.ts': 11,
  'e2e:tests/e2e/forms.test.ts': 10,
  'e2e:tests/e2e/fleet-forms.test.ts': 8,
  'unit:tests/server/role-access.test.ts': 6,
};

/** Starts the longest files first (by this machine's last timings, else by {@link SLOW}), so the two workers finish together. */
export class SlowFirstSequencer extends BaseSequencer {
  override async sort(files: TestSpecification[]): Promise<TestSpecification[]> {
    const base = await super.sort(files);
    const seconds = (spec: TestSpecification) => {
      const key = `${spec.project.name}:${path.relative(this.ctx.config.root, spec.moduleId)}`;
      const known = this.ctx.cache.getFileTestResults(key);
      return known ? known.duration / 1000 : SLOW[key] ?? 0;
    };
    const order = new Map(base.map((spec, i) => [spec, i]));
    return [...base].sort((a, b) => seconds(b) - seconds(a) || order.get(a)! - order.get(b)!);
  }
}
