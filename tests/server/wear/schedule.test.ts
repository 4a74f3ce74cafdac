import { describe, expect, it } from 'vitest';
import { decide, openStatus, type ScheduleRules, type VehicleScheduleInput } from '../../../server/wear/schedule';

const rules: ScheduleRules = { threshold: 0.8, leadDays: 14, intervalKm: 50000, intervalMonths: 12, dueSoonDays: 7, horizonDays: 90 };

const base = (over: Partial<VehicleScheduleInput> = {}): VehicleScheduleInput => ({
  today: '2026-11-30',
  vehicle: { id: 1, fleetNumber: 'CV-101', odometerKm: 60000, commissionedAt: '2024-01-01' },
  corners: [],
  lastDone: { date: '2026-06-01', odometerKm: 40000 },
  kmPerDay: 100,
  open: null,
  ...over,
});

const corner = (position: string, thresholdDate: string | null, springThresholdDate: string | null = null) => ({
  position,
  lifeUsedFraction: 0.6,
  thresholdDate,
  kmPerDay: 180,
  springDamage: 0.01,
  springThresholdDate,
});

describe('inspection scheduling rules', () => {
  it('when a damper is predicted to reach the threshold, then the inspection is due the lead time before it, with the reason in words and numbers', () => {
    const d = decide(base({ corners: [corner('FL', '2027-01-20'), corner('RR', '2027-01-10')] }), rules);
    expect(d.action).toBe('create');
    if (d.action !== 'create') return;
    expect(d.candidate.dueDate).toBe('2026-12-27'); // 2027-01-10 − 14 days
    expect(d.candidate.trigger).toBe('prediction');
    expect(d.candidate.reason).toContain('RR damper predicted to reach 80 %');
    expect(d.candidate.reason).toContain('2027-01-10');
    expect(d.candidate.reason).toContain('180 km/day');
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
    expect(d.candidate.reason).toMatch(/Rule date 2026-10-01 passed 60 days ago: due now\./);
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

  it('when a rule now asks for an earlier date than the open inspection, then that inspection is moved earlier, never later, and a hand-made one is left alone', () => {
    const open = { id: 5, dueDate: '2027-02-20', status: 'scheduled', trigger: 'interval_months' };
    const d = decide(base({ open, corners: [corner('RR', '2027-01-10')] }), rules);
    expect(d).toMatchObject({ action: 'move', id: 5, candidate: { dueDate: '2026-12-27', trigger: 'prediction' } });
    const manual = decide(base({ open: { ...open, trigger: 'manual' }, corners: [corner('RR', '2027-01-10')] }), rules);
    expect(manual.action).toBe('none');
    const legacy = decide(base({ open: { ...open, trigger: null }, corners: [corner('RR', '2027-01-10')] }), rules);
    expect(legacy.action).toBe('none');
  });

  it('when the same input is decided twice, then the decision is the same (deterministic)', () => {
    const input = base({ corners: [corner('FL', '2027-01-20', '2027-01-05')] });
    expect(decide(input, rules)).toEqual(decide(input, rules));
    expect(decide(input, rules).candidate?.reason).toContain('FL spring');
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
    expect(d.candidate?.reason).toContain('commissioning on 2026-03-01 (no inspection on record)');
  });
});
