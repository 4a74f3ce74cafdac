/**
 * The manager's exposure overview: per driver the days driven and above the action and limit
 * values, every day above the action value with the route and vehicle that gave most of its dose,
 * and the routes and vehicles by their share of the dose (a_w²·T), overall and on days above.
 */
import { EXPOSURE_ACTION_VALUE, EXPOSURE_LIMIT_VALUE } from '../physics/exposure';
import type { ExposurePart } from './exposure';
import { exposureRepository } from './exposure-repository';

export /** The floor-to-seat factor(s) a day's trips used, as shown beside its figure ("0.82", or "0.65–0.82" over several specs). */
function seatFactorText(parts: ExposurePart[]): string | null {
  const f = parts.map((p) => p.seatFactor).filter((x): x is number => typeof x === 'number');
  if (!f.length) return null;
  const lo = Math.min(...f).toFixed(2);
  const hi = Math.max(...f).toFixed(2);
  return lo === hi ? lo : `${lo}–${hi}`;
}

export async function exposureOverview(from: string, to: string) {
  const [rows, routes, vehicles] = await Promise.all([exposureRepository.allDays(from, to), exposureRepository.routeNames(), exposureRepository.fleetNumbers()]);
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
  return {
    from,
    to,
    drivers: [...drivers.values()].sort((a, b) => b.maxA8 - a.maxA8),
    daysAbove: daysAbove.sort((a, b) => b.a8 - a.a8),
    routes: contrib(byRoute, (id) => routeName.get(id) ?? `route ${id}`),
    vehicles: contrib(byVehicle, (id) => fleetNo.get(id) ?? `vehicle ${id}`),
  };
}
