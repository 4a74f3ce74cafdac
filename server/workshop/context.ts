/**
 * What the workshop's services share: today's date, re-predicting a vehicle after a save, the
 * mechanic's scope checks and each fitted corner's predicted state.
 */
import { formatISO } from 'date-fns';
import type { Transaction } from 'sequelize';
import { AppError } from '../errors';
import type { SessionUser } from '../http/access';
import { inspectionInScope, mechanicScope, vehicleInScope } from '../http/mechanic-scope';
import { repredictVehicle } from '../wear/repredict';
import { cornerState, type CornerState } from './corners';
import type { WorkshopConfig } from './config';
import { storedLifeModels } from './life';
import { sequelize, workshopRepository } from './repository';

export interface WorkshopDeps {
  now: () => Date;
  dataDir: string;
  publicUrl: string;
  timeZone: string;
}

export const day = (d: Date) => formatISO(d, { representation: 'date' });
/** A stored SQLite timestamp ('YYYY-MM-DD HH:MM:SS.sss +00:00') as ISO 8601, or null. */
export const iso = (s: string | null) => (s ? new Date(String(s).replace(' ', 'T').replace(/ ?\+00:00$/, 'Z')).toISOString() : null);

export function workshopContext(cfg: WorkshopConfig, deps: WorkshopDeps) {
  const today = () => day(deps.now());
  return {
    cfg,
    deps,
    today,
    /** The vehicle's predictions as of today, with the life the results just saved imply (server/wear/repredict.ts). */
    repredict: (vehicleId: number) =>
      repredictVehicle(sequelize(), vehicleId, { now: deps.now(), asOf: today(), timeZone: deps.timeZone, thresholdFraction: cfg.inspectionThreshold, workshop: cfg }),

    // the mechanic's scope: server/http/mechanic-scope.ts
    async scopeCheck(user: SessionUser, insp: { assignee_id: number | null; assigned_depot_id: number | null; vehicle_depot_id: number }) {
      const s = await mechanicScope(sequelize(), user);
      // not a matter of role: the client says the depot (or the other mechanic) is the reason
      if (s && !inspectionInScope(s, insp)) throw new AppError(403, 'other_depot', insp.assignee_id !== null ? 'This inspection is assigned to another mechanic.' : 'This inspection belongs to another depot.');
    },

    async vehicleScopeCheck(user: SessionUser, vehicleId: number, t?: Transaction) {
      const s = await mechanicScope(sequelize(), user, t);
      if (s && !(await vehicleInScope(sequelize(), s, vehicleId, t))) throw AppError.forbidden('This vehicle belongs to another depot.');
    },

    async cornersOf(vehicleIds: number[]) {
      const [rows, lives] = await Promise.all([workshopRepository.fittedCorners(vehicleIds), storedLifeModels(cfg.life.prior)]);
      const by = new Map<number, CornerState[]>();
      for (const r of rows) {
        if (!by.has(r.vehicle_id)) by.set(r.vehicle_id, []);
        by.get(r.vehicle_id)!.push(cornerState(r, lives, cfg.inspectionThreshold));
      }
      return { by, rows, lives };
    },
  };
}

export type WorkshopContext = ReturnType<typeof workshopContext>;
