/**
 * Inspection scheduling rules (pure). One open inspection per vehicle at most. The due date is
 * the earliest of:
 * - prediction: `leadDays` before the first date a damper (or its corner's spring) is predicted
 *   to reach the inspection threshold; a damper already past its predicted end of life makes
 *   the inspection due on its end-of-life date (so it is overdue, not "due today");
 * - follow-up: the date the mechanic set when a corner's verdict was "check again soon";
 * - interval (months): `intervalMonths` after the last done inspection (or commissioning);
 * - interval (km): when the odometer is predicted to be `intervalKm` past the last done
 *   inspection (or 0 km), at the trailing 30-day km/day.
 * While a follow-up is pending, the corners looked at in that inspection are not booked by the
 * prediction rule before the follow-up date, unless the damper's predicted end of life comes
 * before it (then `leadDays` before its end of life).
 * An inspection is created only when that date falls within `horizonDays` (a follow-up is
 * booked whatever its distance); a due date already past is set to today (the inspection cannot
 * have been due before it existed; its reason says by how much the rule was passed), except a
 * damper's passed end of life, which keeps its date. An open inspection made by these rules is
 * moved earlier when a rule now asks for an earlier date, never later; one booked by hand is
 * moved earlier only by the prediction rule, and its reason says from which date and why.
 * Status: `overdue` after the due date, `due` within `dueSoonDays` of it, else `scheduled`.
 * See docs/methods.md, "Scheduling that follows the wear".
 *
 * @module
 */
import { addMonths, parseISO } from 'date-fns';
import type { InspectionTrigger } from '../db/models';
import { daysBetween, plusDays, readableDay } from '../lib/days';
import { formatKm } from '../wear/wear';

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
  /** Day the damper is predicted to reach (or reached) the end of its expected life. */
  endOfLifeDate: string | null;
  springDamage: number;
  springThresholdDate: string | null;
}

/** A follow-up the mechanic asked for at the last done inspection. */
export interface FollowUp {
  /** Day to check again (YYYY-MM-DD). */
  date: string;
  inspectionId: number;
  /** Day of the inspection that asked for it. */
  askedOn: string;
  /** Corners given "check again soon". */
  checkAgain: string[];
  /** Corners looked at in that inspection and kept in service (their damper still fitted). */
  looked: string[];
}

export interface VehicleScheduleInput {
  today: string;
  vehicle: { id: number; fleetNumber: string; odometerKm: number; commissionedAt: string | null };
  corners: CornerForecast[];
  lastDone: { date: string; odometerKm: number | null } | null;
  /** Trailing 30-day distance per day [km/day]. */
  kmPerDay: number;
  open: { id: number; dueDate: string; status: string; trigger: string | null; reason?: string; basis?: Record<string, unknown> | null } | null;
  /** The pending follow-up, if any (none once it was cancelled). */
  followUp?: FollowUp | null;
}

export interface Candidate {
  dueDate: string;
  trigger: InspectionTrigger;
  reason: string;
  basis: Record<string, unknown>;
  /** A damper past its end of life: the date is kept even though it has passed. */
  pastEndOfLife?: boolean;
}

export type ScheduleDecision =
  | { action: 'none'; candidate: Candidate | null }
  | { action: 'create'; candidate: Candidate; status: InspectionStatusOpen }
  | { action: 'move'; id: number; candidate: Candidate; status: InspectionStatusOpen };

export type InspectionStatusOpen = 'scheduled' | 'due' | 'overdue';

const pct = (x: number) => `${Math.round(x * 100)} %`;
const km = formatKm;
const fmtDay = readableDay;
const lowerFirst = (s: string) => s.charAt(0).toLowerCase() + s.slice(1);

/** Status of an open inspection on `today`. */
export function openStatus(dueDate: string, today: string, dueSoonDays: number): InspectionStatusOpen {
  if (dueDate < today) return 'overdue';
  if (daysBetween(today, dueDate) <= dueSoonDays) return 'due';
  return 'scheduled';
}

/** The prediction rule's candidate for each corner (damper past end of life, damper or spring threshold), unsorted. */
function predictionCandidates(input: VehicleScheduleInput, rules: ScheduleRules): Candidate[] {
  const { today } = input;
  const out: Candidate[] = [];
  const follow = input.followUp ?? null;
  const drives = `the vehicle drove ${Math.round(input.kmPerDay)} km/day over the last 30 days`;
  for (const c of input.corners) {
    const held = follow !== null && follow.looked.includes(c.position);
    const common = { corner: c.position, threshold: rules.threshold, leadDays: rules.leadDays, kmPerDay: Math.round(input.kmPerDay * 10) / 10 };
    const eol = c.endOfLifeDate;
    if (eol && eol < today) {
      // past its end of life: overdue since that day, whatever a follow-up said
      out.push({
        dueDate: eol,
        trigger: 'prediction',
        pastEndOfLife: true,
        reason: `The ${c.position} damper passed the end of its expected life on ${fmtDay(eol)} (${pct(c.lifeUsedFraction)} of its expected life used now): overdue since then.`,
        basis: { rule: 'prediction', component: 'damper', endOfLifeDate: eol, lifeUsed: c.lifeUsedFraction, ...common },
      });
      continue;
    }
    if (c.thresholdDate) {
      const th = c.thresholdDate;
      let due = plusDays(th, -rules.leadDays);
      const passed = th <= today;
      let reason = `The ${c.position} damper ${passed ? 'reached' : 'is predicted to reach'} ${pct(rules.threshold)} of its expected life on ${fmtDay(th)} (${pct(c.lifeUsedFraction)} used now; ${drives}); inspection set ${rules.leadDays} days ahead.`;
      let skip = false;
      if (held && due < follow.date) {
        if (eol && eol < follow.date) {
          due = plusDays(eol, -rules.leadDays);
          reason = `The ${c.position} damper is predicted to reach the end of its expected life on ${fmtDay(eol)} (${pct(c.lifeUsedFraction)} used now; ${drives}), before the follow-up the mechanic set for ${fmtDay(follow.date)}; inspection set ${rules.leadDays} days ahead.`;
        } else skip = true; // the follow-up looks at it first
      }
      if (!skip) out.push({ dueDate: due, trigger: 'prediction', reason, basis: { rule: 'prediction', component: 'damper', thresholdDate: th, endOfLifeDate: eol, lifeUsed: c.lifeUsedFraction, ...common } });
    }
    if (c.springThresholdDate && !(held && plusDays(c.springThresholdDate, -rules.leadDays) < follow.date)) {
      const th = c.springThresholdDate;
      const passed = th <= today;
      out.push({
        dueDate: plusDays(th, -rules.leadDays),
        trigger: 'prediction',
        reason: `The ${c.position} spring ${passed ? 'reached' : 'is predicted to reach'} ${pct(rules.threshold)} of its expected fatigue life on ${fmtDay(th)} (${pct(c.springDamage)} used now; ${drives}); inspection set ${rules.leadDays} days ahead.`,
        basis: { rule: 'prediction', component: 'spring', thresholdDate: th, lifeUsed: c.springDamage, ...common },
      });
    }
  }
  return out;
}

/** The date a candidate is booked for on `today`: a passed date is today, except a passed end of life. */
const bookedDate = (c: Candidate, today: string) => (c.pastEndOfLife || c.dueDate >= today ? c.dueDate : today);
const byDate = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);
/** Earliest booked date first, then earliest rule date. */
const earliestFirst = (today: string) => (a: Candidate, b: Candidate) => byDate(bookedDate(a, today), bookedDate(b, today)) || byDate(a.dueDate, b.dueDate);

/** Each rule's candidate date for a vehicle (the prediction rule's earliest corner only), earliest booked date first. */
export function candidates(input: VehicleScheduleInput, rules: ScheduleRules): Candidate[] {
  const { today } = input;
  const out: Candidate[] = [];
  const pred = predictionCandidates(input, rules).sort(earliestFirst(today));
  if (pred.length) out.push(pred[0]);
  const follow = input.followUp;
  if (follow) {
    const which = follow.checkAgain.length ? follow.checkAgain.join(', ') : 'the vehicle';
    out.push({
      dueDate: follow.date,
      trigger: 'follow_up',
      reason: `Follow-up: at the inspection on ${fmtDay(follow.askedOn)} the mechanic asked to check ${which} again by ${fmtDay(follow.date)}.`,
      basis: { rule: 'follow_up', followUpOn: follow.date, fromInspectionId: follow.inspectionId, askedOn: follow.askedOn, checkAgain: follow.checkAgain, looked: follow.looked },
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
  return out.sort(earliestFirst(today));
}

/** What to do for one vehicle today. Deterministic: the same input gives the same decision. */
export function decide(input: VehicleScheduleInput, rules: ScheduleRules): ScheduleDecision {
  const { today } = input;
  const all = candidates(input, rules);
  const settle = (best: Candidate): Candidate => {
    const dueDate = bookedDate(best, today);
    const late = dueDate > best.dueDate ? daysBetween(best.dueDate, today) : 0;
    return {
      ...best,
      dueDate,
      reason: late > 0 ? `${best.reason} Rule date ${fmtDay(best.dueDate)} passed ${late} day${late === 1 ? '' : 's'} ago: due now.` : best.reason,
      basis: { ...best.basis, ruleDueDate: best.dueDate, createdOn: today },
    };
  };
  const best = all[0] ? settle(all[0]) : null;
  if (!best) return { action: 'none', candidate: null };
  const open = input.open;
  if (open) {
    if (open.trigger === null) return { action: 'none', candidate: best }; // entered before the rules existed: left alone
    // one booked by hand is moved only by the prediction rule: the manager chose its date
    const mover = open.trigger === 'manual' ? all.find((c) => c.trigger === 'prediction') : all[0];
    const c = mover ? settle(mover) : null;
    if (c && c.dueDate < open.dueDate) {
      const handReason = open.trigger === 'manual' ? String(open.basis?.handReason ?? open.reason ?? '') : '';
      const moved: Candidate = {
        ...c,
        trigger: open.trigger === 'manual' ? 'manual' : c.trigger,
        reason: `Moved earlier from ${fmtDay(open.dueDate)}: ${lowerFirst(c.reason)}${handReason ? ` Reason when booked by hand: ${handReason}` : ''}`,
        basis: { ...c.basis, movedFrom: open.dueDate, ...(open.trigger === 'manual' ? { handReason } : {}) },
      };
      return { action: 'move', id: open.id, candidate: moved, status: openStatus(moved.dueDate, today, rules.dueSoonDays) };
    }
    return { action: 'none', candidate: best };
  }
  if (best.trigger !== 'follow_up' && daysBetween(today, best.dueDate) > rules.horizonDays) return { action: 'none', candidate: best };
  return { action: 'create', candidate: best, status: openStatus(best.dueDate, today, rules.dueSoonDays) };
}
