import { describe, expect, it } from 'vitest';
import { isoDay, isRealDay, parseIsoDateTime } from '../../server/http/validate';
import { managerForFile } from '../support/server';
import { ApiClient, DEMO } from '../support/client';

describe('the date schema', () => {
  it('when a day does not exist, then it is refused; leap days only in leap years (Gregorian rule: every 4th year, not centuries unless divisible by 400)', () => {
    for (const s of ['2026-02-29', '2026-02-31', '2026-04-31', '2026-13-01', '2026-00-10', '9999-99-99', '2100-02-29', '1900-02-29']) expect(isRealDay(s), s).toBe(false);
    for (const s of ['2028-02-29', '2000-02-29', '2026-12-31', '2026-01-01']) expect(isRealDay(s), s).toBe(true);
  });

  it('when a real day lies outside 2000–2099, then the API schema refuses it with the range', () => {
    expect(isoDay.safeParse('2026-11-30').success).toBe(true);
    const r = isoDay.safeParse('1999-12-31');
    expect(r.success).toBe(false);
    expect(r.error?.issues[0].message).toMatch(/between 2000-01-01 and 2099-12-31/);
    expect(isoDay.safeParse('2026-02-31').error?.issues.map((i) => i.message)).toEqual(['must be a real calendar date (e.g. 2026-02-28, not 2026-02-31)']);
  });

  it('when a date-time names a day or time that does not exist, then it is refused instead of rolled over', () => {
    expect(parseIsoDateTime('2026-02-30T08:00:00Z')).toBeNull();
    expect(parseIsoDateTime('2026-03-01T24:00:00Z')).toBeNull();
    expect(parseIsoDateTime('2026-03-01T08:60:00Z')).toBeNull();
    expect(parseIsoDateTime('2026-03-01T08:00:00+01:00')?.toISOString()).toBe('2026-03-01T07:00:00.000Z');
    expect(parseIsoDateTime('2026-03-01 08:00')?.toISOString()).toBe('2026-03-01T08:00:00.000Z');
  });
});

describe('impossible dates at the API', () => {
  const { srv, manager } = managerForFile();
  type Err = { error: { fields: Record<string, string> } };

  it('when the nightly run is asked for 2026-02-31 or a day after today, then 400 and no run starts', async () => {
    const before = (await manager.get<{ total: number }>('/api/jobs/runs')).body.total;
    const bad = await manager.json<Err>('POST', '/api/jobs/nightly/run', { asOf: '2026-02-31' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.asOf).toMatch(/real calendar date/);
    const future = await manager.json<Err>('POST', '/api/jobs/nightly/run', { asOf: '2026-12-01' });
    expect(future.status).toBe(400);
    expect(future.body.error.fields.asOf).toMatch(/on or before 2026-11-30/);
    expect((await manager.get<{ total: number }>('/api/jobs/runs')).body.total).toBe(before);
  });

  it('when an inspection is given the due date 9999-99-99, then 400 and the due date stays', async () => {
    const insp = (await manager.get<{ items: { id: number; dueDate: string }[] }>('/api/inspections?status=open')).body.items[0];
    const r = await manager.json<Err>('PATCH', `/api/inspections/${insp.id}`, { dueDate: '9999-99-99' });
    expect(r.status).toBe(400);
    expect((await manager.get<{ dueDate: string }>(`/api/inspections/${insp.id}`)).body.dueDate).toBe(insp.dueDate);
  });

  it('when a trip starts on 2026-02-30, then 400 naming the field (not stored as 2 March)', async () => {
    const vehicleId = (await manager.get<{ items: { id: number }[] }>('/api/vehicles?q=CV-110')).body.items[0].id;
    const routeId = (await manager.get<{ items: { id: number }[] }>('/api/routes?q=Tanner')).body.items[0].id;
    const r = await manager.json<Err>('POST', '/api/trips', { vehicleId, routeId, startedAt: '2026-02-30T08:00:00Z', endedAt: '2026-03-02T08:30:00Z', distanceKm: 14, meanSpeedKmh: 30 });
    expect(r.status).toBe(400);
    expect(r.body.error.fields.startedAt).toMatch(/real ISO 8601/);
  });

  it('when a work record is dated in 2099, then 400 and no damper is fitted', async () => {
    const mech = new ApiClient(srv.url);
    await mech.login(DEMO.mechanic);
    const me = (await manager.get<{ items: { email: string; depotId: number }[] }>('/api/users?role=mechanic')).body.items.find((u) => u.email === DEMO.mechanic)!;
    const v = (await manager.get<{ items: { id: number; depotId: number; odometerKm: number }[] }>('/api/vehicles?pageSize=200&status=in_service')).body.items.find((x) => x.depotId === me.depotId)!;
    const before = (await manager.get<{ corners: { damperId: number; position: string }[] }>(`/api/vehicles/${v.id}/workshop`)).body.corners;
    const r = await mech.json<Err>('POST', '/api/work-records', {
      vehicleId: v.id, performedOn: '2099-06-01', odometerKm: v.odometerKm + 10, summary: 'Dated far ahead', labourHours: 1,
      items: [{ position: before[0].position, component: 'damper', partDescription: 'Twin-tube damper', cost: 100, removalReason: 'leaking' }],
    });
    expect(r.status).toBe(400);
    expect(r.body.error.fields.performedOn).toMatch(/on or before 2026-12-01/);
    const after = (await manager.get<{ corners: { damperId: number }[] }>(`/api/vehicles/${v.id}/workshop`)).body.corners;
    expect(after.map((c) => c.damperId)).toEqual(before.map((c) => c.damperId));
  });
});
