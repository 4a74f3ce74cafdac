/**
 * Drivers' exposure data access: the front-axle duty of trips the nightly job turns into
 * driver-days, the stored days, and the names the overview shows. Plain rows out.
 */
import type { Sequelize, Transaction } from 'sequelize';
import { selectRows } from '../db/raw';
import { DriverExposureDay } from '../db/models';

const db = () => DriverExposureDay.sequelize!;
const select = <T extends object>(sql: string, replacements: unknown[] = [], transaction?: Transaction, sq: Sequelize = db()) => selectRows<T>(sq, sql, replacements, transaction);

/** A driver-day's exposure figures, as the nightly step works them out and as they are stored. */
export interface ExposureDayFigures {
  driverId: number;
  day: string;
  a8: number;
  hours: number;
  trips: number;
  maxWeightedAccel: number;
  status: string;
}

export interface StoredExposureDay extends ExposureDayFigures {
  /** JSON of the day's parts (trip, route, vehicle, a_w, hours, seat factor). */
  parts: string;
  notifiedAt: string | null;
}

export const exposureRepository = {
  /** Front-axle duty of every trip with a driver between two days (inclusive). */
  frontDuty(sq: Sequelize, from: string, to: string, transaction: Transaction) {
    return select<{ trip_id: number; driver_id: number; vehicle_id: number; route_id: number; trip_date: string; duration_s: number; rms_weighted_accel: number }>(
      `SELECT trip_id, driver_id, vehicle_id, route_id, trip_date, duration_s, rms_weighted_accel FROM trip_duties
       WHERE axle_index = 0 AND driver_id IS NOT NULL AND trip_date >= ? AND trip_date <= ?`,
      [from, to],
      transaction,
      sq,
    );
  },

  /** Each vehicle's class and floor-to-seat factors (from its spec). */
  seatInputs(sq: Sequelize, transaction: Transaction) {
    return select<{ vehicle_id: number; vehicle_class: string; seat_factor: number | null; cab_factor: number | null }>(
      `SELECT v.id AS vehicle_id, s.vehicle_class, s.seat_factor, s.cab_factor FROM vehicles v JOIN suspension_specs s ON s.id = v.spec_id`,
      [],
      transaction,
      sq,
    );
  },

  /** When each stored day between two days was mailed about (null if not). */
  notifiedDays(sq: Sequelize, from: string, to: string, transaction: Transaction) {
    return select<{ driver_id: number; day: string; notified_at: string | null }>(`SELECT driver_id, day, notified_at FROM driver_exposure_days WHERE day >= ? AND day <= ?`, [from, to], transaction, sq);
  },

  /** Replaces the stored days between two days with the given ones. */
  async replaceDays(sq: Sequelize, from: string, to: string, days: StoredExposureDay[], computedAt: string, transaction: Transaction) {
    await sq.query(`DELETE FROM driver_exposure_days WHERE day >= ? AND day <= ?`, { replacements: [from, to], transaction });
    for (let i = 0; i < days.length; i += 200) {
      const chunk = days.slice(i, i + 200);
      await sq.query(
        `INSERT INTO driver_exposure_days (driver_id, day, a8, hours, trips, max_weighted_accel, status, parts, computed_at, notified_at) VALUES ${chunk.map(() => '(?,?,?,?,?,?,?,?,?,?)').join(',')}`,
        {
          replacements: chunk.flatMap((d) => [d.driverId, d.day, d.a8, d.hours, d.trips, d.maxWeightedAccel, d.status, d.parts, computedAt, d.notifiedAt]),
          transaction,
        },
      );
    }
  },

  /** Days above `a8` not yet mailed about, with the driver's name and depot. */
  unnotifiedAbove(sq: Sequelize, a8: number, transaction: Transaction) {
    return select<{ driver_id: number; day: string; a8: number; hours: number; name: string; depot_id: number | null }>(
      `SELECT e.driver_id, e.day, e.a8, e.hours, u.name, u.depot_id FROM driver_exposure_days e JOIN users u ON u.id = e.driver_id
       WHERE e.a8 > ? AND e.notified_at IS NULL ORDER BY e.day, u.name`,
      [a8],
      transaction,
      sq,
    );
  },

  activeManagers(sq: Sequelize, transaction: Transaction) {
    return select<{ id: number; name: string; email: string; depot_id: number | null }>(`SELECT id, name, email, depot_id FROM users WHERE role = 'manager' AND active ORDER BY id`, [], transaction, sq);
  },

  async markNotified(sq: Sequelize, days: { driver_id: number; day: string }[], at: string, transaction: Transaction) {
    for (const f of days) {
      await sq.query(`UPDATE driver_exposure_days SET notified_at = ? WHERE driver_id = ? AND day = ?`, { replacements: [at, f.driver_id, f.day], transaction });
    }
  },

  async user(id: number) {
    const [u] = await select<{ id: number; name: string; role: string }>(`SELECT id, name, role FROM users WHERE id = ?`, [id]);
    return u ?? null;
  },

  /** One driver's stored days between two days, in order. */
  driverDays(driverId: number, from: string, to: string) {
    return select<{ day: string; a8: number; hours: number; trips: number; max_weighted_accel: number; status: string; parts: string }>(
      `SELECT day, a8, hours, trips, max_weighted_accel, status, parts FROM driver_exposure_days WHERE driver_id = ? AND day >= ? AND day <= ? ORDER BY day`,
      [driverId, from, to],
    );
  },

  /** Every driver's stored days between two days, in order, with names. */
  allDays(from: string, to: string) {
    return select<{ driver_id: number; name: string; day: string; a8: number; hours: number; trips: number; parts: string }>(
      `SELECT e.driver_id, u.name, e.day, e.a8, e.hours, e.trips, e.parts FROM driver_exposure_days e JOIN users u ON u.id = e.driver_id WHERE e.day >= ? AND e.day <= ? ORDER BY e.day`,
      [from, to],
    );
  },

  routeNames() {
    return select<{ id: number; name: string }>(`SELECT id, name FROM routes`);
  },

  fleetNumbers() {
    return select<{ id: number; fleet_number: string }>(`SELECT id, fleet_number FROM vehicles`);
  },
};
