import type { ScheduleRules, VehicleScheduleInput } from '../../../server/inspections/schedule';

/**
 * The scheduling rules the tests decide by: inspect at 0.8 of a damper's life, 14 days ahead;
 * every 50 000 km or 12 months; due soon within 7 days; booked at most 90 days ahead.
 */
export const rules: ScheduleRules = { threshold: 0.8, leadDays: 14, intervalKm: 50000, intervalMonths: 12, dueSoonDays: 7, horizonDays: 90 };

/**
 * One vehicle's scheduling input on 2026-11-30: CV-101 at 60 000 km, commissioned 2024-01-01,
 * last inspected 2026-06-01 at 40 000 km, 100 km a day, no corners and no open inspection;
 * `over` replaces any part of it.
 */
export const base = (over: Partial<VehicleScheduleInput> = {}): VehicleScheduleInput => ({
  today: '2026-11-30',
  vehicle: { id: 1, fleetNumber: 'CV-101', odometerKm: 60000, commissionedAt: '2024-01-01' },
  corners: [],
  lastDone: { date: '2026-06-01', odometerKm: 40000 },
  kmPerDay: 100,
  open: null,
  ...over,
});

/** One corner's predicted dates (the damper's threshold, the spring's threshold, the damper's end of life), 60 % of its life used unless told. */
export const corner = (position: string, thresholdDate: string | null, springThresholdDate: string | null = null, endOfLifeDate: string | null = null, lifeUsedFraction = 0.6) => ({
  position,
  lifeUsedFraction,
  thresholdDate,
  endOfLifeDate,
  springDamage: 0.01,
  springThresholdDate,
});
