// The wear functions one by one (server/wear/wear.ts; rules in docs/methods.md, "Damper wear and
// prediction"). Dates were counted by hand and checked with Python's datetime ("computed").
import { describe, expect, it } from 'vitest';
import {
  accumulateDays,
  addMonths,
  estimatedDamping,
  estimateOpening,
  formatKm,
  levelsOf,
  lifeAtQuantile,
  predict,
  predictFromSummary,
  predictionWindow,
  summarizeWear,
  type LifeBasis,
  type PredictOptions,
  type WearDayRow,
  type WearSummary,
} from '../../../server/wear/wear';

const life: LifeBasis = { b: 1, medianWearKm: 100_000, p10WearKm: 60_000, p90WearKm: 140_000, source: 'prior', note: 'prior of the spec' };
const opts = (over: Partial<PredictOptions> = {}): PredictOptions => ({
  asOf: '2026-11-30',
  installedAt: '2026-01-01',
  life,
  thresholdFraction: 0.8,
  nominalDampingNsPerM: 3000,
  untrackedKm: 0,
  ...over,
});
const summary = (over: Partial<WearSummary> = {}): WearSummary => ({
  windowWearKm: 0,
  windowKm: 0,
  windowSpringDamage: 0,
  cumKm: 0,
  cumWearKm: 0,
  springDamage: 0,
  levelDays: [null, null, null, null],
  springThresholdDay: null,
  ...over,
});
/** A stored wear row with only what the summary reads. */
const row = (day: string, o: { km?: number; wear?: number; spring?: number; cumKm?: number; cumWear?: number; cumSpring?: number }): WearDayRow => ({
  damperId: 1,
  vehicleId: 1,
  day,
  distanceKm: o.km ?? 0,
  energyJ: 0,
  springDamage: o.spring ?? 0,
  wearKm: o.wear ?? 0,
  cumKm: o.cumKm ?? 0,
  cumEnergyJ: 0,
  cumWearKm: o.cumWear ?? 0,
  cumSpringDamage: o.cumSpring ?? 0,
  lifeWearKm: 100_000,
  lifeUsedFraction: 0,
  dampingNsPerM: 3000,
});

describe('words and calendar helpers', () => {
  it('when a distance is written, then it is rounded to whole km with thousands separated', () => {
    expect(formatKm(12_345.6)).toBe('12,346 km');
    expect(formatKm(0.4)).toBe('0 km');
  });

  it('when months are added, then the day is kept, or the last day of a shorter month (computed)', () => {
    expect(addMonths('2026-01-15', 1)).toBe('2026-02-15');
    expect(addMonths('2026-01-31', 1)).toBe('2026-02-28');
    expect(addMonths('2024-01-31', 1)).toBe('2024-02-29');
    expect(addMonths('2026-01-01', 72)).toBe('2032-01-01');
  });
});

describe('estimated present damping (linear fade to 60 % at end of life, stated assumption)', () => {
  it('when life used goes from 0 to 1, then damping fades linearly from nominal to 60 % (computed)', () => {
    expect(estimatedDamping(3000, 0)).toBe(3000);
    expect(estimatedDamping(3000, 0.5)).toBeCloseTo(2400, 9);
    expect(estimatedDamping(3000, 1)).toBeCloseTo(1800, 9);
  });

  it('when life used is outside 0–1, then it is held at the ends: never above nominal, never below 60 %', () => {
    expect(estimatedDamping(3000, -0.2)).toBe(3000);
    expect(estimatedDamping(3000, 1.5)).toBeCloseTo(1800, 9);
  });
});

describe('daily wear rows', () => {
  const days = [
    { day: '2026-11-01', distanceKm: 100, energyJ: 5e6, springDamage: 0.001, wearKm: 150 },
    { day: '2026-11-02', distanceKm: 40, energyJ: 2e6, springDamage: 0.0005, wearKm: 30 },
  ];

  it('when there is no earlier day, then the sums start at zero and each day adds its own duty (computed)', () => {
    const rows = accumulateDays({ damperId: 4, vehicleId: 9 }, null, days, 1_000, 2000);
    expect(rows).toHaveLength(2);
    expect(rows[0]).toEqual({ damperId: 4, vehicleId: 9, ...days[0], cumKm: 100, cumEnergyJ: 5e6, cumWearKm: 150, cumSpringDamage: 0.001, lifeWearKm: 1_000, lifeUsedFraction: 0.15, dampingNsPerM: 2000 * (1 - 0.4 * 0.15) });
    expect(rows[1]).toMatchObject({ ...days[1], cumKm: 140, cumEnergyJ: 7e6, cumWearKm: 180, lifeUsedFraction: 0.18 });
    expect(rows[1].cumSpringDamage).toBeCloseTo(0.0015, 15);
    expect(rows[1].dampingNsPerM).toBeCloseTo(2000 * (1 - 0.4 * 0.18), 9);
  });

  it('when the range continues from a stored day, then its sums carry on from that day', () => {
    const rows = accumulateDays({ damperId: 4, vehicleId: 9 }, { cumKm: 1_000, cumEnergyJ: 1e8, cumWearKm: 500, cumSpringDamage: 0.1 }, days, 1_000, 2000);
    expect(rows[1]).toMatchObject({ cumKm: 1_140, cumEnergyJ: 1.07e8, cumWearKm: 680, lifeUsedFraction: 0.68 });
    expect(rows[1].cumSpringDamage).toBeCloseTo(0.1015, 15);
  });

  it('when there is opening wear, then it shifts life used and damping but not the recorded sums', () => {
    const rows = accumulateDays({ damperId: 4, vehicleId: 9 }, null, days, 1_000, 2000, 700);
    expect(rows[0]).toMatchObject({ cumWearKm: 150, lifeUsedFraction: 0.85 });
    expect(rows[1].lifeUsedFraction).toBeCloseTo(0.88, 12);
    // past end of life the damping stays at 60 % of nominal
    expect(accumulateDays({ damperId: 4, vehicleId: 9 }, null, days, 100, 2000)[1].dampingNsPerM).toBeCloseTo(1200, 9);
  });
});

describe('opening wear: the words and the edges', () => {
  it('when nothing was driven before the records, then there is no opening wear and the basis says so', () => {
    expect(estimateOpening({ untrackedKm: 0, recordedKm: 0, recordedWearKm: 0 })).toEqual({
      km: 0,
      wearKm: 0,
      lowWearKm: 0,
      highWearKm: 0,
      perKm: 1,
      basis: 'none: the trips on record cover the distance since fitting',
    });
  });

  it('when there is no record at all, then the untracked distance is charged at the rated road and the range is that one rate', () => {
    const o = estimateOpening({ untrackedKm: 12_000, recordedKm: 0, recordedWearKm: 0 });
    expect(o).toEqual({
      km: 12_000,
      wearKm: 12_000,
      lowWearKm: 12_000,
      highWearKm: 12_000,
      perKm: 1,
      basis: "12,000 km before the trips on record, at the rated road's rate (class B at 80 km/h): its 0 km on record are too short to say otherwise",
    });
  });

  it('when the record is shorter, then the basis names its own rate as the one not used', () => {
    expect(estimateOpening({ untrackedKm: 12_000, recordedKm: 3_000, recordedWearKm: 4_500 }).basis).toBe(
      "12,000 km before the trips on record, at the rated road's rate (class B at 80 km/h): its 3,000 km on record are too short to say otherwise (they run at 1.50× that rate)",
    );
  });

  it('when the record is exactly as long as the untracked distance, then its own rate is used (computed)', () => {
    const o = estimateOpening({ untrackedKm: 2_000, recordedKm: 2_000, recordedWearKm: 1_000 });
    expect(o).toMatchObject({ km: 2_000, wearKm: 1_000, lowWearKm: 1_000, highWearKm: 2_000, perKm: 0.5 });
    expect(o.basis).toBe("2,000 km before the trips on record, at this damper's own recorded rate (0.50× the rated road, over 2,000 km on record)");
  });
});

describe('the prediction window: edges', () => {
  it('when a window length is given, then it is used while the damper is older than it', () => {
    expect(predictionWindow({ asOf: '2026-11-30', installedAt: '2026-01-01', windowDays: 7 })).toEqual({ windowDays: 7, windowStart: '2026-11-24' });
  });

  it('when the fitting day is after the as-of day, then the window is still one day', () => {
    expect(predictionWindow({ asOf: '2026-11-30', installedAt: '2026-12-05' })).toEqual({ windowDays: 1, windowStart: '2026-11-30' });
  });
});

describe('life at a quantile', () => {
  // a Weibull life of scale 100 000 wear km and shape 2: L_q = scale·(−ln(1−q))^(1/2) (Weibull quantile function)
  const weibull = (q: number) => 100_000 * Math.sqrt(-Math.log(1 - q));
  const fitted: LifeBasis = { ...life, medianWearKm: weibull(0.5), p10WearKm: weibull(0.1), p90WearKm: weibull(0.9) };

  it('when the basis is a Weibull life, then the life at any quantile is its Weibull quantile, exact at P10, median and P90', () => {
    expect(lifeAtQuantile(fitted, 0.5)).toBe(fitted.medianWearKm);
    expect(lifeAtQuantile(fitted, 0.1)).toBeCloseTo(fitted.p10WearKm, 6);
    expect(lifeAtQuantile(fitted, 0.9)).toBeCloseTo(fitted.p90WearKm, 6);
    expect(lifeAtQuantile(fitted, 0.25)).toBeCloseTo(weibull(0.25), 6);
    expect(lifeAtQuantile(fitted, 0.25)).toBeCloseTo(53_636.1, 0);
  });

  it('when the inspection is scheduled on the P10 life, then the threshold level is the fraction of that life, and every level is less the opening wear', () => {
    const o = opts({ life: fitted, scheduleQuantile: 0.1 });
    const [th, med, p10, p90] = levelsOf(o, 1_000);
    expect(th).toBeCloseTo(0.8 * fitted.p10WearKm - 1_000, 6);
    expect([med, p10, p90]).toEqual([fitted.medianWearKm - 1_000, fitted.p10WearKm - 1_000, fitted.p90WearKm - 1_000]);
    expect(levelsOf(opts({ life: fitted }), 0)[0]).toBeCloseTo(0.8 * fitted.medianWearKm, 9);
  });
});

describe('the summary a prediction rests on', () => {
  // window of 30 days to 2026-11-30 starts 2026-11-01 (computed); levels: 80 000, 100 000, 60 000, 140 000
  const history = [
    row('2026-10-31', { km: 1_000, wear: 2_000, spring: 0.1, cumKm: 50_000, cumWear: 60_000, cumSpring: 0.5 }),
    row('2026-11-01', { km: 100, wear: 20_000, spring: 0.2, cumKm: 50_100, cumWear: 80_000, cumSpring: 0.8 }),
    row('2026-11-15', { km: 30, wear: 5_000, spring: 0.05, cumKm: 50_130, cumWear: 85_000, cumSpring: 0.85 }),
    row('2026-11-30', { km: 7, wear: 15_000, spring: 0.01, cumKm: 50_137, cumWear: 100_000, cumSpring: 0.86 }),
    row('2026-12-01', { km: 500, wear: 50_000, spring: 0.5, cumKm: 50_637, cumWear: 150_000, cumSpring: 1.36 }),
  ];

  it('when rows run past the as-of day, then the sums are those of the as-of day and the window counts from its first day, both ends in', () => {
    const s = summarizeWear(history, opts(), 0);
    expect(s).toMatchObject({ windowWearKm: 40_000, windowKm: 137, cumKm: 50_137, cumWearKm: 100_000, springDamage: 0.86 });
    expect(s.windowSpringDamage).toBeCloseTo(0.26, 12);
  });

  it('when the recorded wear reaches a level exactly, then that day is its first day, and later days do not replace it', () => {
    const s = summarizeWear(history, opts(), 0);
    expect(s.levelDays).toEqual(['2026-11-01', '2026-11-30', '2026-10-31', null]);
    expect(s.springThresholdDay).toBe('2026-11-01');
  });

  it('when there is opening wear, then the levels are reached that much sooner on the record', () => {
    const s = summarizeWear(history, opts(), 20_000);
    expect(s.levelDays).toEqual(['2026-10-31', '2026-11-01', '2026-10-31', null]);
  });
});

describe('the prediction from a summary', () => {
  it('when wear comes at 100 wear km a day, then every output follows from it (computed)', () => {
    // 30 days to 2026-11-30; fitted 2026-01-01 (333 days old), calendar end 2032-01-01 (2 191 days)
    const s = summary({ windowWearKm: 3_000, windowKm: 1_500, windowSpringDamage: 0.9375, cumKm: 40_000, cumWearKm: 40_000, springDamage: 0.25 });
    const p = predictFromSummary(s, opts());
    expect(p).toMatchObject({ asOf: '2026-11-30', windowDays: 30, windowKm: 1_500, windowWearKm: 3_000, wearKmPerDay: 100, kmPerDay: 50, wearKm: 40_000, life, thresholdFraction: 0.8, scheduleQuantile: 0.5 });
    expect(p.distanceLifeUsed).toBeCloseTo(0.4, 12);
    expect(p.calendarLifeUsed).toBeCloseTo(333 / 2191, 12);
    expect(p.lifeUsedFraction).toBeCloseTo(0.4, 12);
    expect(p.dampingNsPerM).toBeCloseTo(3000 * 0.84, 9);
    // 40 000 more to 80 000 at 100/day: 400 days; to 100 000: 600; P10 60 000: 200; P90 140 000: 1 000
    expect(p.thresholdDate).toBe('2028-01-04');
    expect(p.endOfLifeDate).toBe('2028-07-22');
    expect(p.endOfLifeP10Date).toBe('2027-06-18');
    expect(p.endOfLifeP90Date).toBe('2029-08-26');
    expect(p.governedBy).toBe('distance');
    // spring: 0.9375 over 30 days = 1/32 a day; 0.55 to go to the 0.8 threshold: 17.6 → 18 days
    expect(p.springRatePerDay).toBe(0.03125);
    expect(p.springDamage).toBe(0.25);
    expect(p.springThresholdDate).toBe('2026-12-18');
    expect(p.opening).toMatchObject({ km: 0, wearKm: 0 });
    expect([p.openingShare, p.openingShareLow, p.openingShareHigh]).toEqual([0, 0, 0]);
  });

  it('when the summary is written out, then the basis states the window, the quantile, the calendar limit and the damping rule', () => {
    const p = predictFromSummary(summary({ windowWearKm: 3_000, windowKm: 1_500 }), opts());
    expect(p.basis).toEqual({
      method:
        'straight-line projection of the wear rate over the last 30 day(s) (2026-11-01 to 2026-11-30); end of life as the median of the fitted scatter with its P10–P90 range; inspection threshold 80 % of the median life',
      life: 'prior of the spec',
      opening: 'none: the trips on record cover the distance since fitting',
      calendar: 'calendar limit 6 years from fitting (common practice: 5–7 years), reached 2032-01-01',
      damping: 'estimated present damping: linear fade from nominal to 60 % at end of life (assumption)',
      window: "1,500 km driven in the window, 3,000 km of wear at the rated road's rate",
    });
    expect(predictFromSummary(summary(), opts({ scheduleQuantile: 0.1, thresholdFraction: 0.7 })).basis.method).toMatch(/; inspection threshold 70 % of the P10 life$/);
  });

  it('when nothing is driven, then the threshold falls at its share of the calendar life (computed: 0.8 × 2 191 days = 1 752.8 → day 1 753)', () => {
    const p = predictFromSummary(summary(), opts());
    expect(p.thresholdDate).toBe('2030-10-20');
    expect(p.endOfLifeDate).toBe('2032-01-01');
    expect(p.endOfLifeP10Date).toBe('2032-01-01');
    expect(p.endOfLifeP90Date).toBe('2032-01-01');
    expect(p.governedBy).toBe('calendar');
    expect(p.springThresholdDate).toBeNull();
  });

  it('when distance reaches end of life on the calendar limit day itself, then distance governs', () => {
    // fitted 2026-01-01 with a 1-year limit: 2027-01-01 is 32 days after 2026-11-30 (computed)
    const p = predictFromSummary(summary({ windowWearKm: 3_000, cumWearKm: 100_000 - 32 * 100 }), opts({ calendarYears: 1 }));
    expect(p.endOfLifeDate).toBe('2027-01-01');
    expect(p.governedBy).toBe('distance');
    const later = predictFromSummary(summary({ windowWearKm: 3_000, cumWearKm: 100_000 - 33 * 100 }), opts({ calendarYears: 1 }));
    expect(later.endOfLifeDate).toBe('2027-01-01');
    expect(later.governedBy).toBe('calendar');
  });

  it('when the distance threshold comes before the calendar threshold, then it is the threshold date; when after, the calendar one is', () => {
    const soon = predictFromSummary(summary({ windowWearKm: 3_000, cumWearKm: 79_000 }), opts());
    expect(soon.thresholdDate).toBe('2026-12-10');
    const slow = predictFromSummary(summary({ windowWearKm: 30, cumWearKm: 0 }), opts());
    expect(slow.thresholdDate).toBe('2030-10-20');
  });

  it('when a level is 100 years away or more at the recent rate, then no date is given for it (36 500 days is the last)', () => {
    // 1 wear km a day: 36 500 km to go is dated, 36 501 is not (computed: 2026-11-30 + 36 500 days = 2126-11-06)
    const at = predictFromSummary(summary({ windowWearKm: 30, cumWearKm: 100_000 - 36_500 }), opts({ calendarYears: 200 }));
    expect(at.endOfLifeDate).toBe('2126-11-06');
    const past = predictFromSummary(summary({ windowWearKm: 30, cumWearKm: 100_000 - 36_501 }), opts({ calendarYears: 200 }));
    expect(past.endOfLifeDate).toBe(addMonths('2026-01-01', 2400));
    expect(past.governedBy).toBe('calendar');
  });

  it('when a level was reached but its first day is not known, then it is dated the as-of day', () => {
    const p = predictFromSummary(summary({ cumWearKm: 85_000 }), opts());
    expect(p.thresholdDate).toBe('2026-11-30');
  });

  it('when the calendar life is not a whole number of months, then it is rounded to the nearest month (6.05 years = 72.6 → 73 months)', () => {
    expect(predictFromSummary(summary(), opts({ calendarYears: 6.05 })).endOfLifeDate).toBe('2032-02-01');
  });

  it('when the calendar share is larger than the distance share, then it is the life used (computed: 2 191 of 4 383 days)', () => {
    const p = predictFromSummary(summary({ cumWearKm: 10_000 }), opts({ installedAt: '2020-11-30', calendarYears: 12 }));
    expect(p.calendarLifeUsed).toBeCloseTo(2191 / 4383, 12);
    expect(p.lifeUsedFraction).toBeCloseTo(2191 / 4383, 12);
    expect(p.dampingNsPerM).toBeCloseTo(3000 * (1 - 0.4 * (2191 / 4383)), 9);
  });

  it('when the as-of day is before the fitting day, then no calendar life is used yet', () => {
    expect(predictFromSummary(summary(), opts({ installedAt: '2026-12-10' })).calendarLifeUsed).toBe(0);
  });

  it('when the damper ran before its records, then the opening wear and its range are shares of the median life (computed)', () => {
    // 20 000 km untracked, 30 000 km on record at 1.5× the rated road: own rate used
    const p = predictFromSummary(summary({ cumKm: 30_000, cumWearKm: 45_000 }), opts({ untrackedKm: 20_000 }));
    expect(p.opening).toMatchObject({ km: 20_000, wearKm: 30_000, perKm: 1.5 });
    expect(p.wearKm).toBe(75_000);
    expect(p.openingShare).toBeCloseTo(0.3, 12);
    expect(p.openingShareLow).toBeCloseTo(0.2, 12);
    expect(p.openingShareHigh).toBeCloseTo(0.3, 12);
    expect(p.basis.opening).toBe(p.opening.basis);
  });

  it('when a test-lane offset applies, then it adds to the wear, and a level it alone passes is dated evenly between fitting and today', () => {
    // 333 days since fitting; 50 000 offset + 40 000 recorded = 90 000: the threshold 80 000 is
    // more than the offset alone, so it is dated on the record
    const s = summary({ cumWearKm: 40_000, levelDays: ['2026-11-20', null, '2026-11-02', null] });
    const p = predictFromSummary(s, opts({ life: { ...life, offsetWearKm: 50_000 } }));
    expect(p.wearKm).toBe(90_000);
    expect(p.distanceLifeUsed).toBeCloseTo(0.9, 12);
    expect(p.thresholdDate).toBe('2026-11-20');
    // P10 60 000 is not passed by the offset alone either; a P10 of 40 000 would be: 40 000/90 000 × 333 = 148 days → 2026-05-29
    const p10 = predictFromSummary(s, opts({ life: { ...life, p10WearKm: 40_000, offsetWearKm: 50_000 } }));
    expect(p10.endOfLifeP10Date).toBe('2026-05-29');
    expect(p10.basis.opening).toBe('none: the trips on record cover the distance since fitting; levels it alone passes are dated as if the wear had grown evenly since fitting (before the trips on record)');
    expect(p.basis.opening).toBe('none: the trips on record cover the distance since fitting');
  });

  it('when a level passed before the records would be dated by even growth after the first day on record, then it is dated on that first day (a level passed before the records cannot be passed later)', () => {
    // as in the case above, P10 40 000 is passed by the 50 000 offset alone; even growth gives
    // 2026-05-29, but the records start on 2026-03-01 (the first recorded day reaches it)
    const s = summary({ cumWearKm: 40_000, levelDays: ['2026-11-20', null, '2026-03-01', null] });
    const p10 = predictFromSummary(s, opts({ life: { ...life, p10WearKm: 40_000, offsetWearKm: 50_000 } }));
    expect(p10.endOfLifeP10Date).toBe('2026-03-01');
  });

  it('when the test-lane offset alone reaches the threshold exactly, then the threshold is dated by even growth, not on the record (computed: 80 000/90 000 × 333 days = day 296)', () => {
    const s = summary({ cumWearKm: 10_000, levelDays: ['2026-11-03', null, null, null] });
    const p = predictFromSummary(s, opts({ life: { ...life, offsetWearKm: 80_000 } }));
    expect(p.thresholdDate).toBe('2026-10-24');
  });

  it('when the wear is exactly at the threshold and nothing is driven now, then it is due on the as-of day', () => {
    expect(predictFromSummary(summary({ cumWearKm: 80_000 }), opts()).thresholdDate).toBe('2026-11-30');
    expect(predictFromSummary(summary({ cumWearKm: 80_000, levelDays: ['2026-11-12', null, null, null] }), opts()).thresholdDate).toBe('2026-11-12');
  });

  it('when the threshold is set to zero on a new damper, then it is due from its fitting day', () => {
    const p = predictFromSummary(summary(), opts({ thresholdFraction: 0, installedAt: '2026-11-01' }));
    expect(p.thresholdDate).toBe('2026-11-01');
  });
});

describe('the prediction over wear rows', () => {
  it('when a test-lane offset applies, then the first days of the levels are found on the record less the offset', () => {
    // 10 wear km a day from 2026-11-01; offset 30: the threshold 80 is reached at 50 recorded, on day 5
    const days = Array.from({ length: 10 }, (_, i) => ({ day: `2026-11-${String(i + 1).padStart(2, '0')}`, distanceKm: 10, energyJ: 0, springDamage: 0, wearKm: 10 }));
    const small: LifeBasis = { ...life, medianWearKm: 100, p10WearKm: 60, p90WearKm: 140, offsetWearKm: 30 };
    const rows = accumulateDays({ damperId: 1, vehicleId: 1 }, null, days, 100, 3000);
    const p = predict(rows, opts({ installedAt: '2026-11-01', life: small }));
    expect(p.thresholdDate).toBe('2026-11-05');
    expect(p.endOfLifeDate).toBe('2026-11-07');
    expect(p.endOfLifeP10Date).toBe('2026-11-03');
    expect(p.wearKm).toBe(130);
  });

  it('when the damper ran before its records, then the opening estimated from the whole record shifts the first days', () => {
    // 100 km untracked, 100 km on record at 1 wear km/km: 100 of opening wear
    const days = Array.from({ length: 10 }, (_, i) => ({ day: `2026-11-${String(i + 1).padStart(2, '0')}`, distanceKm: 10, energyJ: 0, springDamage: 0, wearKm: 10 }));
    const small: LifeBasis = { ...life, medianWearKm: 150, p10WearKm: 120, p90WearKm: 300 };
    const rows = accumulateDays({ damperId: 1, vehicleId: 1 }, null, days, 150, 3000);
    const p = predict(rows, opts({ installedAt: '2026-10-01', life: small, untrackedKm: 100, thresholdFraction: 0.5 }));
    expect(p.opening.wearKm).toBe(100);
    // the threshold 75 is passed by the opening alone: 75/200 of the 60 days since fitting = 22.5 → day 22 (computed)
    expect(p.thresholdDate).toBe('2026-10-23');
    // median 150 is 50 on the record: day 5; P10 120 is 20: day 2
    expect(p.endOfLifeDate).toBe('2026-11-05');
    expect(p.endOfLifeP10Date).toBe('2026-11-02');
  });
});
