import { describe, expect, it } from 'vitest';
import { managerForFile } from '../support/server';
import { DEMO } from '../support/client';
import { modes } from '../../server/physics/quarter-car';
import { PRESETS, checkCorner } from '../../server/fleet/spec-checks';

const { srv, manager } = managerForFile();

async function count(table: string) {
  const [rows] = await srv.db.sequelize.query(`SELECT COUNT(*) AS n FROM ${table}`);
  return Number((rows as { n: number }[])[0].n);
}
async function counts() {
  return { specs: await count('suspension_specs'), axles: await count('spec_axles'), vehicles: await count('vehicles'), dampers: await count('dampers'), depots: await count('depots') };
}

const carAxle = { label: 'front', sprungMassKg: 350, unsprungMassKg: 40, springRateNPerM: 19_960, dampingNsPerM: 1_290, tireRateNPerM: 175_500, ratedDamperLifeKm: 90_000 };
type Err = { error: { fields: Record<string, string>; message: string } };

describe('spec presets and checks', () => {
  it('when presets are checked, then every preset passes the physical-sense checks and sits in its class ranges (docs/methods.md "Typical parameters")', () => {
    for (const p of PRESETS) {
      for (const [i, a] of p.axles.entries()) {
        expect(checkCorner(a, `axles.${i}`), p.name).toEqual({});
        const m = modes(a);
        expect(m.bodyDampingRatio, p.name).toBeGreaterThanOrEqual(0.2);
        expect(m.bodyDampingRatio, p.name).toBeLessThanOrEqual(0.4);
        expect(m.bodyHz, p.name).toBeLessThanOrEqual(p.vehicleClass === 'heavy goods' ? 4 : 1.5);
      }
    }
    // Directive 96/53/EC Annex II: air-equivalent suspension ≤ 2.0 Hz and damping > 20 % of critical
    const air = modes(PRESETS.find((p) => p.key === 'truck-air')!.axles[1]);
    expect(air.bodyHz).toBeLessThanOrEqual(2.0);
    expect(air.bodyDampingRatio).toBeGreaterThan(0.2);
  });

  it('when a spec is previewed, then modes equal the engine (quarter-car modes) and the response has body acceleration and tyre load', async () => {
    const r = await manager.json<{ axles: { modes: ReturnType<typeof modes>; response: { fHz: number; bodyAccel: number; tireLoadN: number }[]; hints: string[] }[] }>('POST', '/api/specs/preview', { vehicleClass: 'passenger car', axles: [carAxle] });
    expect(r.status).toBe(200);
    const m = modes(carAxle);
    expect(r.body.axles[0].modes.bodyHz).toBeCloseTo(m.bodyHz, 9);
    expect(r.body.axles[0].modes.wheelHz).toBeCloseTo(m.wheelHz, 9);
    const resp = r.body.axles[0].response;
    expect(resp.length).toBeGreaterThan(50);
    // the body-acceleration peak near body bounce or wheel hop, tyre load peaks at wheel hop (computed)
    const peak = resp.reduce((a, b) => (b.tireLoadN > a.tireLoadN ? b : a));
    expect(peak.fHz).toBeGreaterThan(m.wheelHz * 0.7);
    expect(peak.fHz).toBeLessThan(m.wheelHz * 1.3);
    expect(r.body.axles[0].hints).toEqual([]);
    const van = await manager.json<{ axles: { hints: string[] }[] }>('POST', '/api/specs/preview', { vehicleClass: 'heavy goods', axles: [carAxle] });
    expect(van.body.axles[0].hints.join()).toContain('Sprung mass 350 kg is outside the typical');
  });

  it('when corner values make no physical sense, then each error names axle, field and unit', async () => {
    const cases: [Record<string, unknown>, string, string][] = [
      [{ sprungMassKg: -5 }, 'axles.0.sprungMassKg', 'kg'],
      [{ unsprungMassKg: 300 }, 'axles.0.unsprungMassKg', 'kg'],
      [{ tireRateNPerM: 15_000 }, 'axles.0.tireRateNPerM', 'N/m'],
      [{ dampingNsPerM: 150 }, 'axles.0.dampingNsPerM', 'N·s/m'],
      [{ springRateNPerM: 6_000_000 }, 'axles.0.springRateNPerM', 'N/m'],
      [{ springRateNPerM: 900_000, tireRateNPerM: 2_000_000, dampingNsPerM: 30_000 }, 'axles.0.springRateNPerM', 'Hz'],
      [{ springRateNPerM: 'soft' }, 'axles.0.springRateNPerM', 'N/m'],
    ];
    for (const [patch, field, unit] of cases) {
      const r = await manager.json<Err>('POST', '/api/specs/preview', { vehicleClass: 'passenger car', axles: [{ ...carAxle, ...patch }] });
      expect(r.status, JSON.stringify(patch)).toBe(400);
      expect(r.body.error.fields[field], JSON.stringify(r.body)).toContain(unit);
    }
  });
});

describe('spec create and edit', () => {
  it('when a manager creates and edits a spec, then it is stored; bad input stores nothing', async () => {
    const before = await counts();
    const bad = await manager.json<Err>('POST', '/api/specs', { name: 'Hatchback', vehicleClass: 'passenger car', axles: [carAxle, { ...carAxle, label: 'rear', unsprungMassKg: 400 }] });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toEqual(['axles.1.unsprungMassKg']);
    const noClass = await manager.json<Err>('POST', '/api/specs', { name: 'Hatchback', vehicleClass: 'boat', axles: [carAxle] });
    expect(Object.keys(noClass.body.error.fields)).toEqual(['vehicleClass']);
    expect(await counts()).toEqual(before);
    const ok = await manager.json<{ spec: { id: number; axles: unknown[] } }>('POST', '/api/specs', { name: 'Hatchback', vehicleClass: 'passenger car', axles: [carAxle, { ...carAxle, label: 'rear' }] });
    expect(ok.status).toBe(201);
    expect(ok.body.spec.axles.length).toBe(2);
    const dup = await manager.json<Err>('POST', '/api/specs', { name: 'Hatchback', vehicleClass: 'passenger car', axles: [carAxle] });
    expect(dup.status).toBe(409);
    const edit = await manager.json<{ spec: { axles: { corner: { dampingNsPerM: number } }[] } }>('PUT', `/api/specs/${ok.body.spec.id}`, { name: 'Hatchback', vehicleClass: 'passenger car', axles: [{ ...carAxle, dampingNsPerM: 1500 }, { ...carAxle, label: 'rear' }] });
    expect(edit.status).toBe(200);
    expect(edit.body.spec.axles[0].corner.dampingNsPerM).toBe(1500);
    expect((await counts()).axles).toBe(before.axles + 2);
    // floor-to-seat factors: the class default until one is entered, then the entered one (docs/methods.md "Exposure at the seat")
    type Seat = { spec: { seat: { seatFactor: number | null; used: { seat: number; total: number; seatSource: string } } } };
    const plain = await manager.get<Seat>(`/api/specs/${ok.body.spec.id}`);
    expect(plain.body.spec.seat.seatFactor).toBeNull();
    expect(plain.body.spec.seat.used.seat).toBe(0.95);
    expect(plain.body.spec.seat.used.seatSource).toMatch(/Griffin/);
    const seat = await manager.json<Seat>('PUT', `/api/specs/${ok.body.spec.id}`, { name: 'Hatchback', vehicleClass: 'passenger car', seatFactor: 0.8, axles: [{ ...carAxle, dampingNsPerM: 1500 }, { ...carAxle, label: 'rear' }] });
    expect(seat.status).toBe(200);
    expect(seat.body.spec.seat.used.total).toBeCloseTo(0.8 * Math.sqrt(0.75), 12);
    const badSeat = await manager.json<Err>('PUT', `/api/specs/${ok.body.spec.id}`, { name: 'Hatchback', vehicleClass: 'passenger car', seatFactor: 5, axles: [carAxle, { ...carAxle, label: 'rear' }] });
    expect(Object.keys(badSeat.body.error.fields)).toEqual(['seatFactor']);
  });

  it('when a spec in use would lose an axle, then the edit is refused and nothing changes', async () => {
    const specs = await manager.get<{ items: { id: number; name: string; vehicleClass: string; axles: { label: string; corner: typeof carAxle; ratedDamperLifeKm: number }[] }[] }>('/api/specs');
    const van = specs.body.items.find((s) => s.name.startsWith('Courier'))!;
    const before = await counts();
    const r = await manager.json<Err>('PUT', `/api/specs/${van.id}`, { name: van.name, vehicleClass: van.vehicleClass, axles: [{ ...van.axles[0].corner, label: 'front', ratedDamperLifeKm: 90000 }] });
    expect(r.status).toBe(409);
    expect(r.body.error.fields.axles).toBeTruthy();
    expect(await counts()).toEqual(before);
  });
});

describe('vehicles and depots', () => {
  it('when a manager creates a vehicle, then it gets a damper on every corner; edits, odometer and retiring follow the rules', async () => {
    const before = await counts();
    const specs = await manager.get<{ items: { id: number; name: string }[] }>('/api/specs');
    const depots = await manager.get<{ items: { id: number }[] }>('/api/depots');
    const specId = specs.body.items.find((s) => s.name.startsWith('Courier'))!.id;
    const v = await manager.json<{ vehicle: { id: number; fleetNumber: string } }>('POST', '/api/vehicles', { fleetNumber: 'CV-900', plate: 'BK26 NEW', specId, depotId: depots.body.items[0].id, odometerKm: 12 });
    expect(v.status).toBe(201);
    expect(await counts()).toMatchObject({ vehicles: before.vehicles + 1, dampers: before.dampers + 4 });
    const detail = await manager.get<{ dampers: { position: string; installedAt: string; installedOdometerKm: number }[] }>(`/api/vehicles/${v.body.vehicle.id}`);
    expect(detail.body.dampers.map((d) => d.position).sort()).toEqual(['FL', 'FR', 'RL', 'RR']);
    expect(detail.body.dampers[0].installedAt).toBe('2026-11-30');

    const back = await manager.json<Err>('PATCH', `/api/vehicles/${v.body.vehicle.id}`, { odometerKm: 5 });
    expect(back.status).toBe(400);
    expect(back.body.error.fields.odometerKm).toContain('km');
    const up = await manager.json<{ vehicle: { odometerKm: number } }>('PATCH', `/api/vehicles/${v.body.vehicle.id}`, { odometerKm: 250 });
    expect(up.body.vehicle.odometerKm).toBe(250);

    const users = await manager.get<{ items: { id: number; role: string; email: string }[] }>('/api/users?pageSize=200');
    const mech = users.body.items.find((u) => u.role === 'mechanic')!;
    const busyDriver = users.body.items.find((u) => u.email === DEMO.driver)!;
    const notDriver = await manager.json<Err>('PATCH', `/api/vehicles/${v.body.vehicle.id}`, { driverId: mech.id });
    expect(notDriver.body.error.fields.driverId).toContain('not a driver');
    const busy = await manager.json<Err>('PATCH', `/api/vehicles/${v.body.vehicle.id}`, { driverId: busyDriver.id });
    expect(busy.body.error.fields.driverId).toContain('already drives');
    const truck = specs.body.items.find((s) => s.name.startsWith('Rigid'))!.id;
    const spec = await manager.json<Err>('PATCH', `/api/vehicles/${v.body.vehicle.id}`, { specId: truck });
    expect(spec.status).toBe(200);
    const retire = await manager.json<{ vehicle: { status: string; driverId: number | null } }>('PATCH', `/api/vehicles/${v.body.vehicle.id}`, { status: 'retired' });
    expect(retire.body.vehicle.status).toBe('retired');

    const mid = await counts();
    const dupe = await manager.json<Err>('POST', '/api/vehicles', { fleetNumber: 'CV-900', plate: 'BK26 NEW', specId, depotId: depots.body.items[0].id });
    expect(dupe.status).toBe(409);
    expect(Object.keys(dupe.body.error.fields).sort()).toEqual(['fleetNumber', 'plate']);
    const badRefs = await manager.json<Err>('POST', '/api/vehicles', { fleetNumber: 'CV-901', plate: 'BK26 NEX', specId: 999, depotId: 999 });
    expect(Object.keys(badRefs.body.error.fields).sort()).toEqual(['depotId', 'specId']);
    const badShape = await manager.json<Err>('POST', '/api/vehicles', { fleetNumber: 'CV 9!', plate: '', specId: 'x', depotId: 1, odometerKm: -1 });
    expect(Object.keys(badShape.body.error.fields).sort()).toEqual(['fleetNumber', 'odometerKm', 'plate', 'specId']);
    expect(await counts()).toEqual(mid);
  });

  it('when a manager creates and edits a depot, then it is stored; bad coordinates name their field', async () => {
    const before = await counts();
    const bad = await manager.json<Err>('POST', '/api/depots', { name: 'Far', lat: 120, lon: 0 });
    expect(bad.body.error.fields.lat).toContain('°');
    expect(await counts()).toEqual(before);
    const ok = await manager.json<{ depot: { id: number; name: string } }>('POST', '/api/depots', { name: 'Ashby Hub', lat: 52.75, lon: -1.47 });
    expect(ok.status).toBe(201);
    const ed = await manager.json<{ depot: { address: string } }>('PATCH', `/api/depots/${ok.body.depot.id}`, { address: '1 Hub Road' });
    expect(ed.body.depot.address).toBe('1 Hub Road');
    const dup = await manager.json<Err>('PATCH', `/api/depots/${ok.body.depot.id}`, { name: 'Brackenford North Yard' });
    expect(dup.status).toBe(409);
  });
});
