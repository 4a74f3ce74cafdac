/**
 * Work done on a vehicle: a work record retires and fits dampers and closes the inspection it
 * answers in one transaction; the vehicle page's workshop view; the open inspections a record
 * can close.
 */
import { addDays } from 'date-fns';
import { AppError } from '../errors';
import type { SessionUser } from '../http/access';
import { mechanicScope, VEHICLE_SCOPE_SQL, vehicleScopeArgs } from '../http/mechanic-scope';
import { OPEN } from './corners';
import { day, iso, type WorkshopContext } from './context';
import { modelNote } from './life';
import { checkOdometer } from './odometer';
import { sequelize, workshopRepository } from './repository';
import { inTransaction, workshopWrites } from './write-repository';

export function workshopWork(ctx: WorkshopContext) {
  const { cfg, deps, today } = ctx;
  return {
    /** Replacements in one transaction: retire old dampers, fit new ones, close the inspection. */
    async recordWork(
      user: SessionUser,
      body: {
        vehicleId: number; inspectionId?: number | null; performedOn: string; odometerKm: number; summary: string; labourHours: number; notes?: string | null;
        items: { position: string; component: 'damper' | 'spring'; partDescription: string; partNumber?: string | null; cost: number; removalReason: string }[];
      },
    ) {
      const now = deps.now();
      const workId = await inTransaction(async (t) => {
        const v = await workshopRepository.vehicleForWork(body.vehicleId, t);
        if (!v) throw AppError.badRequest('That vehicle does not exist.', { vehicleId: 'is not a vehicle' });
        if (v.status === 'retired') throw AppError.badRequest('The vehicle is retired.', { vehicleId: 'is retired' });
        if (body.inspectionId) {
          const i = await workshopRepository.inspectionRow(body.inspectionId, t);
          if (!i || i.vehicle_id !== body.vehicleId) throw AppError.badRequest('That inspection is not one of this vehicle.', { inspectionId: 'is not an inspection of this vehicle' });
          await ctx.scopeCheck(user, i);
          if (!OPEN.includes(i.status)) throw AppError.conflict('That inspection is already closed.', { inspectionId: `is ${i.status}` });
        } else {
          // without an inspection to vouch for it, only a vehicle of the mechanic's own depot
          const s = await mechanicScope(sequelize(), user, t);
          if (s && v.depot_id !== s.depotId) throw AppError.forbidden('This vehicle belongs to another depot.');
        }
        // a day's grace for a browser in a time zone ahead of the server's
        const latest = day(addDays(new Date(`${today()}T00:00:00Z`), 1));
        if (body.performedOn > latest) throw AppError.badRequest('The work cannot be dated in the future.', { performedOn: `must be on or before ${latest}` });
        await checkOdometer(sequelize(), body.vehicleId, body.odometerKm, body.performedOn, 'odometerKm', t);
        const partsCost = body.items.reduce((s, x) => s + x.cost, 0);
        const wid = await workshopWrites.insertWorkRecord(
          { vehicleId: body.vehicleId, inspectionId: body.inspectionId ?? null, mechanicId: user.id, performedOn: body.performedOn, odometerKm: body.odometerKm, summary: body.summary, partsCost, labourHours: body.labourHours, notes: body.notes ?? null },
          now,
          t,
        );
        // item by item inside the transaction: a bad row rolls back everything before it
        for (const [k, it] of body.items.entries()) {
          const fitted = await workshopRepository.fittedAt(body.vehicleId, it.position, t);
          if (!fitted) throw AppError.badRequest(`Item ${k + 1}: the vehicle has no corner ${it.position}.`, { [`items.${k}.position`]: `the vehicle has no damper fitted at ${it.position}` });
          if (body.odometerKm < fitted.installed_odometer_km) {
            throw AppError.badRequest(`Item ${k + 1}: the odometer is below the reading when the ${it.position} damper was fitted.`, {
              odometerKm: `must be at least ${Math.round(fitted.installed_odometer_km)} km (when the ${it.position} damper was fitted)`,
            });
          }
          if (body.performedOn < fitted.installed_at) {
            throw AppError.badRequest(`Item ${k + 1}: the date is before the ${it.position} damper was fitted.`, { performedOn: `must be on or after ${fitted.installed_at}` });
          }
          let removed: number | null = null;
          let installed: number | null = null;
          if (it.component === 'damper') {
            removed = fitted.id;
            installed = await workshopWrites.replaceDamper(
              { damperId: fitted.id, vehicleId: body.vehicleId, position: it.position, axleIndex: fitted.axle_index },
              { on: body.performedOn, odometerKm: body.odometerKm, reason: it.removalReason, workRecordId: wid, partNumber: it.partNumber ?? null },
              now,
              t,
            );
          }
          await workshopWrites.insertWorkItem(
            { workRecordId: wid, position: it.position, axleIndex: fitted.axle_index, component: it.component, partDescription: it.partDescription, partNumber: it.partNumber ?? null, cost: it.cost, removalReason: it.removalReason, removedDamperId: removed, installedDamperId: installed },
            now,
            t,
          );
        }
        if (body.inspectionId) await workshopWrites.closeByWork(body.inspectionId, body.odometerKm, now, t);
        await workshopWrites.raiseOdometer(body.vehicleId, body.odometerKm, now, t);
        return wid;
      });
      await ctx.repredict(body.vehicleId);
      return this.workRecord(workId);
    },

    async workRecord(id: number, user?: SessionUser) {
      const [w] = await workshopRepository.workRecords({ id });
      if (!w) throw AppError.notFound('Work record');
      if (user) await ctx.vehicleScopeCheck(user, w.vehicle_id);
      return workView(w);
    },

    async workRecords(user: SessionUser, f: { vehicleId?: number }) {
      const scope = await mechanicScope(sequelize(), user);
      const rows = await workshopRepository.workRecords({ ...f, scope: scope ? { sql: VEHICLE_SCOPE_SQL, args: vehicleScopeArgs(scope) } : undefined });
      return { items: rows.map(workView), total: rows.length };
    },

    /** The vehicle page's workshop view: corners, life used, predicted vs measured history. */
    async vehicleWorkshop(user: SessionUser, vehicleId: number) {
      const v = await workshopRepository.vehicleSpecId(vehicleId);
      if (!v) throw AppError.notFound('Vehicle');
      await ctx.vehicleScopeCheck(user, vehicleId);
      const { by, lives } = await ctx.cornersOf([vehicleId]);
      const life = lives.get(v.spec_id)!;
      const comparisons = await workshopRepository.vehicleComparisons(vehicleId);
      const measured = await workshopRepository.latestMeasurements();
      const calibrated = new Set(measured.map((m) => m.damper_id));
      return {
        vehicleId,
        corners: (by.get(vehicleId) ?? []).map((c) => ({ ...c, lifeSource: calibrated.has(c.damperId) ? 'test-lane' : c.lifeSource })),
        life: {
          specId: v.spec_id,
          source: life.source,
          failures: life.failures,
          classStepFactor: life.classStepFactor,
          shape: life.shape,
          text: `Life used is measured against ${modelNote(life)}.`,
        },
        comparisons: comparisons.map((c) => ({ inspectionId: c.inspection_id, position: c.position, adhesionPct: c.adhesion_pct, predictedNsPerM: c.predicted, measuredNsPerM: c.measured, nominalNsPerM: c.nominal, note: c.note, verdict: c.verdict, at: iso(c.at), basis: c.basis, plateAmplitudeMm: c.amplitude ?? cfg.lanePlateAmplitudeMm, phaseDeg: c.phase, estimateMethod: c.method })),
        workRecords: (await workshopRepository.workRecords({ vehicleId })).map(workView),
      };
    },

    /** Open inspections for a vehicle: used to pick the one a work record closes. */
    async openFor(vehicleIds: number[]) {
      return workshopRepository.openInspectionsOf(vehicleIds);
    },
  };
}

export type WorkRow = Awaited<ReturnType<typeof workshopRepository.workRecords>>[number];
export function workView(w: WorkRow) {
  return {
    id: w.id,
    vehicle: { id: w.vehicle_id, fleetNumber: w.fleet_number, plate: w.plate, depotName: w.depot_name, specName: w.spec_name },
    inspectionId: w.inspection_id,
    mechanic: w.mechanic_id ? { id: w.mechanic_id, name: w.mechanic_name ?? '' } : null,
    performedAt: String(w.performed_at).slice(0, 10),
    odometerKm: w.odometer_km,
    summary: w.summary,
    partsCost: w.parts_cost,
    labourHours: w.labour_hours,
    notes: w.notes,
    items: w.items.map((i) => ({
      position: i.position,
      axleIndex: i.axle_index,
      component: i.component,
      partDescription: i.part_description,
      partNumber: i.part_number,
      cost: i.cost,
      removalReason: i.removal_reason,
      removedDamperId: i.removed_damper_id,
      installedDamperId: i.installed_damper_id,
    })),
  };
}
