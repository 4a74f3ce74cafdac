import { describe, expect, it } from 'vitest';
import { managerForFile } from '../support/server';

const { srv, manager } = managerForFile();

async function tripCount() {
  const [rows] = await srv.db.sequelize.query('SELECT COUNT(*) AS n FROM trips');
  const [imports] = await srv.db.sequelize.query('SELECT COUNT(*) AS n FROM trip_imports');
  return { trips: Number((rows as { n: number }[])[0].n), imports: Number((imports as { n: number }[])[0].n) };
}

function send(csv: string, preview: boolean) {
  const form = new FormData();
  form.set('file', new Blob([csv], { type: 'text/csv' }), 'trips.csv');
  return manager.raw('POST', `/api/trips/import${preview ? '?preview=true' : ''}`, { form });
}

const HEADER = 'vehicle,route,driver_email,start,end,distance_km,mean_speed_kmh,payload_kg';
// TEST_NOW is 2026-11-30T12:00Z; the demo trips end the day before, so 2026-11-30 morning is free
const good = [
  'CV-101,Tanner Way town loop,driver@reboundry.test,2026-11-30T06:00:00Z,2026-11-30T06:40:00Z,14,32,300',
  'CV-102,Northgate retail park,,2026-11-30T06:00:00Z,2026-11-30T06:45:00Z,18,40,',
];

interface Report {
  total: number;
  ok: number;
  bad: number;
  rows: { row: number; ok: boolean; problems: string[] }[];
}

describe('trip import', () => {
  it('when a file has one bad row of each kind, then the preview reports each row, and importing imports nothing', async () => {
    const csv = [
      HEADER,
      ...good,
      'XX-999,Tanner Way town loop,,2026-11-30T08:00:00Z,2026-11-30T08:30:00Z,10,30,', // row 4: unknown vehicle
      'CV-103,Nowhere Road,,2026-11-30T08:00:00Z,2026-11-30T08:30:00Z,10,30,', // row 5: unknown route
      'CV-104,Tanner Way town loop,nobody@example.test,2026-11-30T08:00:00Z,2026-11-30T08:30:00Z,10,30,', // row 6: unknown driver
      'CV-101,Tanner Way town loop,,2026-11-30T06:20:00Z,2026-11-30T06:50:00Z,10,30,', // row 7: overlaps row 2
      'CV-105,Tanner Way town loop,,2026-11-30T08:00:00Z,2026-11-30T08:10:00Z,60,360,', // row 8: impossible speed
      'CV-106,Tanner Way town loop,,2026-11-30T08:00:00Z,2026-11-30T09:00:00Z,90,40,', // row 9: 90 km in 1 h at 40 km/h
    ].join('\n');
    const before = await tripCount();
    const res = await send(csv, true);
    expect(res.status).toBe(200);
    const rep = (await res.json()) as Report;
    expect(rep.total).toBe(8);
    expect(rep.ok).toBe(2);
    const byRow = new Map(rep.rows.map((r) => [r.row, r.problems.join('; ')]));
    expect(byRow.get(2)).toBe('');
    expect(byRow.get(4)).toContain('unknown vehicle "XX-999"');
    expect(byRow.get(5)).toContain('unknown route "Nowhere Road"');
    expect(byRow.get(6)).toContain('unknown driver "nobody@example.test"');
    expect(byRow.get(7)).toContain('overlaps row 2');
    expect(byRow.get(8)).toContain('impossible speed');
    expect(byRow.get(9)).toContain('impossible speed');
    expect(await tripCount()).toEqual(before);

    const imp = await send(csv, false);
    expect(imp.status).toBe(400);
    const err = (await imp.json()) as { error: { code: string; fields: Record<string, string> } };
    expect(err.error.code).toBe('import_rejected');
    expect(Object.keys(err.error.fields).sort()).toEqual(['row 4', 'row 5', 'row 6', 'row 7', 'row 8', 'row 9']);
    expect(await tripCount()).toEqual(before);
  });

  it('when a clean file is imported, then every row is stored in one import; importing it again overlaps and is refused', async () => {
    const csv = [HEADER, ...good].join('\n');
    const before = await tripCount();
    const res = await send(csv, false);
    expect(res.status).toBe(201);
    expect(((await res.json()) as { imported: number }).imported).toBe(2);
    expect(await tripCount()).toEqual({ trips: before.trips + 2, imports: before.imports + 1 });
    const again = await send(csv, true);
    const rep = (await again.json()) as Report;
    expect(rep.rows.every((r) => r.problems.some((p) => p.includes('overlaps trip #')))).toBe(true);
    const list = await manager.get<{ items: { fleetNumber: string; routeName: string }[]; total: number }>('/api/trips?from=2026-11-30&to=2026-11-30&sort=fleetNumber');
    expect(list.body.items.map((t) => t.fleetNumber)).toEqual(['CV-101', 'CV-102']);
  });

  it('when the file itself is wrong, then the error names the row or file and nothing is stored', async () => {
    const before = await tripCount();
    const cases: [string, string][] = [
      ['vehicle,route\nCV-101,x', 'row 1'],
      ['', 'file'],
      [HEADER + '\n', 'file'],
      [HEADER + '\nCV-101,Tanner Way town loop,,yesterday,2026-11-30T06:40:00Z,14,32,', 'row 2'],
    ];
    for (const [csv, field] of cases) {
      const r = await send(csv, false);
      const b = (await r.json()) as { error: { fields: Record<string, string> } };
      expect(r.status, csv).toBe(400);
      expect(Object.keys(b.error.fields), JSON.stringify(b)).toContain(field);
    }
    const noFile = await manager.raw('POST', '/api/trips/import', { form: new FormData() });
    expect(noFile.status).toBe(400);
    expect(await tripCount()).toEqual(before);
  });
});

describe('manual trip entry', () => {
  it('when a manager enters a trip, then it is stored; bad values name their field and store nothing', async () => {
    const vehicles = await manager.get<{ items: { id: number; fleetNumber: string }[] }>('/api/vehicles?q=CV-110');
    const routes = await manager.get<{ items: { id: number }[] }>('/api/routes?q=Tanner');
    const base = { vehicleId: vehicles.body.items[0].id, routeId: routes.body.items[0].id, startedAt: '2026-11-30T09:00:00Z', endedAt: '2026-11-30T09:30:00Z', distanceKm: 14, meanSpeedKmh: 30 };
    const before = await tripCount();
    const bad: [unknown, string][] = [
      [{ ...base, vehicleId: 99999 }, 'vehicleId'],
      [{ ...base, routeId: 99999 }, 'routeId'],
      [{ ...base, driverId: 1 }, 'driverId'],
      [{ ...base, endedAt: '2026-11-30T08:00:00Z' }, 'endedAt'],
      [{ ...base, meanSpeedKmh: 400 }, 'meanSpeedKmh'],
      [{ ...base, distanceKm: 100 }, 'meanSpeedKmh'],
      [{ ...base, startedAt: 'soon' }, 'startedAt'],
    ];
    for (const [body, field] of bad) {
      const r = await manager.json<{ error: { fields: Record<string, string> } }>('POST', '/api/trips', body);
      expect(r.status, JSON.stringify(body)).toBe(400);
      expect(Object.keys(r.body.error.fields), JSON.stringify(r.body)).toContain(field);
    }
    expect(await tripCount()).toEqual(before);
    const ok = await manager.json<{ id: number }>('POST', '/api/trips', { ...base, payloadKg: 200 });
    expect(ok.status).toBe(201);
    const dup = await manager.json<{ error: { fields: Record<string, string> } }>('POST', '/api/trips', base);
    expect(dup.body.error.fields.startedAt).toContain('overlaps');
    expect((await tripCount()).trips).toBe(before.trips + 1);
  });

  it('when the trip list is asked with a bad sort or filter, then it names the field', async () => {
    const r = await manager.get<{ error: { fields: Record<string, string> } }>('/api/trips?sort=colour&from=12-1-2026');
    expect(r.status).toBe(400);
    expect(Object.keys(r.body.error.fields).sort()).toEqual(['from', 'sort']);
  });
});
