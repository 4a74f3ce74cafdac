/**
 * Benchmark registry: each section measures one thing and returns table rows and named metrics.
 * Add a section (e.g. a nightly-job run) by writing `tests/bench/sections/<name>.ts` that exports
 * a {@link BenchSection} and listing it in {@link SECTIONS}.
 */
import { timeDomainSection } from './sections/time-domain';
import { baselineOdexSection } from './sections/baseline-odex';
import { cLoopSection } from './sections/c-loop';
import { closedFormSection } from './sections/closed-form';
import { nightly100kSection, nightlySection } from './sections/nightly';
import { serverSection } from './sections/server';
import { clientSection } from './sections/client';

/** One row of the printed table. */
export interface BenchRow {
  /** What was measured. */
  label: string;
  /** The figure (null when unavailable). */
  value: number | null;
  /** Unit of the figure. */
  unit: string;
  /** Extra context. */
  note?: string;
}

/** Result of a section. */
export interface BenchResult {
  /** Rows for the readable table. */
  rows: BenchRow[];
  /** Named metrics merged into the JSON output. */
  metrics: Record<string, number | string | null>;
}

/** Shared context: results of earlier sections (so later ones can compare). */
export interface BenchContext {
  /** Metrics gathered so far. */
  metrics: Record<string, number | string | null>;
}

/** A benchmark section. */
export interface BenchSection {
  /** Short key for `--only` (sections without one run only when no `--only` is given). */
  key?: string;
  /** Short name shown as the table heading. */
  name: string;
  /** Run it. */
  run(ctx: BenchContext): Promise<BenchResult> | BenchResult;
}

/** Sections in run order. */
export const SECTIONS: BenchSection[] = [timeDomainSection, baselineOdexSection, cLoopSection, closedFormSection, nightlySection, nightly100kSection, serverSection, clientSection];
