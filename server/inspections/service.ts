/**
 * The scheduling phase of the nightly run and the due list. Rules: server/inspections/schedule.ts.
 *
 * Assignment (stated rule): a new inspection goes to the active mechanic of the vehicle's depot
 * with the fewest open inspections (lowest id on a tie); none when the depot has no mechanic.
 */
import type { Sequelize } from 'sequelize';
import { decide, openStatus, type ScheduleRules } from './schedule';
import { plusDays } from '../wear/wear';
import { localDay, startOfLocalDay } from '../wear/repository';
import { inspectionRepository } from './repository';
import { idRanges } from '../db/raw';

/** Vehicles the scheduling reads at once (their predictions, inspections and recent distance). */
export const SCHEDULE_VEHICLES_PER_READ = 5000;

export interface ScheduleContext {
  sequelize: Sequelize;
  now: Date;
  asOf: string;
  timeZone: string;
  rules: ScheduleRules;
  runId: number;
  errors: { item: string; message: string }[];
  counts: Record<string, number>;
  /** Vehicles read at once (default {@link SCHEDULE_VEHICLES_PER_READ}). */
  vehiclesPerRead?: number;
}

export async function runSchedule(ctx: ScheduleContext) {
  const repo = inspectionRepository(ctx.sequelize);
  const today = ctx.asOf;
  const windowFrom = startOfLocalDay(plusDays(today, -29), ctx.timeZone);
  const before = startOfLocalDay(plusDays(today, 1), ctx.timeZone);
  const mechanics = await repo.mechanics();
  const load = new Map(mechanics.map((m) => [m.id, Number(m.open)]));
  const create = [];
  const move = [];
  const status = [];
  let due = 0;
  let overdue = 0;
  let movedToOverdue = 0;
  // the fleet a range of vehicles at a time: a vehicle's decision reads only its own rows, and
  // what carries from one range to the next is the mechanics' load
  for (const range of idRanges(await repo.vehicleIds(), ctx.vehiclesPerRead ?? SCHEDULE_VEHICLES_PER_READ)) {
    const [vehicles, forecasts, lastDone, followUps, km30, open] = await Promise.all([
      repo.vehicles(range),
      repo.forecasts(range),
      repo.lastDone((d) => localDay(d, ctx.timeZone), range),
      repo.followUps((d) => localDay(d, ctx.timeZone), range),
      repo.distanceSince(windowFrom, before, range),
      repo.open(range),
    ]);
    const openByVehicle = new Map(open.map((o) => [o.vehicleId, o]));
    const moved = new Map<number, string>();
    for (const v of vehicles) {
      try {
        const decision = decide(
          {
            today,
            vehicle: { id: v.id, fleetNumber: v.fleet_number, odometerKm: v.odometer_km, commissionedAt: v.commissioned_at },
            corners: forecasts.get(v.id) ?? [],
            lastDone: lastDone.get(v.id) ?? null,
            kmPerDay: (km30.get(v.id) ?? 0) / 30,
            open: openByVehicle.get(v.id) ?? null,
            followUp: followUps.get(v.id) ?? null,
          },
          ctx.rules,
        );
        if (decision.action === 'create') {
          const c = decision.candidate;
          const candidates = mechanics.filter((m) => m.depot_id === v.depot_id);
          let assigneeId: number | null = null;
          for (const m of candidates) if (assigneeId === null || load.get(m.id)! < load.get(assigneeId)!) assigneeId = m.id;
          if (assigneeId !== null) load.set(assigneeId, load.get(assigneeId)! + 1);
          create.push({ vehicleId: v.id, dueDate: c.dueDate, status: decision.status, trigger: c.trigger, reason: c.reason, basis: JSON.stringify(c.basis), assigneeId });
        } else if (decision.action === 'move') {
          const c = decision.candidate;
          move.push({ id: decision.id, dueDate: c.dueDate, status: decision.status, trigger: c.trigger, reason: c.reason, basis: JSON.stringify(c.basis) });
          moved.set(decision.id, decision.status);
        }
      } catch (err) {
        ctx.errors.push({ item: `vehicle ${v.id}`, message: (err as Error).message });
      }
    }
    for (const o of open) {
      if (moved.has(o.id)) {
        if (moved.get(o.id) === 'overdue' && o.status !== 'overdue') movedToOverdue++;
        continue;
      }
      const s = openStatus(o.dueDate, today, ctx.rules.dueSoonDays);
      if (s !== o.status) {
        status.push({ id: o.id, status: s });
        if (s === 'due') due++;
        if (s === 'overdue') overdue++;
      }
    }
  }
  await repo.apply({ create, move, status, now: ctx.now, runId: ctx.runId });
  ctx.counts.inspectionsCreated = create.length;
  ctx.counts.inspectionsMovedEarlier = move.length;
  ctx.counts.inspectionsNowDue = due + create.filter((c) => c.status === 'due').length;
  // a damper past its end of life creates (or moves) an inspection that is overdue at once
  ctx.counts.inspectionsNowOverdue = overdue + create.filter((c) => c.status === 'overdue').length + movedToOverdue;
}

export function inspectionService(sequelize: Sequelize) {
  const repo = inspectionRepository(sequelize);
  return {
    dueList: repo.dueList,
    nextForVehicle: repo.nextForVehicle,
  };
}
