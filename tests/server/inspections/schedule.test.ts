// The inspection scheduling rules (server/inspections/schedule.ts) deciding one vehicle's inspection: the
// damper threshold and the interval rules, a damper past its end of life, an inspection booked by hand, the
// mechanic's follow-up and moving an open inspection earlier. What each rule's date records, the wording
// on the day a date is reached and the interval rules' edges are in schedule-basis.test.ts.
import { describe, expect, it } from 'vitest';
import { candidates, decide, openStatus, type VehicleScheduleInput } from '../../../server/inspections/schedule';
import { base, corner, rules } from './schedule-input';

describe('inspection scheduling rules', () => {
  it('when a damper is predicted to reach the threshold, then the inspection is due the lead time before it, with the reason in words and numbers', () => {
    const d = decide(base({ corners: [corner('FL', '2027-01-20'), corner('RR', '2027-01-10')] }), rules);
    expect(d.action).toBe('create');
    if (d.action !== 'create') return;
    expect(d.candidate.dueDate).toBe('2026-12-27'); // 2027-01-10 − 14 days
    expect(d.candidate.trigger).toBe('prediction');
    expect(d.candidate.reason).toContain('The RR damper is predicted to reach 80 % of its expected life on 10 Jan 2027 (60 % used now; the vehicle drove 100 km/day over the last 30 days)');
    // in a mechanic's words: no energy rate, no "rated" life
    expect(d.candidate.reason).not.toMatch(/kJ|rated/);
    expect(d.status).toBe('scheduled');
  });

  it('when the km interval comes first, then the interval rule sets the date', () => {
    // 20 000 km since the last inspection, 30 000 to go at 100 km/day = 300 days (2027-09-26),
    // later than the months rule (2027-06-01) → the months rule wins
    const months = decide(base(), rules);
    expect(months.candidate?.trigger).toBe('interval_months');
    expect(months.candidate?.dueDate).toBe('2027-06-01');
    // at 1 000 km/day, 30 000 km go in 30 days → 2026-12-30
    const km = decide(base({ kmPerDay: 1000 }), rules);
    expect(km.action).toBe('create');
    expect(km.candidate?.trigger).toBe('interval_km');
    expect(km.candidate?.dueDate).toBe('2026-12-30');
    expect(km.candidate?.reason).toContain('50,000 km since the last inspection at 40,000 km; 20,000 km driven, 30,000 km to go at 1000 km/day');
  });

  it('when the interval rule date is earlier than the prediction, then the interval rule wins', () => {
    const d = decide(base({ lastDone: { date: '2025-12-15', odometerKm: 50000 }, corners: [corner('FL', '2027-03-01')] }), rules);
    expect(d.candidate?.trigger).toBe('interval_months');
    expect(d.candidate?.dueDate).toBe('2026-12-15');
    expect(d.action).toBe('create');
    if (d.action === 'create') expect(d.status).toBe('scheduled');
  });

  it('when the rule date has already passed, then the new inspection is due today and the reason says by how much', () => {
    const d = decide(base({ lastDone: { date: '2025-10-01', odometerKm: 55000 } }), rules);
    expect(d.action).toBe('create');
    if (d.action !== 'create') return;
    expect(d.candidate.dueDate).toBe('2026-11-30');
    expect(d.status).toBe('due');
    expect(d.candidate.reason).toMatch(/Rule date 1 Oct 2026 passed 60 days ago: due now\./);
  });

  it('when the date is beyond the horizon, then nothing is created yet', () => {
    const d = decide(base({ corners: [corner('FL', '2027-12-01')], lastDone: { date: '2026-11-01', odometerKm: 59000 }, kmPerDay: 10 }), rules);
    expect(d.action).toBe('none');
  });

  it('when the vehicle already has an open inspection, then no second one is created (no duplicates)', () => {
    const open = { id: 5, dueDate: '2026-12-20', status: 'scheduled', trigger: 'interval_months' };
    const later = decide(base({ open, corners: [corner('FL', '2027-02-01')] }), rules);
    expect(later.action).toBe('none');
    const same = decide(base({ open: { ...open, dueDate: '2026-12-27' }, corners: [corner('RR', '2027-01-10')] }), rules);
    expect(same.action).toBe('none');
  });

  it('when a rule now asks for an earlier date than the open inspection, then that inspection is moved earlier, never later, and says from which date', () => {
    const open = { id: 5, dueDate: '2027-02-20', status: 'scheduled', trigger: 'interval_months' };
    const d = decide(base({ open, corners: [corner('RR', '2027-01-10')] }), rules);
    expect(d).toMatchObject({ action: 'move', id: 5, candidate: { dueDate: '2026-12-27', trigger: 'prediction' } });
    expect(d.candidate?.reason).toMatch(/^Moved earlier from 20 Feb 2027: the RR damper is predicted to reach 80 %/);
    const legacy = decide(base({ open: { ...open, trigger: null }, corners: [corner('RR', '2027-01-10')] }), rules);
    expect(legacy.action).toBe('none');
  });

  it('when the same input is decided twice, then the decision is the same (deterministic)', () => {
    const input = base({ corners: [corner('FL', '2027-01-20', '2027-01-05')] });
    expect(decide(input, rules)).toEqual(decide(input, rules));
    expect(decide(input, rules).candidate?.reason).toContain('The FL spring is predicted to reach 80 % of its expected fatigue life on 5 Jan 2027');
  });

  it('when the due date has passed, then the inspection is overdue; within the due-soon window it is due; otherwise scheduled', () => {
    expect(openStatus('2026-11-29', '2026-11-30', 7)).toBe('overdue');
    expect(openStatus('2026-11-30', '2026-11-30', 7)).toBe('due');
    expect(openStatus('2026-12-07', '2026-11-30', 7)).toBe('due');
    expect(openStatus('2026-12-08', '2026-11-30', 7)).toBe('scheduled');
  });

  it('when a vehicle was never inspected, then the interval runs from commissioning and 0 km', () => {
    const d = decide(base({ lastDone: null, vehicle: { id: 1, fleetNumber: 'CV-101', odometerKm: 20000, commissionedAt: '2026-03-01' }, kmPerDay: 50 }), rules);
    expect(d.candidate?.trigger).toBe('interval_months');
    expect(d.candidate?.dueDate).toBe('2027-03-01');
    expect(d.candidate?.reason).toContain('commissioning on 1 Mar 2026 (no inspection on record)');
  });
});

// Stated rules (README "Scheduling rules", docs/methods.md "Scheduling that follows the wear");
// the dates below are computed by hand from them.

describe('a damper past its end of life', () => {
  it('when a damper passed its predicted end of life, then the inspection is overdue from that day (not due today), and the reason says when it passed (stated rule)', () => {
    const d = decide(base({ corners: [corner('FL', '2026-09-01', null, '2026-11-10', 1.04), corner('RR', '2027-01-10')] }), rules);
    expect(d.action).toBe('create');
    if (d.action !== 'create') return;
    expect(d.candidate.dueDate).toBe('2026-11-10');
    expect(d.status).toBe('overdue');
    expect(d.candidate.trigger).toBe('prediction');
    expect(d.candidate.reason).toBe('The FL damper passed the end of its expected life on 10 Nov 2026 (104 % of its expected life used now): overdue since then.');
    expect(d.candidate.reason).not.toContain('due now');
  });

  it('when an interval rule passed even longer ago, then the damper past its end of life still sets the date: the inspection is overdue, not due today (stated rule)', () => {
    // months rule: 2025-06-01 + 12 months = 2026-06-01, passed; booked today if it stood alone
    const d = decide(base({ lastDone: { date: '2025-06-01', odometerKm: 55000 }, corners: [corner('RL', '2026-08-01', null, '2026-11-20', 1.01)] }), rules);
    expect(d).toMatchObject({ action: 'create', status: 'overdue', candidate: { dueDate: '2026-11-20', trigger: 'prediction' } });
  });

  it('when the open inspection is due later, then it is moved to the end-of-life date and becomes overdue (stated rule)', () => {
    const open = { id: 9, dueDate: '2026-12-15', status: 'scheduled', trigger: 'interval_months' };
    const d = decide(base({ open, corners: [corner('FR', '2026-10-01', null, '2026-11-25', 1.01)] }), rules);
    expect(d).toMatchObject({ action: 'move', id: 9, status: 'overdue', candidate: { dueDate: '2026-11-25' } });
    expect(d.candidate?.reason).toBe('Moved earlier from 15 Dec 2026: the FR damper passed the end of its expected life on 25 Nov 2026 (101 % of its expected life used now): overdue since then.');
  });

  it('when the end of life is today, then it is due today, not overdue (stated rule)', () => {
    const d = decide(base({ corners: [corner('FL', '2026-10-01', null, '2026-11-30', 1)] }), rules);
    expect(d).toMatchObject({ action: 'create', status: 'due', candidate: { dueDate: '2026-11-30' } });
  });
});

describe('an inspection booked by hand', () => {
  const manual = { id: 7, dueDate: '2027-03-01', status: 'scheduled', trigger: 'manual', reason: 'Driver reports a knock at the front.', basis: null };

  it('when a damper threshold date less the lead days comes before it, then it is moved earlier and its reason says from when and why, keeping the manager\'s own reason (stated rule)', () => {
    const d = decide(base({ open: manual, corners: [corner('FL', '2027-01-10', null, '2027-04-01', 0.7)] }), rules);
    expect(d.action).toBe('move');
    if (d.action !== 'move') return;
    expect(d.id).toBe(7);
    expect(d.candidate.dueDate).toBe('2026-12-27'); // 2027-01-10 − 14 days
    expect(d.candidate.trigger).toBe('manual');
    expect(d.status).toBe('scheduled');
    expect(d.candidate.reason).toBe(
      'Moved earlier from 1 Mar 2027: the FL damper is predicted to reach 80 % of its expected life on 10 Jan 2027 (70 % used now; the vehicle drove 100 km/day over the last 30 days); inspection set 14 days ahead. Reason when booked by hand: Driver reports a knock at the front.',
    );
    // moved again on a later night: the manager's reason is kept once, not nested
    const again = decide(base({ open: { ...manual, dueDate: d.candidate.dueDate, reason: d.candidate.reason, basis: d.candidate.basis }, corners: [corner('FL', '2027-01-01', null, '2027-03-20', 0.72)] }), rules);
    expect(again.action).toBe('move');
    expect(again.candidate?.dueDate).toBe('2026-12-18');
    expect(again.candidate?.reason.match(/Reason when booked by hand/g)).toHaveLength(1);
    expect(again.candidate?.reason).toMatch(/^Moved earlier from 27 Dec 2026: .* Reason when booked by hand: Driver reports a knock at the front\.$/);
  });

  it('when the prediction asks for a later date, then it is never moved later (stated rule)', () => {
    const d = decide(base({ open: { ...manual, dueDate: '2026-12-05' }, corners: [corner('FL', '2027-01-10')] }), rules);
    expect(d.action).toBe('none');
  });

  it('when only an interval rule comes before it, then the date the manager chose stands (stated rule)', () => {
    // months rule: 2026-01-15 + 12 months = 2027-01-15, before 2027-03-01
    const d = decide(base({ open: manual, lastDone: { date: '2026-01-15', odometerKm: 58000 } }), rules);
    expect(d.candidate?.trigger).toBe('interval_months');
    expect(d.action).toBe('none');
  });

  it('when a damper is past its end of life, then the hand-booked inspection is moved to that day and is overdue (stated rule)', () => {
    const d = decide(base({ open: manual, corners: [corner('RR', '2026-10-01', null, '2026-11-28', 1.01)] }), rules);
    expect(d).toMatchObject({ action: 'move', status: 'overdue', candidate: { dueDate: '2026-11-28', trigger: 'manual' } });
  });
});

describe('the mechanic\'s follow-up', () => {
  const followUp = { date: '2026-12-20', inspectionId: 3, askedOn: '2026-11-20', checkAgain: ['FL'], looked: ['FL', 'FR', 'RL', 'RR'] };
  const lastDone = { date: '2026-11-20', odometerKm: 59000 };

  it('when a corner was given "check again soon", then the follow-up is booked for the mechanic\'s date instead of today, though its threshold date has passed (stated rule)', () => {
    const d = decide(base({ lastDone, followUp, corners: [corner('FL', '2026-10-01', null, '2027-02-01', 0.86)] }), rules);
    expect(d.action).toBe('create');
    if (d.action !== 'create') return;
    expect(d.candidate.trigger).toBe('follow_up');
    expect(d.candidate.dueDate).toBe('2026-12-20');
    expect(d.status).toBe('scheduled');
    expect(d.candidate.reason).toBe('Follow-up: at the inspection on 20 Nov 2026 the mechanic asked to check FL again by 20 Dec 2026.');
    // without the follow-up the same corner is booked today
    const without = decide(base({ lastDone, corners: [corner('FL', '2026-10-01', null, '2027-02-01', 0.86)] }), rules);
    expect(without).toMatchObject({ action: 'create', status: 'due', candidate: { dueDate: '2026-11-30', trigger: 'prediction' } });
  });

  it('when the damper\'s end of life comes before the follow-up, then it is booked the lead days before its end of life, and says so (stated rule)', () => {
    // end of life 2026-12-18, before the follow-up on 2026-12-20: booked 2026-12-18 − 14 days = 2026-12-04
    const d = decide(base({ lastDone, followUp, corners: [corner('FL', '2026-10-01', null, '2026-12-18', 0.9)] }), rules);
    expect(d).toMatchObject({ action: 'create', status: 'due', candidate: { dueDate: '2026-12-04', trigger: 'prediction' } });
    expect(d.candidate?.reason).toContain('predicted to reach the end of its expected life on 18 Dec 2026');
    expect(d.candidate?.reason).toContain('before the follow-up the mechanic set for 20 Dec 2026');
    // an end of life after the follow-up leaves the follow-up to look at it
    const after = decide(base({ lastDone, followUp, corners: [corner('FL', '2026-10-01', null, '2026-12-28', 0.9)] }), rules);
    expect(after.candidate).toMatchObject({ dueDate: '2026-12-20', trigger: 'follow_up' });
  });

  it('when the follow-up inspection is open, then the prediction rule does not move it earlier for a corner looked at, but does for one not looked at (stated rule)', () => {
    const open = { id: 11, dueDate: '2026-12-20', status: 'scheduled', trigger: 'follow_up' };
    const held = decide(base({ lastDone, followUp, open, corners: [corner('RR', '2026-12-01', null, '2027-03-01')] }), rules);
    expect(held.action).toBe('none');
    const notLooked = decide(base({ lastDone, followUp: { ...followUp, looked: ['FL', 'FR'] }, open, corners: [corner('RR', '2026-12-20', null, '2027-03-01')] }), rules);
    expect(notLooked).toMatchObject({ action: 'move', candidate: { dueDate: '2026-12-06', trigger: 'prediction' } });
  });

  it('when the follow-up date is beyond the booking horizon, then it is booked all the same (stated rule)', () => {
    const d = decide(base({ lastDone, followUp: { ...followUp, date: '2027-06-01' } }), rules);
    expect(d).toMatchObject({ action: 'create', status: 'scheduled', candidate: { dueDate: '2027-06-01', trigger: 'follow_up' } });
  });
});

// What each candidate stores with it: the figures the reason was computed from, kept with the
// inspection so that a later reader (or a re-run) can see why it was booked for that day.

describe('moving an open inspection earlier', () => {
  it('when an inspection the rules booked is moved by an interval rule, then the reason and basis say from which date, with no reason "booked by hand"', () => {
    // months rule 2026-01-15 + 12 months = 2027-01-15, before the open one's 2027-03-01; 319 days = 10.5 months passed
    const open = { id: 4, dueDate: '2027-03-01', status: 'scheduled', trigger: 'interval_km', reason: 'Interval rule: 50,000 km since the last inspection at 58,000 km.', basis: null };
    const d = decide(base({ open, lastDone: { date: '2026-01-15', odometerKm: 58000 } }), rules);
    expect(d).toMatchObject({ action: 'move', id: 4, status: 'scheduled', candidate: { dueDate: '2027-01-15', trigger: 'interval_months' } });
    expect(d.candidate?.reason).toBe('Moved earlier from 1 Mar 2027: interval rule: 12 months since the last inspection on 15 Jan 2026; 10.5 months have passed.');
    expect(d.candidate?.basis).toEqual({ rule: 'interval_months', since: '2026-01-15', intervalMonths: 12, monthsPassed: 10.5, ruleDueDate: '2027-01-15', createdOn: '2026-11-30', movedFrom: '2027-03-01' });
  });

  it('when a hand-booked inspection is moved, then its basis keeps the manager\'s reason and the date it was moved from', () => {
    const manual = { id: 7, dueDate: '2027-03-01', status: 'scheduled', trigger: 'manual', reason: 'Driver reports a knock at the front.', basis: null };
    const d = decide(base({ open: manual, corners: [corner('FL', '2027-01-10')] }), rules);
    expect(d.candidate?.basis).toMatchObject({ rule: 'prediction', movedFrom: '2027-03-01', handReason: 'Driver reports a knock at the front.' });
  });

  it('when a hand-booked inspection without a reason is moved, then the reason is the rule\'s alone', () => {
    const manual = { id: 7, dueDate: '2027-03-01', status: 'scheduled', trigger: 'manual', basis: null };
    const d = decide(base({ open: manual, corners: [corner('FL', '2027-01-10')] }), rules);
    expect(d.candidate?.reason).toBe(
      'Moved earlier from 1 Mar 2027: the FL damper is predicted to reach 80 % of its expected life on 10 Jan 2027 (60 % used now; the vehicle drove 100 km/day over the last 30 days); inspection set 14 days ahead.',
    );
  });

  it('when an interval rule and a damper both come before a hand-booked inspection, then it is moved to the damper\'s date, not the earlier interval date', () => {
    // months rule 2027-01-15; damper threshold 2027-02-15 − 14 days = 2027-02-01
    const manual = { id: 7, dueDate: '2027-03-01', status: 'scheduled', trigger: 'manual', reason: 'Knock at the front.', basis: null };
    const d = decide(base({ open: manual, lastDone: { date: '2026-01-15', odometerKm: 58000 }, corners: [corner('FL', '2027-02-15')] }), rules);
    expect(d).toMatchObject({ action: 'move', id: 7, candidate: { dueDate: '2027-02-01', trigger: 'manual', basis: { rule: 'prediction' } } });
  });
});

describe('the follow-up and the corners it looks at', () => {
  const lastDone = { date: '2026-11-20', odometerKm: 59000 };
  const followUp = { date: '2026-12-20', inspectionId: 3, askedOn: '2026-11-20', checkAgain: ['FL'], looked: ['FL', 'FR', 'RL', 'RR'] };
  const triggers = (input: VehicleScheduleInput) => candidates(input, rules).map((c) => `${c.trigger} ${c.dueDate}`);

  it('when a corner looked at is due by its threshold after the follow-up, or on its day, then the prediction rule still gives its date', () => {
    // 2027-01-20 − 14 days = 2027-01-06; 2027-01-03 − 14 days = 2026-12-20, the follow-up's day
    expect(triggers(base({ lastDone, followUp, corners: [corner('FL', '2027-01-20')] }))).toContain('prediction 2027-01-06');
    expect(triggers(base({ lastDone, followUp, corners: [corner('FL', '2027-01-03')] }))).toContain('prediction 2026-12-20');
  });

  it('when a looked-at damper\'s end of life is on the follow-up\'s day, then the follow-up looks at it (no earlier booking)', () => {
    const all = triggers(base({ lastDone, followUp, corners: [corner('FL', '2026-10-01', null, '2026-12-20', 0.9)] }));
    expect(all[0]).toBe('follow_up 2026-12-20');
    expect(all.some((t) => t.startsWith('prediction'))).toBe(false);
  });

  it('when a looked-at corner\'s spring is due before the follow-up, then the follow-up looks at it; on or after its day, the spring keeps its date', () => {
    // spring 2026-12-25 − 14 days = 2026-12-11, before 2026-12-20
    const before = triggers(base({ lastDone, followUp, corners: [corner('FL', null, '2026-12-25')] }));
    expect(before[0]).toBe('follow_up 2026-12-20');
    expect(before.some((t) => t.startsWith('prediction'))).toBe(false);
    // spring 2027-01-03 − 14 days = 2026-12-20, the follow-up's day
    expect(triggers(base({ lastDone, followUp, corners: [corner('FL', null, '2027-01-03')] }))).toContain('prediction 2026-12-20');
    // a corner not looked at is booked by its spring as usual
    expect(triggers(base({ lastDone, followUp: { ...followUp, looked: ['FR'] }, corners: [corner('FL', null, '2026-12-25')] }))[0]).toBe('prediction 2026-12-11');
  });

  it('when several corners were given "check again soon", then the reason names them all', () => {
    const d = decide(base({ lastDone, followUp: { ...followUp, checkAgain: ['FL', 'RR'] } }), rules);
    expect(d.candidate?.reason).toBe('Follow-up: at the inspection on 20 Nov 2026 the mechanic asked to check FL, RR again by 20 Dec 2026.');
  });

  it('when the mechanic asked to check again without naming a corner, then the reason says "the vehicle"', () => {
    const d = decide(base({ lastDone, followUp: { ...followUp, checkAgain: [] } }), rules);
    expect(d.candidate?.reason).toBe('Follow-up: at the inspection on 20 Nov 2026 the mechanic asked to check the vehicle again by 20 Dec 2026.');
  });
});
