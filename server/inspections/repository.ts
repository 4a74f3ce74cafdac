/**
 * Inspections as the nightly job and the due list see them (plain objects out; SQL in).
 */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { sqlDate } from '../wear/repository';
import { sqlFor } from '../db/dialect';
import { inRange, rangeParams, type VehicleRange } from '../db/raw';
import type { CornerForecast, FollowUp } from './schedule';
import type { DueInspection, OpenInspectionStatus } from '../contracts/inspections';

export interface OpenInspection {
  id: number;
  vehicleId: number;
  dueDate: string;
  status: string;
  trigger: string | null;
  assigneeId: number | null;
  reason: string;
  basis: Record<string, unknown> | null;
}

/** An open inspection as the due list answers it (server/contracts/inspections.ts). */
export type DueItem = DueInspection;

/** Orders of the due list: by due date (then fleet number), or most-worn damper first (then due date). */
export const DUE_SORTS = ['due', 'lifeUsed'] as const;
export type DueSort = (typeof DUE_SORTS)[number];

const byLifeUsed = (a: DueItem, b: DueItem) =>
  (b.maxLifeUsed ?? -Infinity) - (a.maxLifeUsed ?? -Infinity) || (a.dueDate < b.dueDate ? -1 : a.dueDate > b.dueDate ? 1 : 0) || a.fleetNumber.localeCompare(b.fleetNumber);

/**
 * A query over inspections limited to a range of vehicles, driven from the range's vehicles:
 * `FROM ${byVehicles(range)}inspections i WHERE …${byVehiclesOn('i', range)}`. CROSS JOIN keeps
 * SQLite to that order (vehicles, then each one's inspections by the vehicle index); left to
 * itself it takes the status index and reads every inspection of that status once per range.
 */
const byVehicles = (range?: VehicleRange) => (range ? 'vehicles rv CROSS JOIN ' : '');
const byVehiclesOn = (alias: string, range?: VehicleRange) => (range ? ` AND ${alias}.vehicle_id = rv.id AND rv.id BETWEEN ? AND ?` : '');

export function inspectionRepository(sequelize: Sequelize) {
  const q = <T extends object>(sql: string, replacements: unknown[] = [], transaction?: Transaction) =>
    sequelize.query<T>(sql, { replacements: replacements as never, type: QueryTypes.SELECT, transaction });

  return {
    /** Every vehicle's id, in order (the scheduling reads the fleet in ranges of them). */
    async vehicleIds(): Promise<number[]> {
      return (await q<{ id: number }>(`SELECT id FROM vehicles ORDER BY id`)).map((r) => r.id);
    },

    async vehicles(range?: VehicleRange) {
      return q<{ id: number; fleet_number: string; odometer_km: number; commissioned_at: string | null; depot_id: number }>(
        `SELECT id, fleet_number, odometer_km, commissioned_at, depot_id FROM vehicles WHERE status != 'retired'${inRange('id', range)} ORDER BY id`,
        rangeParams(range),
      );
    },

    async forecasts(range?: VehicleRange): Promise<Map<number, CornerForecast[]>> {
      const rows = await q<{ vehicle_id: number; position: string; life_used_fraction: number; threshold_date: string | null; end_of_life_date: string | null; spring_damage: number; spring_threshold_date: string | null }>(
        `SELECT p.vehicle_id, d.position, p.life_used_fraction, p.threshold_date, p.end_of_life_date, p.spring_damage, p.spring_threshold_date
         FROM damper_predictions p JOIN dampers d ON d.id = p.damper_id WHERE d.removed_at IS NULL${inRange('p.vehicle_id', range)} ORDER BY p.vehicle_id, d.position`,
        rangeParams(range),
      );
      const out = new Map<number, CornerForecast[]>();
      for (const r of rows) {
        if (!out.has(r.vehicle_id)) out.set(r.vehicle_id, []);
        out.get(r.vehicle_id)!.push({
          position: r.position,
          lifeUsedFraction: r.life_used_fraction,
          thresholdDate: r.threshold_date,
          endOfLifeDate: r.end_of_life_date,
          springDamage: r.spring_damage,
          springThresholdDate: r.spring_threshold_date,
        });
      }
      return out;
    },

    /** The last done inspection of each vehicle (day and odometer). */
    async lastDone(timeZoneDay: (d: Date) => string, range?: VehicleRange) {
      const rows = await q<{ vehicle_id: number; completed_at: string | null; due_date: string; odometer_km: number | null }>(
        `SELECT i.vehicle_id, i.completed_at, i.due_date, i.odometer_km FROM ${byVehicles(range)}inspections i
         WHERE i.status = 'done'${byVehiclesOn('i', range)} AND i.id = (SELECT x.id FROM inspections x WHERE x.vehicle_id = i.vehicle_id AND x.status = 'done'
           ORDER BY COALESCE(x.completed_at, x.due_date) DESC, x.id DESC LIMIT 1)`,
        rangeParams(range),
      );
      return new Map(rows.map((r) => [r.vehicle_id, { date: r.completed_at ? timeZoneDay(new Date(r.completed_at)) : r.due_date, odometerKm: r.odometer_km }]));
    },

    /**
     * Each vehicle's pending follow-up: the last done inspection's follow-up date, unless a
     * follow-up inspection booked after it was cancelled or every damper given "check again
     * soon" has been replaced since. "Looked at" are the corners recorded in it with a keep
     * verdict whose damper is still the one fitted.
     */
    async followUps(timeZoneDay: (d: Date) => string, range?: VehicleRange): Promise<Map<number, FollowUp>> {
      const rows = await q<{ id: number; vehicle_id: number; follow_up_on: string; results_at: string | null; completed_at: string | null; due_date: string }>(
        `SELECT i.id, i.vehicle_id, i.follow_up_on, i.results_at, i.completed_at, i.due_date FROM ${byVehicles(range)}inspections i
         WHERE i.status = 'done' AND i.follow_up_on IS NOT NULL${byVehiclesOn('i', range)}
           AND i.id = (SELECT x.id FROM inspections x WHERE x.vehicle_id = i.vehicle_id AND x.status = 'done'
             ORDER BY COALESCE(x.completed_at, x.due_date) DESC, x.id DESC LIMIT 1)
           AND NOT EXISTS (SELECT 1 FROM inspections c WHERE c.vehicle_id = i.vehicle_id AND c."trigger" = 'follow_up' AND c.status = 'cancelled' AND c.id > i.id)`,
        rangeParams(range),
      );
      const out = new Map<number, FollowUp>();
      if (!rows.length) return out;
      const corners = await q<{ inspection_id: number; position: string; verdict: string }>(
        `SELECT c.inspection_id, c.position, c.verdict FROM inspection_corners c JOIN dampers d ON d.id = c.damper_id
         WHERE d.removed_at IS NULL AND c.verdict IN ('ok', 'monitor') AND c.inspection_id IN (${rows.map(() => '?').join(', ')}) ORDER BY c.inspection_id, c.axle_index, c.position`,
        rows.map((r) => r.id),
      );
      for (const r of rows) {
        const mine = corners.filter((c) => c.inspection_id === r.id);
        const checkAgain = mine.filter((c) => c.verdict === 'monitor').map((c) => c.position);
        // every damper to be checked again has since been replaced: nothing left to follow up
        if (!checkAgain.length) continue;
        const at = r.results_at ?? r.completed_at;
        out.set(r.vehicle_id, {
          date: r.follow_up_on,
          inspectionId: r.id,
          askedOn: at ? timeZoneDay(new Date(at)) : r.due_date,
          checkAgain,
          looked: mine.map((c) => c.position),
        });
      }
      return out;
    },

    /** Distance driven per vehicle in [from, before). */
    async distanceSince(from: Date, before: Date, range?: VehicleRange) {
      const rows = await q<{ vehicle_id: number; km: number }>(
        `SELECT vehicle_id, SUM(distance_km) AS km FROM trips WHERE started_at >= ? AND started_at < ?${inRange('vehicle_id', range)} GROUP BY vehicle_id`,
        [sqlDate(from), sqlDate(before), ...rangeParams(range)],
      );
      return new Map(rows.map((r) => [r.vehicle_id, Number(r.km)]));
    },

    async open(range?: VehicleRange): Promise<OpenInspection[]> {
      const rows = await q<{ id: number; vehicle_id: number; due_date: string; status: string; trigger: string | null; assignee_id: number | null; reason: string; basis: string | null }>(
        `SELECT i.id, i.vehicle_id, i.due_date, i.status, i."trigger", i.assignee_id, i.reason, i.basis FROM ${byVehicles(range)}inspections i
         WHERE i.status IN ('scheduled', 'due', 'overdue')${byVehiclesOn('i', range)} ORDER BY i.id`,
        rangeParams(range),
      );
      return rows.map((r) => ({
        id: r.id, vehicleId: r.vehicle_id, dueDate: r.due_date, status: r.status, trigger: r.trigger, assigneeId: r.assignee_id, reason: r.reason,
        basis: r.basis ? (JSON.parse(r.basis) as Record<string, unknown>) : null,
      }));
    },

    /** Active mechanics with their depot and number of open assigned inspections. */
    async mechanics() {
      return q<{ id: number; depot_id: number | null; open: number }>(
        `SELECT u.id, u.depot_id, (SELECT COUNT(*) FROM inspections i WHERE i.assignee_id = u.id AND i.status IN ('scheduled', 'due', 'overdue')) AS open
         FROM users u WHERE u.role = 'mechanic' AND u.active ORDER BY u.id`,
      );
    },

    /** Applies the night's scheduling in one transaction. */
    async apply(changes: {
      create: { vehicleId: number; dueDate: string; status: string; trigger: string; reason: string; basis: string; assigneeId: number | null }[];
      move: { id: number; dueDate: string; status: string; trigger: string; reason: string; basis: string }[];
      status: { id: number; status: string }[];
      now: Date;
      runId: number;
    }) {
      const stamp = sqlDate(changes.now);
      await sequelize.transaction(async (transaction) => {
        for (let i = 0; i < changes.create.length; i += 300) {
          const part = changes.create.slice(i, i + 300);
          await sequelize.query(
            `INSERT INTO inspections (vehicle_id, due_date, status, reason, assignee_id, completed_at, odometer_km, notes, "trigger", basis, notified_status, assignee_notified_id, created_by_run_id, created_at, updated_at)
             VALUES ${part.map(() => '(?, ?, ?, ?, ?, NULL, NULL, NULL, ?, ?, NULL, NULL, ?, ?, ?)').join(', ')}`,
            { replacements: part.flatMap((c) => [c.vehicleId, c.dueDate, c.status, c.reason, c.assigneeId, c.trigger, c.basis, changes.runId, stamp, stamp]) as never, transaction },
          );
        }
        for (const m of changes.move) {
          await sequelize.query(`UPDATE inspections SET due_date = ?, status = ?, "trigger" = ?, reason = ?, basis = ?, updated_at = ? WHERE id = ?`, {
            replacements: [m.dueDate, m.status, m.trigger, m.reason, m.basis, stamp, m.id],
            transaction,
          });
        }
        for (const s of changes.status) {
          await sequelize.query(`UPDATE inspections SET status = ?, updated_at = ? WHERE id = ?`, { replacements: [s.status, stamp, s.id], transaction });
        }
      });
    },

    /** Open inspections with everything the due list shows. */
    async dueList(opts: { today: string; depotId?: number; withinDays?: number; sort?: DueSort; scope?: { sql: string; args: unknown[] } }): Promise<DueItem[]> {
      const args: unknown[] = [...(opts.depotId ? [opts.depotId] : []), ...(opts.scope?.args ?? [])];
      const rows = await q<{
        id: number; vehicle_id: number; fleet_number: string; plate: string; vehicle_status: string; depot_id: number; depot_name: string; lat: number; lon: number;
        // the query reads open inspections only
        due_date: string; status: OpenInspectionStatus; trigger: string | null; reason: string; basis: string | null; assignee_id: number | null; assignee_name: string | null;
        max_life: number | null; first_threshold: string | null; route_ids: string | null;
      }>(
        `SELECT i.id, i.vehicle_id, v.fleet_number, v.plate, v.status AS vehicle_status, d.id AS depot_id, d.name AS depot_name, d.lat, d.lon,
                i.due_date, i.status, i."trigger", i.reason, i.basis, i.assignee_id, u.name AS assignee_name,
                (SELECT MAX(p.life_used_fraction) FROM damper_predictions p WHERE p.vehicle_id = v.id) AS max_life,
                (SELECT MIN(p.threshold_date) FROM damper_predictions p WHERE p.vehicle_id = v.id) AS first_threshold,
                (SELECT ${sqlFor(sequelize).distinctList('t.route_id')} FROM trips t WHERE t.vehicle_id = v.id AND t.started_at >= ?) AS route_ids
         FROM inspections i JOIN vehicles v ON v.id = i.vehicle_id JOIN depots d ON d.id = v.depot_id LEFT JOIN users u ON u.id = i.assignee_id
         WHERE i.status IN ('scheduled', 'due', 'overdue') ${opts.depotId ? 'AND v.depot_id = ?' : ''} ${opts.scope ? `AND ${opts.scope.sql}` : ''}
         ORDER BY i.due_date, v.fleet_number`,
        [sqlDate(new Date(Date.parse(`${opts.today}T00:00:00Z`) - 90 * 86_400_000)), ...args],
      );
      const t = Date.parse(`${opts.today}T00:00:00Z`);
      return rows
        .map((r) => ({
          id: r.id,
          vehicleId: r.vehicle_id,
          fleetNumber: r.fleet_number,
          plate: r.plate,
          vehicleStatus: r.vehicle_status,
          depotId: r.depot_id,
          depotName: r.depot_name,
          depotLat: r.lat,
          depotLon: r.lon,
          dueDate: r.due_date,
          status: r.status,
          trigger: r.trigger,
          reason: r.reason,
          basis: r.basis ? (JSON.parse(r.basis) as Record<string, unknown>) : null,
          assignee: r.assignee_id ? { id: r.assignee_id, name: r.assignee_name ?? '' } : null,
          daysLeft: Math.round((Date.parse(`${r.due_date}T00:00:00Z`) - t) / 86_400_000),
          maxLifeUsed: r.max_life,
          firstThresholdDate: r.first_threshold,
          routeIds: r.route_ids ? r.route_ids.split(',').map(Number).sort((a, b) => a - b) : [],
        }))
        .filter((r) => opts.withinDays === undefined || r.daysLeft <= opts.withinDays)
        .sort(opts.sort === 'lifeUsed' ? byLifeUsed : () => 0);
    },

    async nextForVehicle(vehicleId: number) {
      const rows = await q<{ id: number; due_date: string; status: string; trigger: string | null; reason: string; basis: string | null; assignee_name: string | null }>(
        `SELECT i.id, i.due_date, i.status, i."trigger", i.reason, i.basis, u.name AS assignee_name FROM inspections i LEFT JOIN users u ON u.id = i.assignee_id
         WHERE i.vehicle_id = ? AND i.status IN ('scheduled', 'due', 'overdue') ORDER BY i.due_date LIMIT 1`,
        [vehicleId],
      );
      const r = rows[0];
      return r
        ? { id: r.id, dueDate: r.due_date, status: r.status, trigger: r.trigger, reason: r.reason, basis: r.basis ? (JSON.parse(r.basis) as Record<string, unknown>) : null, assigneeName: r.assignee_name }
        : null;
    },
  };
}
