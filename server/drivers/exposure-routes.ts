/** Exposure API: a driver's own days; the manager's overview of every driver. */
import type { Router } from 'express';
import { QueryTypes } from 'sequelize';
import { z } from 'zod';
import { allow, currentUser } from '../http/access';
import { isoDay, parse } from '../http/validate';
import { AppError } from '../errors';
import { DriverExposureDay } from '../db/driver-models';
import { EXPOSURE_ACTION_VALUE, EXPOSURE_LIMIT_VALUE } from '../physics/exposure';
import { EXPOSURE_CAUTION, EXPOSURE_METHOD, type ExposurePart } from './exposure';
import { localDay, plusDays } from '../lib/days';

const isoDate = isoDay;

function range(q: { from?: string; to?: string }, today: string) {
  const to = q.to ?? today;
  const from = q.from ?? plusDays(to, -29);
  if (from > to) throw AppError.badRequest('Some values in the query are not valid.', { from: 'must not be after to' });
  if (Date.parse(to) - Date.parse(from) > 400 * 86_400_000) throw AppError.badRequest('Some values in the query are not valid.', { from: 'the range must be at most 400 days' });
  return { from, to };
}

const base = { actionValue: EXPOSURE_ACTION_VALUE, limitValue: EXPOSURE_LIMIT_VALUE, caution: EXPOSURE_CAUTION, method: EXPOSURE_METHOD };

/** The floor-to-seat factor(s) a day's trips used, as shown beside its figure ("0.82", or "0.65–0.82" over several specs). */
function seatFactorText(parts: ExposurePart[]): string | null {
  const f = parts.map((p) => p.seatFactor).filter((x): x is number => typeof x === 'number');
  if (!f.length) return null;
  const lo = Math.min(...f).toFixed(2);
  const hi = Math.max(...f).toFixed(2);
  return lo === hi ? lo : `${lo}–${hi}`;
}

export function registerExposureRoutes(api: Router, ctx: { now: () => Date; timeZone: string }) {
  const today = () => localDay(ctx.now(), ctx.timeZone);

  api.get('/exposure', allow('driver', 'manager'), async (req, res) => {
    const q = parse(z.object({ driverId: z.coerce.number({ message: 'must be an id' }).int().positive('must be an id').optional(), from: isoDate.optional(), to: isoDate.optional() }).strict(), req.query, 'query');
    const user = currentUser(req);
    if (user.role === 'driver' && q.driverId !== undefined && q.driverId !== user.id) throw AppError.forbidden('Drivers see only their own exposure.');
    if (user.role === 'manager' && q.driverId === undefined) throw AppError.badRequest('Choose a driver.', { driverId: 'is required (the overview of every driver is /api/exposure/overview)' });
    const driverId = q.driverId ?? user.id;
    const { from, to } = range(q, today());
    const [driver] = await DriverExposureDay.sequelize!.query<{ id: number; name: string; role: string }>(`SELECT id, name, role FROM users WHERE id = ?`, { replacements: [driverId], type: QueryTypes.SELECT });
    if (!driver || driver.role !== 'driver') throw AppError.notFound('Driver');
    const rows = await DriverExposureDay.sequelize!.query<{ day: string; a8: number; hours: number; trips: number; max_weighted_accel: number; status: string; parts: string }>(
      `SELECT day, a8, hours, trips, max_weighted_accel, status, parts FROM driver_exposure_days WHERE driver_id = ? AND day >= ? AND day <= ? ORDER BY day`,
      { replacements: [driverId, from, to], type: QueryTypes.SELECT },
    );
    const days = rows.map((r) => ({ day: r.day, a8: r.a8, hours: r.hours, trips: r.trips, maxWeightedAccel: r.max_weighted_accel, status: r.status, seatFactor: seatFactorText(JSON.parse(r.parts) as ExposurePart[]) }));
    res.json({
      ...base,
      driver: { id: driver.id, name: driver.name },
      from,
      to,
      days,
      summary: {
        daysDriven: days.length,
        daysAboveAction: days.filter((d) => d.a8 > EXPOSURE_ACTION_VALUE).length,
        daysAboveLimit: days.filter((d) => d.a8 > EXPOSURE_LIMIT_VALUE).length,
        maxA8: days.length ? Math.max(...days.map((d) => d.a8)) : null,
      },
    });
  });

  api.get('/exposure/overview', allow('manager'), async (req, res) => {
    const q = parse(z.object({ from: isoDate.optional(), to: isoDate.optional() }).strict(), req.query, 'query');
    const { from, to } = range(q, today());
    const sq = DriverExposureDay.sequelize!;
    const rows = await sq.query<{ driver_id: number; name: string; day: string; a8: number; hours: number; trips: number; parts: string }>(
      `SELECT e.driver_id, u.name, e.day, e.a8, e.hours, e.trips, e.parts FROM driver_exposure_days e JOIN users u ON u.id = e.driver_id WHERE e.day >= ? AND e.day <= ? ORDER BY e.day`,
      { replacements: [from, to], type: QueryTypes.SELECT },
    );
    const [routes, vehicles] = await Promise.all([
      sq.query<{ id: number; name: string }>(`SELECT id, name FROM routes`, { type: QueryTypes.SELECT }),
      sq.query<{ id: number; fleet_number: string }>(`SELECT id, fleet_number FROM vehicles`, { type: QueryTypes.SELECT }),
    ]);
    const routeName = new Map(routes.map((r) => [r.id, r.name]));
    const fleetNo = new Map(vehicles.map((v) => [v.id, v.fleet_number]));
    const drivers = new Map<number, { driverId: number; name: string; daysDriven: number; daysAboveAction: number; daysAboveLimit: number; maxA8: number; lastDay: string }>();
    // Dose a_w²·T [m²/s⁴·h] by route and vehicle: over all days, and over the days above the action value.
    const byRoute = new Map<number, { dose: number; doseAbove: number; hours: number; daysAbove: Set<string> }>();
    const byVehicle = new Map<number, { dose: number; doseAbove: number; hours: number; daysAbove: Set<string> }>();
    const add = (m: typeof byRoute, id: number, p: ExposurePart, above: boolean, key: string) => {
      const e = m.get(id) ?? { dose: 0, doseAbove: 0, hours: 0, daysAbove: new Set<string>() };
      const dose = p.aw * p.aw * p.hours;
      e.dose += dose;
      e.hours += p.hours;
      if (above) {
        e.doseAbove += dose;
        e.daysAbove.add(key);
      }
      m.set(id, e);
    };
    const daysAbove = [];
    let totalDose = 0;
    let totalDoseAbove = 0;
    for (const r of rows) {
      const above = r.a8 > EXPOSURE_ACTION_VALUE;
      const d = drivers.get(r.driver_id) ?? { driverId: r.driver_id, name: r.name, daysDriven: 0, daysAboveAction: 0, daysAboveLimit: 0, maxA8: 0, lastDay: r.day };
      d.daysDriven += 1;
      if (above) d.daysAboveAction += 1;
      if (r.a8 > EXPOSURE_LIMIT_VALUE) d.daysAboveLimit += 1;
      d.maxA8 = Math.max(d.maxA8, r.a8);
      d.lastDay = r.day;
      drivers.set(r.driver_id, d);
      const parts = JSON.parse(r.parts) as ExposurePart[];
      for (const p of parts) {
        const dose = p.aw * p.aw * p.hours;
        totalDose += dose;
        if (above) totalDoseAbove += dose;
        add(byRoute, p.routeId, p, above, `${r.driver_id}|${r.day}`);
        add(byVehicle, p.vehicleId, p, above, `${r.driver_id}|${r.day}`);
      }
      if (above) {
        const top = [...parts].sort((a, b) => b.aw * b.aw * b.hours - a.aw * a.aw * a.hours)[0];
        daysAbove.push({ driverId: r.driver_id, name: r.name, day: r.day, a8: r.a8, hours: r.hours, trips: r.trips, seatFactor: seatFactorText(parts), status: r.a8 > EXPOSURE_LIMIT_VALUE ? 'exceeds-limit-value' : 'exceeds-action-value', topRoute: top ? routeName.get(top.routeId) ?? null : null, topVehicle: top ? fleetNo.get(top.vehicleId) ?? null : null });
      }
    }
    const contrib = (m: typeof byRoute, label: (id: number) => string) =>
      [...m.entries()]
        .map(([id, e]) => ({ id, name: label(id), hours: e.hours, meanWeightedAccel: e.hours > 0 ? Math.sqrt(e.dose / e.hours) : 0, sharePct: totalDose > 0 ? (100 * e.dose) / totalDose : 0, shareAbovePct: totalDoseAbove > 0 ? (100 * e.doseAbove) / totalDoseAbove : 0, daysAbove: e.daysAbove.size }))
        .sort((a, b) => b.shareAbovePct - a.shareAbovePct || b.sharePct - a.sharePct)
        .slice(0, 10);
    res.json({
      ...base,
      from,
      to,
      drivers: [...drivers.values()].sort((a, b) => b.maxA8 - a.maxA8),
      daysAbove: daysAbove.sort((a, b) => b.a8 - a.a8),
      routes: contrib(byRoute, (id) => routeName.get(id) ?? `route ${id}`),
      vehicles: contrib(byVehicle, (id) => fleetNo.get(id) ?? `vehicle ${id}`),
    });
  });
}
