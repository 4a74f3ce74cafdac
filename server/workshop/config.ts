/**
 * Settings of the workshop area, parsed once from the environment with zod (defaults embedded).
 * Kept here rather than in server/config.ts while that file is being extended by the nightly
 * issue; the keys are listed in the README's workshop section.
 */
import { z } from 'zod';

const schema = z.object({
  FLEET_LIFE_MIN_REMOVALS: z.coerce.number({ message: 'must be a number' }).int().min(2, 'must be at least 2').max(10_000).default(5),
  FLEET_LIFE_CREDIBILITY_K: z.coerce.number({ message: 'must be a number' }).positive('must be above 0').max(10_000).default(10),
  ATTACHMENT_MAX_MB: z.coerce.number({ message: 'must be a number' }).positive().max(100).default(8),
  LANE_FLAG_POINTS: z.coerce.number({ message: 'must be a number' }).positive().max(100).default(15),
});

export interface WorkshopConfig {
  /** Removals of a spec before the fleet's own life is blended in. */
  fleetLifeMinRemovals: number;
  /** Credibility constant k of the blend weight n/(n+k). */
  fleetLifeCredibilityK: number;
  /** Largest photo or printout [bytes]. */
  attachmentMaxBytes: number;
  /** Left–right adhesion difference on one axle that is flagged [percentage points]. */
  laneFlagPoints: number;
}

export function loadWorkshopConfig(env: Record<string, string | undefined> = process.env): WorkshopConfig {
  const cleaned: Record<string, string> = {};
  for (const k of Object.keys(schema.shape)) if (env[k]) cleaned[k] = env[k]!;
  const r = schema.safeParse(cleaned);
  if (!r.success) throw new Error(`Invalid configuration:\n${r.error.issues.map((i) => `  - ${i.path.join('.')}: ${i.message}`).join('\n')}`);
  return {
    fleetLifeMinRemovals: r.data.FLEET_LIFE_MIN_REMOVALS,
    fleetLifeCredibilityK: r.data.FLEET_LIFE_CREDIBILITY_K,
    attachmentMaxBytes: Math.round(r.data.ATTACHMENT_MAX_MB * 1024 * 1024),
    laneFlagPoints: r.data.LANE_FLAG_POINTS,
  };
}
