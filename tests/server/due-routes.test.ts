import { describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { serverForFile, TEST_NOW } from '../support/server';
import { ApiClient, DEMO } from '../support/client';

const srv = serverForFile();

describe('routes of the vehicles due', () => {
  it('when the due list is read, then each vehicle carries the routes it drove in the 90 days before today, and none from earlier', async () => {
    const c = new ApiClient(srv.url);
    await c.login(DEMO.manager);
    const due = await c.get<{ items: { vehicleId: number; routeIds: number[] }[] }>('/api/inspections/due');
    expect(due.status).toBe(200);
    expect(due.body.items.length).toBeGreaterThan(0);
    const v = due.body.items[0].vehicleId;
    // one trip on another route, long before the window, must not count
    const [other] = await srv.db.sequelize.query<{ id: number }>(
      `SELECT id FROM routes WHERE id NOT IN (SELECT route_id FROM trips WHERE vehicle_id = ?) ORDER BY id LIMIT 1`,
      { replacements: [v], type: QueryTypes.SELECT },
    );
    await srv.db.sequelize.query(
      `INSERT INTO trips (vehicle_id, route_id, driver_id, started_at, ended_at, distance_km, mean_speed_kmh, payload_kg, created_at, updated_at)
       SELECT vehicle_id, ?, driver_id, '2026-06-01 08:00:00.000 +00:00', '2026-06-01 09:00:00.000 +00:00', distance_km, mean_speed_kmh, payload_kg, created_at, updated_at
       FROM trips WHERE vehicle_id = ? LIMIT 1`,
      { replacements: [other.id, v] },
    );
    const trips = await srv.db.sequelize.query<{ route_id: number; started_at: string }>(`SELECT route_id, started_at FROM trips WHERE vehicle_id = ?`, {
      replacements: [v],
      type: QueryTypes.SELECT,
    });
    const from = TEST_NOW.getTime() - 90 * 86_400_000;
    const expected = [...new Set(trips.filter((t) => new Date(t.started_at).getTime() >= from).map((t) => t.route_id))].sort((a, b) => a - b);
    expect(expected.length).toBeGreaterThan(0);
    expect(expected).not.toContain(other.id);

    const again = await c.get<{ items: { vehicleId: number; routeIds: number[] }[] }>('/api/inspections/due');
    const item = again.body.items.find((i) => i.vehicleId === v)!;
    expect(item.routeIds).toEqual(expected);
  });
});
