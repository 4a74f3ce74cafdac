/**
 * Request bodies of the workshop endpoints (assigning an inspection, recording lane results,
 * recording work), shared with the client, which checks a form with them before sending it, and
 * the answers it reads: corner states, the life back-test, a Weibull fit.
 */
import { z } from 'zod';
import { isRealDay, isoDay, noHiddenChars } from './common';

export const FINDINGS = ['oil_leak', 'mount_loose_or_cracked', 'bush_worn', 'bump_stop_damaged', 'spring_cracked_or_sagging', 'tyre_uneven_wear'] as const;
export const VERDICTS = ['ok', 'monitor', 'replace'] as const;
/** Removal reasons that are not wear: such units count as suspensions (right-censored) in the life model. */
export const CENSORED_REASONS = ['fitted as a pair', 'accident damage', 'fitted with other work', 'vehicle retired'];
export const WEAR_REASONS = ['worn: low adhesion', 'leaking', 'mount or bush damage', 'noise or knocking'];
export const REMOVAL_REASONS = [...WEAR_REASONS, ...CENSORED_REASONS] as const;

export const position = z.string({ message: 'must be a corner such as FL' }).regex(/^[A-Z0-9]{2,4}$/, 'must be a corner such as FL, FR, RL, RR');
export const odometer = z.number({ message: 'must be a number in km' }).min(0, 'must be 0 km or more').max(5_000_000, 'must be at most 5 000 000 km');

export const assignBody = z
  .object({
    assigneeId: z.number({ message: 'must be a user id' }).int().positive().nullable(),
    depotId: z.number({ message: 'must be a depot id' }).int().positive().nullable(),
    dueDate: isoDay,
  })
  .partial()
  .strict()
  .refine((v) => Object.keys(v).length > 0, { message: 'give a mechanic, a depot or a due date', path: ['_'] });

/** A year after the day `day` (28 February when that day is 29 February). */
const yearAfter = (day: string) => {
  const next = `${Number(day.slice(0, 4)) + 1}${day.slice(4)}`;
  return isRealDay(next) ? next : `${next.slice(0, 8)}28`;
};

/** A follow-up date: a real day after the inspection day (`today`) and at most a year after it. */
export const followUpDate = (today: string) => {
  const last = yearAfter(today);
  return isoDay.refine((s) => s > today, `must be after the inspection day (${today})`).refine((s) => s <= last, `must be within a year of the inspection (on or before ${last})`);
};

export const resultsBody = (today: string) => z
  .object({
    odometerKm: odometer,
    notes: z.string().trim().max(4000, 'must be 4000 characters or fewer').nullish(),
    complete: z.boolean({ message: 'must be true or false' }).optional(),
    /** With a "check again soon" verdict: when to check again (default 30 days on). */
    followUpOn: followUpDate(today).nullish(),
    plateAmplitudeMm: z.number({ message: 'must be a number in mm' }).min(0.5, 'must be 0.5–10 mm (zero-to-peak: half the stroke)').max(10, 'must be 0.5–10 mm (zero-to-peak: half the stroke)').optional(),
    corners: z
      .array(
        z
          .object({
            position,
            adhesionPct: z.number({ message: 'must be a number in %' }).min(0, 'must be 0–100 %').max(100, 'must be 0–100 %').nullable(),
            phaseDeg: z.number({ message: 'must be a number in °' }).min(0, 'must be 0–180°').max(180, 'must be 0–180°').nullish(),
            findings: z.array(z.enum(FINDINGS, { message: `must be one of ${FINDINGS.join(', ')}` })).max(FINDINGS.length).default([]),
            verdict: z.enum(VERDICTS, { message: 'must be ok, monitor or replace' }),
          })
          .strict(),
        { message: 'must be a list of corners' },
      )
      .min(1, 'record at least one corner')
      .max(12),
  })
  .strict()
  .superRefine((v, ctx) => {
    const seen = new Set<string>();
    v.corners.forEach((c, k) => {
      if (seen.has(c.position)) ctx.addIssue({ code: 'custom', path: ['corners', k, 'position'], message: `${c.position} is given twice` });
      seen.add(c.position);
    });
  });

export const workBody = z
  .object({
    vehicleId: z.number({ message: 'must be a vehicle id' }).int().positive('must be a vehicle id'),
    inspectionId: z.number({ message: 'must be an inspection id' }).int().positive().nullish(),
    performedOn: isoDay,
    odometerKm: odometer,
    summary: z.string({ message: 'is required' }).trim().min(3, 'must be at least 3 characters').max(400, 'must be 400 characters or fewer').refine(...noHiddenChars),
    labourHours: z.number({ message: 'must be a number in h' }).min(0, 'must be 0 h or more').max(200, 'must be at most 200 h'),
    notes: z.string().trim().max(4000).nullish(),
    items: z
      .array(
        z
          .object({
            position,
            component: z.enum(['damper', 'spring'], { message: 'must be damper or spring' }),
            partDescription: z.string({ message: 'is required' }).trim().min(2, 'must be at least 2 characters').max(160).refine(...noHiddenChars),
            partNumber: z.string().trim().max(60, 'must be 60 characters or fewer').refine(...noHiddenChars).nullish(),
            cost: z.number({ message: 'must be a number' }).min(0, 'must be 0 or more').max(1_000_000),
            removalReason: z.enum(REMOVAL_REASONS, { message: `must be one of: ${REMOVAL_REASONS.join(', ')}` }),
          })
          .strict(),
        { message: 'must be a list of parts' },
      )
      .min(1, 'add at least one replaced part')
      .max(24),
  })
  .strict()
  .superRefine((v, ctx) => {
    const seen = new Set<string>();
    v.items.forEach((it, k) => {
      const key = `${it.position}/${it.component}`;
      if (seen.has(key)) ctx.addIssue({ code: 'custom', path: ['items', k, 'position'], message: `the ${it.component} at ${it.position} is listed twice` });
      seen.add(key);
    });
  });

export type ResultsBody = z.input<ReturnType<typeof resultsBody>>;
export type WorkBody = z.input<typeof workBody>;

/** Where a damper's life comes from: the trade's prior, the fit to the fleet's removals, or a test-lane result on it. */
export type LifeSource = 'prior' | 'fleet' | 'test-lane';

/** A fitted damper's predicted state, as the workshop pages and the vehicle page show it. */
export interface CornerState {
  damperId: number;
  position: string;
  axleIndex: number;
  partNumber: string | null;
  installedAt: string;
  kmSinceFitted: number;
  lifeUsedFraction: number;
  /** Predicted present damping [N·s/m]. */
  dampingNsPerM: number;
  nominalNsPerM: number;
  /** 'wear model' (nightly job) or 'km estimate' (no duty computed yet). */
  basis: string;
  state: 'ok' | 'watch' | 'due' | 'past_life';
  thresholdDate: string | null;
  endOfLifeDate: string | null;
  /** P10–P90 range of the end-of-life date from the fitted scatter. */
  endOfLifeP10Date: string | null;
  endOfLifeP90Date: string | null;
  /** Share of life used before the trips on record (opening wear), null before the nightly job. */
  openingShare: number | null;
  /** Median life [km] at the damper's own recent wear rate (or on the rated road before the nightly job). */
  lifeKm: number;
  lifeSource: LifeSource;
}

/** One removal for wear in a back-test: what the life model, trained only on the data before it, predicted. */
export interface BacktestPoint {
  damperId: number;
  vehicleId: number;
  removedAt: string;
  actualKm: number;
  predictedMedianKm: number;
  p10Km: number;
  p90Km: number;
  inside: boolean;
  /** |predicted median − actual| / actual [%]. */
  errorPct: number;
  /** Removals for wear the model had learned from before this one. */
  trainedOn: number;
}

/** A spec's back-test of the life model over its removals for wear. */
export interface Backtest {
  specId: number;
  points: BacktestPoint[];
  /** Median absolute percentage error of the median prediction [%], and share of removals inside P10–P90 (0–1). */
  mdape: number | null;
  insideShare: number | null;
  /** The same under the prior alone, for comparison. */
  prior: { mdape: number | null; insideShare: number | null };
  method: string;
}

/** GET /api/life-backtest: the back-test with the spec's name. */
export interface LifeBacktest extends Backtest {
  specName: string;
}

/** A two-parameter Weibull fit to failures and right-censored units (server/reliability/weibull.ts), in the unit of the lives. */
export interface WeibullFit {
  /** Shape β [1]. */
  shape: number;
  /** Scale η [unit of the lives]: 63.2 % have failed by then. */
  scale: number;
  /** B10 life: 10 % have failed by then [unit of the lives]. */
  b10: number;
  /** Mean life η·Γ(1 + 1/β) [unit of the lives]. */
  mean: number;
  failures: number;
  suspensions: number;
  /** Log-likelihood at the optimum. */
  logLikelihood: number;
  /** Two-sided Fisher-matrix bounds at `level` (null when the information matrix is singular). */
  bounds: { level: number; method: string; shape: [number, number]; scale: [number, number]; b10: [number, number] } | null;
}
