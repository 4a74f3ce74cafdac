import { describe, expect, it } from 'vitest';
import { wearBands, wearRule, wearTone } from '../../web/src/lib/wear';
import { cornerState } from '../../server/workshop/corners';
import type { FittedCornerRow } from '../../server/workshop/repository';

describe('wear words on screen', () => {
  it('when the inspection threshold is 80 %, then the damper cards use the bands the scheduler and the wear page use', () => {
    expect(wearBands(0.8)).toEqual({ watchFrom: 0.6, dueFrom: 0.8, overdueFrom: 1 });
    expect([0.59, 0.6, 0.76, 0.8, 0.99, 1, 2.5].map((u) => wearTone(u, 0.8))).toEqual(['ok', 'watch', 'watch', 'due', 'due', 'overdue', 'overdue']);
    expect(wearRule(0.8)).toBe('Watch from 60 %, inspect from 80 % of expected life used.');
  });

  it('when the threshold is set to 70 %, then inspection is asked from 70 % and watching from 53 %', () => {
    expect(wearTone(0.72, 0.7)).toBe('due');
    expect(wearTone(0.72, 0.8)).toBe('watch');
    expect(wearRule(0.7)).toBe('Watch from 53 %, inspect from 70 % of expected life used.');
  });

  it('when there is no estimate, then the word is neutral', () => {
    expect(wearTone(null)).toBe('neutral');
    expect(wearTone(Number.NaN)).toBe('neutral');
  });
});

describe("the workshop's corner words", () => {
  it('when the wear model has estimated a corner, then its word follows the same bands as the vehicle page, for the threshold set', () => {
    const row = (u: number) =>
      ({ damper_id: 1, vehicle_id: 1, position: 'FL', axle_index: 0, part_number: null, installed_at: '2026-01-01', installed_odometer_km: 0, energy_j: 1, life_used_fraction: u,
        damping_ns_per_m: 2000, wear_updated_at: '2026-12-01', odometer_km: 10_000, spec_id: 1, rated_damper_life_km: 90_000, nominal_ns_per_m: 2400, p_threshold_date: null, p_end_date: null }) as unknown as FittedCornerRow;
    const word = { ok: 'ok', watch: 'watch', due: 'due', past_life: 'overdue' } as const;
    for (const th of [0.8, 0.7]) {
      for (const u of [0.5, 0.55, 0.6, 0.72, 0.8, 0.95, 1.2]) {
        expect(word[cornerState(row(u), new Map(), th).state], `u ${u}, threshold ${th}`).toBe(wearTone(u, th));
      }
    }
  });
});
