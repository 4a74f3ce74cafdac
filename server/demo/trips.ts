/** The demo fleet's 60 days of trips. */
import { subDays } from 'date-fns';
import type { CreationAttributes } from 'sequelize';
import { Trip, type User } from '../db/models';
import { MAX_TRIP_HOURS, maxPayloadKg } from './fleet-data';
import type { DemoVehicle } from './fleet';
import type { DemoRoute } from './roads';
import type { SeedContext } from './seed-context';

/** Trips: one a working day per vehicle over 60 days, each a day's work on one route. */
export async function seedTrips(ctx: SeedContext, vehicles: DemoVehicle[], routeRows: DemoRoute[], drivers: User[]) {
  const { opts, rand, today } = ctx;
  // Trips: one a working day per vehicle, a day's work on one route — the loop driven as many
  // times as the vehicle's daily distance needs. Payload within the vehicle's gross mass.
  const tripRows: CreationAttributes<Trip>[] = [];
  const kmByVehicle = new Map<number, number>();
  const roughKmByVehicle = new Map<number, number>();
  for (const [vi, { v, spec, depotIdx, workingDayKm }] of vehicles.entries()) {
    if (v.status === 'retired') continue;
    const myRoutes = routeRows.filter((r) => r.depotIdx === depotIdx && (spec.prefix === 'RT' ? true : !r.route.name.includes('aggregates')));
    const favourite = myRoutes[vi % myRoutes.length];
    const afternoonDriver = v.driverId ? null : drivers[(vi - drivers.length) * 2 % drivers.length];
    const [pmin, pmax] = spec.payloadKg;
    const payloadCap = Math.min(pmax, maxPayloadKg(spec));
    let km = 0;
    let roughKm = 0;
    for (let d = 60; d >= 1; d--) {
      const date = subDays(today, d);
      const dow = date.getUTCDay();
      if (dow === 0 || dow === 6) continue;
      if (v.status === 'workshop' && d < 4) continue;
      if (rand() < 0.08) continue; // days off, holidays
      const r = rand() < 0.7 ? favourite : myRoutes[Math.floor(rand() * myRoutes.length)];
      const speed = Math.round(r.speedKmh * (0.85 + rand() * 0.25) * 10) / 10;
      const loopKm = r.route.lengthM / 1000;
      // at most MAX_TRIP_HOURS at the day's speed, so a driver's morning and afternoon shifts do not overlap
      const rounds = Math.max(1, Math.min(Math.floor((MAX_TRIP_HOURS * speed) / loopKm), Math.round((workingDayKm * (0.85 + rand() * 0.3)) / loopKm)));
      const distanceKm = Math.round(loopKm * rounds * 10) / 10;
      const hours = distanceKm / speed;
      const startMin = afternoonDriver ? 14 * 60 + Math.floor(rand() * 60) : 5 * 60 + 30 + Math.floor(rand() * 90);
      const startedAt = new Date(date.getTime() + startMin * 60_000);
      const endedAt = new Date(startedAt.getTime() + hours * 3_600_000);
      tripRows.push({
        vehicleId: v.id,
        routeId: r.route.id,
        driverId: v.driverId ?? afternoonDriver?.id ?? null,
        startedAt,
        endedAt,
        distanceKm,
        meanSpeedKmh: speed,
        payloadKg: Math.round(pmin + rand() * (payloadCap - pmin)),
      });
      km += distanceKm;
      roughKm += distanceKm * r.roughShare;
    }
    kmByVehicle.set(v.id, km);
    roughKmByVehicle.set(v.id, roughKm);
  }
  await Trip.bulkCreate(tripRows, opts);
  return { tripRows, kmByVehicle, roughKmByVehicle };
}
