/**
 * Inspection scheduling rules (pure). One open inspection per vehicle at most. The due date is
 * the earliest of:
 * - prediction: `leadDays` before the first date a damper (or its corner's spring) is predicted
 *   to reach the inspection threshold;
 * - interval (months): `intervalMonths` after the last done inspection (or commissioning);
 * - interval (km): when the odometer is predicted to be `intervalKm` past the last done
 *   inspection (or 0 km), at the trailing 30-day km/day.
 * An inspection is created only when that date falls within `horizonDays`; a due date already
 * past is set to today (the inspection cannot have been due before it existed; its reason says
 * by how much the rule was passed). An open inspection made by these rules is moved earlier
 * when a rule now asks for an earlier date, never later; one entered by hand is left alone.
 * Status: `overdue` after the due date, `due` within `dueSoonDays` of it, else `scheduled`.
 *
 * @module
 */
import { addMonths, parseISO } from 'date-fns';
import type { InspectionTrigger } from '../db/nightly-models';
import { daysBetween, formatKm, plusDays } from './wear';

export interface ScheduleRules {
  /** Inspection threshold as a fraction of life [1]. */
  threshold: number;
  leadDays: number;
  intervalKm: number;
  intervalMonths: number;
  dueSoonDays: number;
  horizonDays: number;
}

export interface CornerForecast {
  position: string;
  lifeUsedFraction: number;
  thresholdDate: string | null;
  /** Distance per day over the prediction window [km/day]. */
  kmPerDay: number;
  springDamage: number;
  springThresholdDate: string | null;
}

export interface VehicleScheduleInput {
  today: string;
  vehicle: { id: number; fleetNumber: string; odometerKm: number; commissionedAt: string | null };
  corners: CornerForecast[];
  lastDone: { date: string; odometerKm: number | null } | null;
  /** Trailing 30-day distance per day [km/day]. */
  kmPerDay: number;
  open: { id: number; dueDate: string; status: string; trigger: string | null } | null;
}

export interface Candidate {
  dueDate: string;
  trigger: InspectionTrigger;
  reason: string;
  basis: Record<string, unknown>;
}

export type ScheduleDecision =
  | { action: 'none'; candidate: Candidate | null }
  | { action: 'create'; candidate: Candidate; status: InspectionStatusOpen }
  | { action: 'move'; id: number; candidate: Candidate; status: InspectionStatusOpen };

export type InspectionStatusOpen = 'scheduled' | 'due' | 'overdue';

const pct = (x: number) => `${Math.round(x * 100)} %`;
const km = formatKm;
const fmtDay = (s: string) => s;

/** Status of an open inspection on `today`. */
export function openStatus(dueDate: string, today: string, dueSoonDays: number): InspectionStatusOpen {
  if (dueDate < today) return 'overdue';
  if (daysBetween(today, dueDate) <= dueSoonDays) return 'due';
  return 'scheduled';
}

/** Each rule's candidate date for a vehicle, earliest first. */
export function candidates(input: VehicleScheduleInput, rules: ScheduleRules): Candidate[] {
  const out: Candidate[] = [];
  const { today } = input;
  // prediction
  let first: { date: string; what: string; c: CornerForecast; spring: boolean } | null = null;
  for (const c of input.corners) {
    if (c.thresholdDate && (!first || c.thresholdDate < first.date)) first = { date: c.thresholdDate, what: `${c.position} damper`, c, spring: false };
    if (c.springThresholdDate && (!first || c.springThresholdDate < first.date)) first = { date: c.springThresholdDate, what: `${c.position} spring`, c, spring: true };
  }
  if (first) {
    const due = plusDays(first.date, -rules.leadDays);
    const passed = first.date <= today;
    const used = first.spring ? first.c.springDamage : first.c.lifeUsedFraction;
    const reason = first.spring
      ? `${first.what} ${passed ? 'reached' : 'predicted to reach'} ${pct(rules.threshold)} of its assumed fatigue life ${passed ? 'on' : 'on'} ${fmtDay(first.date)} (Miner damage now ${used.toFixed(2)}); inspection set ${rules.leadDays} days ahead.`
      : `${first.what} ${passed ? 'reached' : 'predicted to reach'} ${pct(rules.threshold)} of its expected life on ${fmtDay(first.date)} (now ${pct(used)} used, driving ${Math.round(first.c.kmPerDay)} km/day over the last 30 days); inspection set ${rules.leadDays} days ahead.`;
    out.push({
      dueDate: due,
      trigger: 'prediction',
      reason,
      basis: { rule: 'prediction', corner: first.c.position, component: first.spring ? 'spring' : 'damper', thresholdDate: first.date, threshold: rules.threshold, leadDays: rules.leadDays, lifeUsed: used, kmPerDay: first.c.kmPerDay },
    });
  }
  // interval (months)
  const since = input.lastDone?.date ?? input.vehicle.commissionedAt;
  if (since) {
    const due = addMonths(parseISO(`${since}T00:00:00Z`), rules.intervalMonths).toISOString().slice(0, 10);
    const ago = daysBetween(since, today);
    const what = input.lastDone ? `the last inspection on ${fmtDay(since)}` : `commissioning on ${fmtDay(since)} (no inspection on record)`;
    out.push({
      dueDate: due,
      trigger: 'interval_months',
      reason: `Interval rule: ${rules.intervalMonths} months since ${what}; ${(ago / 30.44).toFixed(1)} months have passed.`,
      basis: { rule: 'interval_months', since, intervalMonths: rules.intervalMonths, monthsPassed: Math.round((ago / 30.44) * 10) / 10 },
    });
  }
  // interval (km)
  const fromKm = input.lastDone ? input.lastDone.odometerKm : 0;
  if (fromKm !== null) {
    const driven = input.vehicle.odometerKm - fromKm;
    const left = rules.intervalKm - driven;
    let due: string | null = null;
    if (left <= 0) due = today;
    else if (input.kmPerDay > 0) due = plusDays(today, Math.ceil(left / input.kmPerDay));
    if (due) {
      const what = input.lastDone ? `the last inspection at ${km(fromKm)}` : 'new (no inspection on record)';
      out.push({
        dueDate: due,
        trigger: 'interval_km',
        reason:
          left <= 0
            ? `Interval rule: ${km(rules.intervalKm)} since ${what}; ${km(driven)} driven.`
            : `Interval rule: ${km(rules.intervalKm)} since ${what}; ${km(driven)} driven, ${km(left)} to go at ${Math.round(input.kmPerDay)} km/day.`,
        basis: { rule: 'interval_km', fromKm, intervalKm: rules.intervalKm, drivenKm: Math.round(driven), kmPerDay: Math.round(input.kmPerDay * 10) / 10 },
      });
    }
  }
  return out.sort((a, b) => (a.dueDate < b.dueDate ? -1 : a.dueDate > b.dueDate ? 1 : 0));
}

/** What to do for one vehicle today. Deterministic: the same input gives the same decision. */
export function decide(input: VehicleScheduleInput, rules: ScheduleRules): ScheduleDecision {
  const all = candidates(input, rules);
  const best = all[0] ?? null;
  if (!best) return { action: 'none', candidate: null };
  const { today } = input;
  const late = best.dueDate < today ? daysBetween(best.dueDate, today) : 0;
  const dueDate = late > 0 ? today : best.dueDate;
  const candidate: Candidate = {
    ...best,
    dueDate,
    reason: late > 0 ? `${best.reason} Rule date ${best.dueDate} passed ${late} day${late === 1 ? '' : 's'} ago: due now.` : best.reason,
    basis: { ...best.basis, ruleDueDate: best.dueDate, createdOn: today },
  };
  if (input.open) {
    const movable = input.open.trigger !== null && input.open.trigger !== 'manual';
    if (movable && dueDate < input.open.dueDate) {
      return { action: 'move', id: input.open.id, candidate, status: openStatus(dueDate, today, rules.dueSoonDays) };
    }
    return { action: 'none', candidate };
  }
  if (daysBetween(today, dueDate) > rules.horizonDays) return { action: 'none', candidate };
  return { action: 'create', candidate, status: openStatus(dueDate, today, rules.dueSoonDays) };
}
