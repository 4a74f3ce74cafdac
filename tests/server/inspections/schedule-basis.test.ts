// What the inspection scheduling rules (server/inspections/schedule.ts) record with each date they give: the
// basis stored with it, the wording on the day a date is reached, the choice among several rule dates and
// the interval rules' edge cases. The rules' choice of date is in schedule.test.ts.
import { describe, expect, it } from 'vitest';
import { candidates, decide } from '../../../server/inspections/schedule';
import { base, corner, rules } from './schedule-input';

describe('the basis stored with each rule\'s date', () => {
  it('when a damper threshold sets the date, then the basis holds the corner, its dates, the life used and the km/day to 0.1', () => {
    const d = decide(base({ kmPerDay: 123.456, corners: [corner('RR', '2027-01-10', null, '2027-04-01', 0.6)] }), rules);
    expect(d.candidate?.reason).toContain('the vehicle drove 123 km/day over the last 30 days');
    expect(d.candidate?.basis).toEqual({
      rule: 'prediction',
      component: 'damper',
      corner: 'RR',
      thresholdDate: '2027-01-10',
      endOfLifeDate: '2027-04-01',
      lifeUsed: 0.6,
      threshold: 0.8,
      leadDays: 14,
      kmPerDay: 123.5,
      ruleDueDate: '2026-12-27',
      createdOn: '2026-11-30',
    });
  });

  it('when a damper is past its end of life, then the basis holds its end-of-life date and no threshold date', () => {
    const d = decide(base({ corners: [corner('FL', '2026-09-01', null, '2026-11-10', 1.04)] }), rules);
    expect(d.candidate?.pastEndOfLife).toBe(true);
    expect(d.candidate?.basis).toEqual({
      rule: 'prediction',
      component: 'damper',
      corner: 'FL',
      endOfLifeDate: '2026-11-10',
      lifeUsed: 1.04,
      threshold: 0.8,
      leadDays: 14,
      kmPerDay: 100,
      ruleDueDate: '2026-11-10',
      createdOn: '2026-11-30',
    });
  });

  it('when only a spring has a threshold date, then the spring sets the date by the prediction rule and its basis names the spring and its fatigue damage', () => {
    const d = decide(base({ corners: [corner('FL', null, '2027-01-05')] }), rules);
    expect(d).toMatchObject({ action: 'create', candidate: { dueDate: '2026-12-22', trigger: 'prediction' } });
    expect(d.candidate?.basis).toEqual({
      rule: 'prediction',
      component: 'spring',
      corner: 'FL',
      thresholdDate: '2027-01-05',
      lifeUsed: 0.01,
      threshold: 0.8,
      leadDays: 14,
      kmPerDay: 100,
      ruleDueDate: '2026-12-22',
      createdOn: '2026-11-30',
    });
  });

  it('when a corner has neither a damper nor a spring threshold date, then the prediction rule gives no date for it', () => {
    const all = candidates(base({ corners: [corner('FL', null)] }), rules);
    expect(all.map((c) => c.trigger)).toEqual(['interval_months', 'interval_km']);
  });

  it('when the months interval sets the date, then the reason and the basis give the months passed to 0.1', () => {
    // 2026-06-15 to 2026-11-30 is 168 days = 5.52 months of 30.44 days
    const d = decide(base({ lastDone: { date: '2026-06-15', odometerKm: 40000 } }), rules);
    expect(d.candidate?.reason).toBe('Interval rule: 12 months since the last inspection on 15 Jun 2026; 5.5 months have passed.');
    expect(d.candidate?.basis).toEqual({ rule: 'interval_months', since: '2026-06-15', intervalMonths: 12, monthsPassed: 5.5, ruleDueDate: '2027-06-15', createdOn: '2026-11-30' });
  });

  it('when the km interval is computed, then its basis holds the odometer at the last inspection, the km driven and the km/day to 0.1', () => {
    const km = candidates(base({ kmPerDay: 123.456 }), rules).find((c) => c.trigger === 'interval_km');
    // 30 000 km to go at 123.456 km/day: 243.002 days, rounded up to 244 after 2026-11-30
    expect(km).toMatchObject({ dueDate: '2027-08-01', basis: { rule: 'interval_km', fromKm: 40000, intervalKm: 50000, drivenKm: 20000, kmPerDay: 123.5 } });
    expect(Object.keys(km?.basis ?? {}).sort()).toEqual(['drivenKm', 'fromKm', 'intervalKm', 'kmPerDay', 'rule']);
  });

  it('when the mechanic asked for a follow-up, then its basis holds the day, the inspection that asked for it and the corners', () => {
    const followUp = { date: '2026-12-20', inspectionId: 3, askedOn: '2026-11-20', checkAgain: ['FL'], looked: ['FL', 'FR'] };
    const d = decide(base({ lastDone: { date: '2026-11-20', odometerKm: 59000 }, followUp }), rules);
    expect(d.candidate?.basis).toEqual({
      rule: 'follow_up',
      followUpOn: '2026-12-20',
      fromInspectionId: 3,
      askedOn: '2026-11-20',
      checkAgain: ['FL'],
      looked: ['FL', 'FR'],
      ruleDueDate: '2026-12-20',
      createdOn: '2026-11-30',
    });
  });
});

describe('the wording on the day a date is reached', () => {
  it('when a damper reaches its end of life today, then it is not yet "passed": its threshold, reached earlier, books it for today', () => {
    // threshold 2026-10-01 − 14 days = 2026-09-17, 74 days before 2026-11-30
    const d = decide(base({ corners: [corner('FL', '2026-10-01', null, '2026-11-30', 1)] }), rules);
    expect(d.candidate?.pastEndOfLife).toBeUndefined();
    expect(d.candidate?.reason).toBe(
      'The FL damper reached 80 % of its expected life on 1 Oct 2026 (100 % used now; the vehicle drove 100 km/day over the last 30 days); inspection set 14 days ahead. Rule date 17 Sep 2026 passed 74 days ago: due now.',
    );
  });

  it('when a damper reaches the threshold today, then the reason says it reached it (not "is predicted to reach")', () => {
    const d = decide(base({ corners: [corner('FL', '2026-11-30')] }), rules);
    expect(d.candidate?.reason).toMatch(/^The FL damper reached 80 % of its expected life on 30 Nov 2026 /);
  });

  it('when a spring reaches the threshold today, then the reason says it reached it', () => {
    const d = decide(base({ corners: [corner('RL', null, '2026-11-30')] }), rules);
    expect(d.candidate?.reason).toBe(
      'The RL spring reached 80 % of its expected fatigue life on 30 Nov 2026 (1 % used now; the vehicle drove 100 km/day over the last 30 days); inspection set 14 days ahead. Rule date 16 Nov 2026 passed 14 days ago: due now.',
    );
  });

  it('when the rule date passed yesterday, then the reason says "1 day ago"', () => {
    // threshold 2026-12-13 − 14 days = 2026-11-29
    const d = decide(base({ corners: [corner('FL', '2026-12-13')] }), rules);
    expect(d.candidate?.dueDate).toBe('2026-11-30');
    expect(d.candidate?.reason).toMatch(/ Rule date 29 Nov 2026 passed 1 day ago: due now\.$/);
  });
});

describe('several rule dates', () => {
  it('when several rule dates have passed, then the inspection is due today and the reason is the rule passed the longest ago', () => {
    // damper rule date 2026-09-17 (threshold 2026-10-01), months rule 2026-10-01: both booked today
    const lastDone = { date: '2025-10-01', odometerKm: 55000 };
    const damperFirst = decide(base({ lastDone, corners: [corner('FL', '2026-10-01')] }), rules);
    expect(damperFirst.candidate).toMatchObject({ dueDate: '2026-11-30', trigger: 'prediction', basis: { ruleDueDate: '2026-09-17' } });
    // damper rule date 2026-11-06 (threshold 2026-11-20), after the months rule's
    const monthsFirst = decide(base({ lastDone, corners: [corner('FL', '2026-11-20')] }), rules);
    expect(monthsFirst.candidate).toMatchObject({ dueDate: '2026-11-30', trigger: 'interval_months', basis: { ruleDueDate: '2026-10-01' } });
    expect(monthsFirst.candidate?.reason).toMatch(/ Rule date 1 Oct 2026 passed 60 days ago: due now\.$/);
  });

  it('when a vehicle has no rule date at all, then nothing is booked and there is no candidate', () => {
    // never inspected, commissioning unknown, standing still below the km interval
    const d = decide(base({ lastDone: null, vehicle: { id: 1, fleetNumber: 'CV-101', odometerKm: 20000, commissionedAt: null }, kmPerDay: 0 }), rules);
    expect(d).toEqual({ action: 'none', candidate: null });
  });

  it('when the rule date is exactly the horizon away, then the inspection is created; a day further, not yet', () => {
    // months rule 2027-02-28 is 90 days after 2026-11-30; km rule 4 900 days away
    const at = decide(base({ lastDone: { date: '2026-02-28', odometerKm: 59000 }, kmPerDay: 10 }), rules);
    expect(at).toMatchObject({ action: 'create', status: 'scheduled', candidate: { dueDate: '2027-02-28', trigger: 'interval_months' } });
    const beyond = decide(base({ lastDone: { date: '2026-03-01', odometerKm: 59000 }, kmPerDay: 10 }), rules);
    expect(beyond).toMatchObject({ action: 'none', candidate: { dueDate: '2027-03-01' } });
  });
});

describe('the interval rules\' edge cases', () => {
  it('when neither an inspection nor commissioning is on record, then there is no months interval, and the km interval runs from new', () => {
    const input = base({ lastDone: null, vehicle: { id: 1, fleetNumber: 'CV-101', odometerKm: 20000, commissionedAt: null }, kmPerDay: 50 });
    expect(candidates(input, rules).map((c) => c.trigger)).toEqual(['interval_km']);
    const d = decide(input, rules);
    // 30 000 km to go at 50 km/day = 600 days
    expect(d.candidate).toMatchObject({ trigger: 'interval_km', dueDate: '2028-07-22', basis: { fromKm: 0, drivenKm: 20000 } });
    expect(d.candidate?.reason).toBe('Interval rule: 50,000 km since new (no inspection on record); 20,000 km driven, 30,000 km to go at 50 km/day.');
  });

  it('when the last inspection has no odometer reading, then there is no km interval', () => {
    const all = candidates(base({ lastDone: { date: '2026-06-01', odometerKm: null }, kmPerDay: 1000 }), rules);
    expect(all.map((c) => c.trigger)).toEqual(['interval_months']);
  });

  it('when the vehicle stood still for 30 days, then the km interval gives no date (it is never reached at 0 km/day)', () => {
    const all = candidates(base({ kmPerDay: 0 }), rules);
    expect(all.map((c) => c.trigger)).toEqual(['interval_months']);
  });

  it('when exactly the km interval has been driven, then it is due today and the reason gives the km driven without any "to go"', () => {
    const d = decide(base({ lastDone: { date: '2026-06-01', odometerKm: 10000 } }), rules);
    expect(d).toMatchObject({ action: 'create', status: 'due', candidate: { dueDate: '2026-11-30', trigger: 'interval_km' } });
    expect(d.candidate?.reason).toBe('Interval rule: 50,000 km since the last inspection at 10,000 km; 50,000 km driven.');
    // reached is reached, even if the vehicle has stood still since
    const still = decide(base({ lastDone: { date: '2026-06-01', odometerKm: 10000 }, kmPerDay: 0 }), rules);
    expect(still.candidate).toMatchObject({ dueDate: '2026-11-30', trigger: 'interval_km' });
  });

  it('when more than the km interval has been driven, then it is due today, not on an earlier day', () => {
    const d = decide(base({ vehicle: { id: 1, fleetNumber: 'CV-101', odometerKm: 95000, commissionedAt: '2024-01-01' } }), rules);
    expect(d).toMatchObject({ action: 'create', candidate: { dueDate: '2026-11-30', trigger: 'interval_km', basis: { ruleDueDate: '2026-11-30' } } });
    expect(d.candidate?.reason).toBe('Interval rule: 50,000 km since the last inspection at 40,000 km; 55,000 km driven.');
  });
});
