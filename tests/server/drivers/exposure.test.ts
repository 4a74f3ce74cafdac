import { describe, expect, it } from 'vitest';
import { TEST_NOW } from '../../support/server';
import { DEMO } from '../../support/client';
import { gdForClass } from '../../../server/physics/iso8608';
import { prepareDuty, dutyOnRoad } from '../../../server/physics/closed-form';
import { refreshExposure } from '../../../server/drivers/exposure';
import { DEFAULT_DAMPER_MULTIPLE, MIN_ADVICE_KMH, ROAD_ATTENTION, adviseSpeed, dailyExposureLimit, prepareSpec } from '../../../server/drivers/speed-advice';
import { driversFixture } from './fixture';

const { srv, q, ids, manager, driver, other } = driversFixture();

describe('exposure A(8) from the nightly duty', () => {
  it('when a driver has several trips in a day, then A(8) follows the directive\'s formula on the front axle (hand-worked)', async () => {
    const trips = await q<{ id: number; vehicle_id: number; route_id: number }>('SELECT id, vehicle_id, route_id FROM trips WHERE driver_id = ? ORDER BY id LIMIT 3', [ids.driver]);
    expect(trips).toHaveLength(3);
    await srv.db.sequelize.query('DELETE FROM trip_duties');
    const duty = (t: (typeof trips)[number], day: string, position: string, axle: number, aw: number, durationS: number) =>
      srv.db.sequelize.query(
        `INSERT INTO trip_duties (trip_id, vehicle_id, route_id, driver_id, position, axle_index, trip_date, distance_km, duration_s, sprung_mass_kg, energy_j, mean_power_w, rms_relative_velocity, rms_suspension_travel, rms_tire_load_ratio, rms_body_accel, rms_weighted_accel, spring_damage, segments, profiled_segments, unrated_segments, created_at, updated_at)
         VALUES (?, ?, ?, ?, ?, ?, ?, 50, ?, 400, 1, 1, 0.1, 0.01, 0.1, 1, ?, 0, 1, 0, 0, ?, ?)`,
        { replacements: [t.id, t.vehicle_id, t.route_id, ids.driver, position, axle, day, durationS, aw, TEST_NOW.toISOString(), TEST_NOW.toISOString()] },
      );
    // Day 1, trip A: FL = FR = 0.6 m/s² for 2 h; trip B: FL 0.5, FR 0.3 m/s² for 3 h; rear axle 2.0 m/s² (ignored: the driver sits over the front axle)
    await duty(trips[0], '2026-11-20', 'FL', 0, 0.6, 7200);
    await duty(trips[0], '2026-11-20', 'FR', 0, 0.6, 7200);
    await duty(trips[0], '2026-11-20', 'RL', 1, 2.0, 7200);
    await duty(trips[1], '2026-11-20', 'FL', 0, 0.5, 10800);
    await duty(trips[1], '2026-11-20', 'FR', 0, 0.3, 10800);
    await duty(trips[1], '2026-11-20', 'RR', 1, 2.0, 10800);
    // Day 2: one trip at 0.9 m/s² for 6 h
    await duty(trips[2], '2026-11-27', 'FL', 0, 0.9, 21600);
    await duty(trips[2], '2026-11-27', 'FR', 0, 0.9, 21600);
    // floor-to-seat factor 1 for the hand-worked figures: SEAT · √((1 + ρ)/2) = 1 with ρ = 0.5
    await srv.db.sequelize.query('UPDATE suspension_specs SET seat_factor = ?, cab_factor = NULL', { replacements: [1 / Math.sqrt(0.75)] });

    const res1 = await refreshExposure({ sequelize: srv.db.sequelize, now: TEST_NOW, asOf: '2026-11-30', publicUrl: 'http://app.test', runId: null });
    expect(res1).toMatchObject({ exposureDays: 2, exposureDaysAboveAction: 1 });
    const r = await driver.get<{ days: { day: string; a8: number; hours: number; trips: number; status: string }[]; actionValue: number; limitValue: number; caution: string }>('/api/exposure?from=2026-11-01&to=2026-11-30');
    expect(r.status).toBe(200);
    expect(r.body.actionValue).toBe(0.5); // Directive 2002/44/EC Art. 3(2)(b)
    expect(r.body.limitValue).toBe(1.15); // Directive 2002/44/EC Art. 3(2)(a)
    expect(r.body.caution).toMatch(/not a measurement at the seat/);
    const [d1, d2] = r.body.days;
    // Trip A: a_w = √((0.36 + 0.36)/2) = 0.6, T = 2 h → a_w²·T = 0.72
    // Trip B: a_w = √((0.25 + 0.09)/2) = √0.17 = 0.41231, T = 3 h → 0.17 × 3 = 0.51
    // A(8) = √((0.72 + 0.51)/8) = √0.15375 = 0.39211 m/s²
    expect(d1).toMatchObject({ day: '2026-11-20', trips: 2, status: 'within-action-value' });
    expect(d1.a8).toBeCloseTo(0.39211, 5);
    expect(d1.hours).toBeCloseTo(5, 9);
    // Day 2: A(8) = 0.9 × √(6/8) = √(0.81 × 6 / 8) = √0.6075 = 0.77942 m/s² — above the action value
    expect(d2.a8).toBeCloseTo(0.77942, 5);
    expect(d2.status).toBe('exceeds-action-value');

    const mail = await q<{ subject: string; text_body: string }>(`SELECT subject, text_body FROM mail_messages WHERE dedupe_key LIKE 'exposure:%' AND to_address = ?`, [DEMO.manager]);
    expect(mail).toHaveLength(1);
    expect(mail[0].text_body).toMatch(/2026-11-27: A\(8\) 0\.78 m\/s²/);
    // a rerun changes nothing and mails nothing new
    const res2 = await refreshExposure({ sequelize: srv.db.sequelize, now: TEST_NOW, asOf: '2026-11-30', publicUrl: 'http://app.test', runId: null });
    expect(res2.exposureMailsQueued).toBe(0);

    const over = await manager.get<{ daysAbove: { driverId: number; day: string }[]; routes: { id: number; sharePct: number }[]; vehicles: { id: number }[] }>('/api/exposure/overview?from=2026-11-01&to=2026-11-30');
    expect(over.body.daysAbove).toEqual([expect.objectContaining({ driverId: ids.driver, day: '2026-11-27' })]);
    expect(over.body.routes[0].id).toBe(trips[2].route_id);
    expect(over.body.routes.reduce((s, x) => s + x.sharePct, 0)).toBeCloseTo(100, 6);

    // the class defaults: SEAT 0.95 (van) or 0.75 (truck), times √((1 + 0.5)/2) for the two front wheel tracks; a cab factor multiplies in
    await srv.db.sequelize.query('UPDATE suspension_specs SET seat_factor = NULL, cab_factor = NULL');
    await refreshExposure({ sequelize: srv.db.sequelize, now: TEST_NOW, asOf: '2026-11-30', publicUrl: 'http://app.test', runId: null });
    const [cls] = await q<{ vehicle_class: string; spec_id: number }>('SELECT s.vehicle_class, s.id AS spec_id FROM vehicles v JOIN suspension_specs s ON s.id = v.spec_id WHERE v.id = ?', [trips[2].vehicle_id]);
    const seat = cls.vehicle_class === 'heavy goods' ? 0.75 : 0.95;
    const [day2] = await q<{ a8: number; parts: string }>(`SELECT a8, parts FROM driver_exposure_days WHERE driver_id = ? AND day = '2026-11-27'`, [ids.driver]);
    expect(day2.a8).toBeCloseTo(0.77942 * seat * Math.sqrt(0.75), 4);
    const part = (JSON.parse(day2.parts) as { aw: number; awFloor: number; seatFactor: number }[])[0];
    expect(part.awFloor).toBeCloseTo(0.9, 6);
    expect(part.seatFactor).toBeCloseTo(seat * Math.sqrt(0.75), 4);
    await srv.db.sequelize.query('UPDATE suspension_specs SET cab_factor = 0.8 WHERE id = ?', { replacements: [cls.spec_id] });
    await refreshExposure({ sequelize: srv.db.sequelize, now: TEST_NOW, asOf: '2026-11-30', publicUrl: 'http://app.test', runId: null });
    const [cab] = await q<{ a8: number }>(`SELECT a8 FROM driver_exposure_days WHERE driver_id = ? AND day = '2026-11-27'`, [ids.driver]);
    expect(cab.a8).toBeCloseTo(0.77942 * seat * Math.sqrt(0.75) * 0.8, 4);
    await srv.db.sequelize.query('UPDATE suspension_specs SET cab_factor = NULL');
  });

  it('when a driver asks for another driver\'s exposure, then it is refused; the manager must name a driver', async () => {
    expect((await driver.get(`/api/exposure?driverId=${ids.other}`)).status).toBe(403);
    expect((await other.get(`/api/exposure?driverId=${ids.driver}`)).status).toBe(403);
    expect((await manager.get(`/api/exposure?driverId=${ids.driver}&from=2026-11-01`)).status).toBe(200);
    expect((await manager.get('/api/exposure')).status).toBe(400);
  });
});

describe('speed advice', () => {
  const axles = [
    { axleIndex: 0, label: 'front', corner: { sprungMassKg: 430, unsprungMassKg: 46, springRateNPerM: 32000, dampingNsPerM: 2400, tireRateNPerM: 260000 } },
    { axleIndex: 1, label: 'rear', corner: { sprungMassKg: 360, unsprungMassKg: 55, springRateNPerM: 38000, dampingNsPerM: 2500, tireRateNPerM: 270000 } },
  ];
  // The demo's rigid truck (server/demo/seed.ts): dampers ten times the van's.
  const truckAxles = [
    { axleIndex: 0, label: 'front', corner: { sprungMassKg: 2400, unsprungMassKg: 450, springRateNPerM: 600000, dampingNsPerM: 28000, tireRateNPerM: 1600000 } },
    { axleIndex: 1, label: 'rear', corner: { sprungMassKg: 2100, unsprungMassKg: 650, springRateNPerM: 260000, dampingNsPerM: 20000, tireRateNPerM: 1800000 } },
  ];
  const SEAT = 0.95 * Math.sqrt(0.75); // conventional seat, ρ = 0.5
  const spec = prepareSpec(axles, { seatFactor: SEAT });
  const limits = (seatAwLimit: number, multiple = DEFAULT_DAMPER_MULTIPLE) => ({ seatAwLimit, rideLabel: 'comfort' as const, damper: { multiple } });

  it('when the road is rougher, then the advice is lower or equal, and lower over B to F (computed)', () => {
    const adv = ['A', 'B', 'C', 'D', 'E', 'F'].map((c) => adviseSpeed(spec, gdForClass(c), limits(1.6, 8)));
    const speeds = adv.map((a) => (a.belowMinimum ? 0 : a.advisedKmh!));
    for (let i = 1; i < speeds.length; i++) expect(speeds[i], `class ${'ABCDEF'[i]} vs ${'ABCDEF'[i - 1]}: ${speeds}`).toBeLessThanOrEqual(speeds[i - 1]);
    expect(speeds[5]).toBeLessThan(speeds[1]);
    for (let i = 1; i < adv.length; i++) expect(adv[i].rideKmh!).toBeLessThanOrEqual(adv[i - 1].rideKmh!);
  });

  it('when a limit is looser, then the advice is higher or equal (computed)', () => {
    const gd = gdForClass('D');
    const rides = [0.315, 0.63, 1, 1.6, 3].map((l) => adviseSpeed(spec, gd, limits(l, 50)).rideKmh!);
    for (let i = 1; i < rides.length; i++) expect(rides[i]).toBeGreaterThan(rides[i - 1]);
    const powers = [1, 2, 4, 8, 16, 32].map((m) => adviseSpeed(spec, gd, limits(99, m)).powerKmh!);
    for (let i = 1; i < powers.length; i++) expect(powers[i]).toBeGreaterThanOrEqual(powers[i - 1]);
    expect(powers[5]).toBeGreaterThan(powers[0]);
    const hours = [0.5, 2, 4, 8, 12].map((h) => adviseSpeed(spec, gdForClass('B'), limits(dailyExposureLimit(h), 50)).rideKmh!);
    for (let i = 1; i < hours.length; i++) expect(hours[i], `${hours}`).toBeLessThanOrEqual(hours[i - 1]);
  });

  it('when the ride limits, then a fresh closed-form solve at that speed gives the limit at the seat; the damper limit is its own class-B power times the multiple (computed)', () => {
    const gd = gdForClass('D');
    const a = adviseSpeed(spec, gd, limits(0.63, 50));
    expect(a.limitedBy).toBe('comfort');
    const aw = SEAT * dutyOnRoad(prepareDuty(axles[0].corner, a.rideKmh! / 3.6), gd).rmsWeightedAccel;
    expect(Math.abs(aw / 0.63 - 1), `seat a_w ${aw} at ${a.rideKmh} km/h`).toBeLessThan(1e-3); // grid interpolation
    const b = adviseSpeed(spec, gd, limits(99, 3));
    expect(b.limitedBy).toBe('damper power');
    // Reference: mean damper power c·σ_rel² on class B at 80 km/h, from a fresh solve.
    const ratios = axles.map((x) => {
      const ref = dutyOnRoad(prepareDuty(x.corner, 80 / 3.6), gdForClass('B')).damperPowerW;
      return dutyOnRoad(prepareDuty(x.corner, b.powerKmh! / 3.6), gd).damperPowerW / ref;
    });
    expect(Math.abs(Math.max(...ratios) / 3 - 1), `ratios ${ratios} at ${b.powerKmh} km/h`).toBeLessThan(1e-3);
    // The default multiple puts the damper limit at class D, 80 km/h (the wear model's heat line).
    expect(adviseSpeed(spec, gd, limits(99)).powerKmh!).toBeGreaterThan(75);
    expect(adviseSpeed(spec, gd, limits(99)).powerKmh!).toBeLessThan(85);
  });

  it('when the daily-exposure limit is chosen, then the seat a_w at the advised speed is 0.5·√(8/T) (Directive 2002/44/EC A(8); computed)', () => {
    for (const hours of [2, 8]) {
      const limit = 0.5 * Math.sqrt(8 / hours);
      expect(dailyExposureLimit(hours)).toBeCloseTo(limit, 12);
      const a = adviseSpeed(spec, gdForClass('C'), { seatAwLimit: limit, rideLabel: 'daily exposure', damper: { multiple: 50 } });
      expect(a.limitedBy).toBe('daily exposure');
      const aw = SEAT * dutyOnRoad(prepareDuty(axles[0].corner, a.rideKmh! / 3.6), gdForClass('C')).rmsWeightedAccel;
      expect(Math.abs(aw / limit - 1), `a_w ${aw} at ${a.rideKmh} km/h, T ${hours} h`).toBeLessThan(1e-3);
      // A(8) of T hours at that level, from the definition A(8) = a_w·√(T/8).
      expect(aw * Math.sqrt(hours / 8)).toBeCloseTo(0.5, 3);
    }
  });

  it('when laden, then the ride advice is higher (heavier body, lower acceleration) and the damper advice about the same (computed)', () => {
    // With the same tyre forcing a heavier body moves less: the body-bounce frequency falls and the
    // floor's weighted acceleration drops, so unladen is the harsher case for the ride. The mean
    // damper power on a w = 2 road hardly depends on the sprung mass (the power the road puts in
    // is set mainly by the tyre), so the damper limit moves by a few per cent at most.
    const gd = gdForClass('C');
    const unladen = adviseSpeed(spec, gd, limits(1.0, 4));
    const laden = adviseSpeed(prepareSpec(axles, { seatFactor: SEAT, payloadKg: 600 }), gd, limits(1.0, 4));
    expect(laden.rideKmh!).toBeGreaterThan(unladen.rideKmh! * 1.1);
    expect(Math.abs(laden.powerKmh! / unladen.powerKmh! - 1)).toBeLessThan(0.05);
  });

  it('when the damper limit is relative, then truck and van get advice of the same order on class D; an absolute 150 W would hold the truck to walking pace (computed)', () => {
    const truck = prepareSpec(truckAxles, { seatFactor: 0.75 * Math.sqrt(0.75) });
    const gd = gdForClass('D');
    const v = adviseSpeed(spec, gd, limits(99, 4)).powerKmh!;
    const t = adviseSpeed(truck, gd, limits(99, 4)).powerKmh!;
    expect(t / v, `truck ${t} van ${v}`).toBeGreaterThan(0.6);
    expect(t / v).toBeLessThan(1.6);
    expect(t).toBeGreaterThan(MIN_ADVICE_KMH);
    const abs = adviseSpeed(truck, gd, { seatAwLimit: 99, rideLabel: 'comfort', damper: { absoluteW: 150 } });
    expect(abs.belowMinimum).toBe(true);
    expect(abs.advisedKmh).toBeNull();
  });

  it('when the limits are not met at the floor speed, then there is no figure but the road needs attention', () => {
    const a = adviseSpeed(spec, gdForClass('F'), limits(0.315));
    expect(a.belowMinimum).toBe(true);
    expect(a.advisedKmh).toBeNull();
    expect(a.rideKmh!).toBeLessThan(MIN_ADVICE_KMH);
    expect(ROAD_ATTENTION).toMatch(new RegExp(`needs attention.*${MIN_ADVICE_KMH} km/h.*Report the segment`));
    const ok = adviseSpeed(spec, gdForClass('B'), limits(1));
    expect(ok.advisedKmh!).toBeGreaterThanOrEqual(MIN_ADVICE_KMH);
  });

  it('when the API is asked for a route, then every rated segment gets advice or a call for attention, rougher segments never faster, with the assumptions and caution', async () => {
    type Body = {
      segments: { gdN0: number | null; advisedKmh: number | null; belowMinimum: boolean }[];
      chart: { points: { speedKmh: number; seatWeightedAccel: number; damperPowerRatio: number }[] };
      caution: string;
      assumptions: string[];
      load: { case: string; payloadKg: number };
      damper: { multiple: number | null; absoluteW: number | null; axles: { referencePowerW: number; limitW: number }[] };
      comfort: { key: string; limit: number };
    };
    const r = await driver.get<Body>('/api/routes/1/speed-advice?comfort=fairly&damperMultiple=8');
    expect(r.status).toBe(200);
    expect(r.body.caution).toMatch(/Posted limits/);
    expect(r.body.load.case).toBe('laden');
    expect(r.body.damper.multiple).toBe(8);
    for (const a of r.body.damper.axles) expect(a.limitW).toBeCloseTo(8 * a.referencePowerW, 9);
    const text = r.body.assumptions.join(' ');
    for (const w of [/Load: laden/, /SEAT/, /ρ = 0\.5/, /8× its own mean power on ISO 8608 class B at 80 km\/h/, /No advice below 20 km\/h/]) expect(text).toMatch(w);
    const rated = r.body.segments.filter((s) => s.gdN0 !== null);
    expect(rated.length).toBeGreaterThan(0);
    const speed = (s: Body['segments'][number]) => (s.belowMinimum ? 0 : s.advisedKmh!);
    const sorted = [...rated].sort((a, b) => a.gdN0! - b.gdN0!);
    for (let i = 1; i < sorted.length; i++) expect(speed(sorted[i])).toBeLessThanOrEqual(speed(sorted[i - 1]));
    for (const s of rated) expect(s.belowMinimum || s.advisedKmh! >= MIN_ADVICE_KMH).toBe(true);
    const pts = r.body.chart.points;
    for (let i = 1; i < pts.length; i++) expect(pts[i].damperPowerRatio).toBeGreaterThan(pts[i - 1].damperPowerRatio);

    const un = await driver.get<Body>('/api/routes/1/speed-advice?load=unladen');
    expect(un.body.load).toMatchObject({ case: 'unladen', payloadKg: 0 });
    const daily = await driver.get<Body>('/api/routes/1/speed-advice?comfort=daily-exposure&exposureHours=2');
    expect(daily.status).toBe(200);
    expect(daily.body.comfort.limit).toBeCloseTo(1, 9); // 0.5·√(8/2)
    expect(daily.body.assumptions.join(' ')).toMatch(/2 h a day/);
    const abs = await driver.get<Body>('/api/routes/1/speed-advice?powerLimitW=300&load=laden&payloadKg=500');
    expect(abs.body.damper).toMatchObject({ multiple: null, absoluteW: 300 });
    expect(abs.body.load.payloadKg).toBe(500);

    for (const [qs, field] of [
      ['comfort=bumpy', 'comfort'],
      ['damperMultiple=0.5', 'damperMultiple'],
      ['damperMultiple=lots', 'damperMultiple'],
      ['load=half', 'load'],
      ['exposureHours=0', 'exposureHours'],
      ['exposureHours=30', 'exposureHours'],
      ['load=unladen&payloadKg=300', 'payloadKg'],
      ['payloadKg=-1', 'payloadKg'],
      ['powerLimitW=1', 'powerLimitW'],
      ['speed=50', ''],
    ] as const) {
      const bad = await driver.get<{ error: { fields: Record<string, string> } }>(`/api/routes/1/speed-advice?${qs}`);
      expect(bad.status, qs).toBe(400);
      if (field) expect(bad.body.error.fields[field], qs).toBeTruthy();
    }
  });
});
