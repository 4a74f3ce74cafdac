/**
 * Our scale for drivers' harsh-ride reports and how an accepted report becomes a roughness
 * estimate. Shared by the server (validation, e-mail, estimate) and shown in the app.
 *
 * Assumption (ours, stated in the app): a driver reports a stretch because it rides worse than
 * expected, so an accepted report estimates the segment's ISO 8608 class as a number of class
 * steps above its current class — 1 for uneven, 2 for harsh, 3 for severe — capped at class H,
 * at the class's geometric-mean Gd(n0). A segment without any roughness yet is taken as class B
 * (an ordinary road). The estimate then counts with half the weight of a survey
 * (server/roads/current-roughness.ts), so one report moves the segment part of the way.
 */
import { ISO8608_CLASSES, gdForClass, type IsoClass } from '../physics/iso8608';

export const SEVERITIES = [
  { level: 1, key: 'uneven', label: 'Uneven', description: 'The van jostles and loose things rattle, but it is no worse than a worn road.', classSteps: 1 },
  { level: 2, key: 'harsh', label: 'Harsh', description: 'Sharp jolts come through the seat; you ease off to get through.', classSteps: 2 },
  { level: 3, key: 'severe', label: 'Severe', description: 'Hard knocks or the suspension hits its stops; not safe at the usual speed.', classSteps: 3 },
] as const;

export const SEVERE_LEVEL = 3;

export const FELT = [
  { key: 'bottoming', label: 'Hit the stops (bottoming out)' },
  { key: 'shaking', label: 'Shaking or juddering' },
  { key: 'potholes', label: 'Potholes' },
  { key: 'knock', label: 'A loud knock or bang' },
  { key: 'pitching', label: 'Rocking front to back' },
  { key: 'sway', label: 'Swaying side to side' },
  { key: 'broken_edge', label: 'Broken road edge' },
  { key: 'load_shift', label: 'Load moved in the back' },
] as const;
export type FeltKey = (typeof FELT)[number]['key'];
export const FELT_KEYS = FELT.map((f) => f.key) as [FeltKey, ...FeltKey[]];

export const severityOf = (level: number) => SEVERITIES.find((s) => s.level === level) ?? SEVERITIES[0];
export const feltLabel = (key: string) => FELT.find((f) => f.key === key)?.label ?? key;

/** The class assumed for a segment with no roughness on record. */
export const DEFAULT_BASE_CLASS: IsoClass = 'B';

/**
 * The roughness an accepted report stands for: `classSteps` above the current class (capped at H).
 * @example reportEstimate('B', 3) // → { isoClass: 'E', gdN0: 4096e-6 }
 */
export function reportEstimate(currentClass: string | null, severity: number): { isoClass: IsoClass; gdN0: number; steps: number } {
  const names = ISO8608_CLASSES.map((c) => c.cls);
  const from = names.indexOf((currentClass ?? DEFAULT_BASE_CLASS) as IsoClass);
  const steps = severityOf(severity).classSteps;
  const isoClass = names[Math.min(names.length - 1, (from < 0 ? names.indexOf(DEFAULT_BASE_CLASS) : from) + steps)];
  return { isoClass, gdN0: gdForClass(isoClass), steps };
}

export const ESTIMATE_RULE_TEXT =
  'An accepted report estimates the segment one ISO 8608 class above its current class for “uneven”, two for “harsh” and three for “severe” (our assumption), and counts half as much as a survey.';
