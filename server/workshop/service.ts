/**
 * Workshop rules: who sees and records which inspection, the test-lane results and what the
 * model learns from them. Work records (workshopWork, work-records.ts) and the planning figures
 * (workshopPlanning, planning.ts) join them in one service; the rules for a single corner are in
 * corners.ts and every statement in the repositories.
 */
import fs from 'node:fs';
import { addDays, parseISO } from 'date-fns';
import { queueAssignmentNotes } from '../mail/service';
import { AppError } from '../errors';
import type { SessionUser } from '../http/access';
import { INSPECTION_SCOPE_SQL, inspectionScopeArgs, mechanicScope } from '../http/mechanic-scope';
import { attachmentPath, storeAttachment, type AttachmentKind } from './attachments';
import type { WorkshopConfig } from './config';
import { axleDifferences, CHECK_AGAIN, cornerParams, cornerState, estimateDamping, FOLLOW_UP_DEFAULT_DAYS, OPEN } from './corners';
import { day, iso, workshopContext, type WorkshopDeps } from './context';
import { lifeUsedFromDamping, storedLifeModels } from './life';
import { checkOdometer } from './odometer';
import { workshopPlanning } from './planning';
import { sequelize, workshopRepository } from './repository';
import { workshopWork, workView } from './work-records';
import { inTransaction, workshopWrites } from './write-repository';

export { FINDINGS, VERDICTS } from './corners';

export function workshopService(cfg: WorkshopConfig, deps: WorkshopDeps) {
  const ctx = workshopContext(cfg, deps);
  const { today } = ctx;
  return {
    async list(user: SessionUser, f: { status?: string; assignee?: string; depotId?: number; vehicleId?: number; offset: number; pageSize: number; sort: { field: string; dir: 'ASC' | 'DESC' } }) {
      const cond: string[] = [];
      const args: unknown[] = [];
      if (!f.status || f.status === 'open') cond.push(`i.status IN ('scheduled','due','overdue')`);
      else if (f.status !== 'all') { cond.push('i.status = ?'); args.push(f.status); }
      if (f.vehicleId) { cond.push('i.vehicle_id = ?'); args.push(f.vehicleId); }
      if (f.depotId) { cond.push('COALESCE(i.assigned_depot_id, v.depot_id) = ?'); args.push(f.depotId); }
      if (f.assignee === 'me') { cond.push('i.assignee_id = ?'); args.push(user.id); }
      else if (f.assignee === 'none') cond.push('i.assignee_id IS NULL');
      else if (f.assignee) { cond.push('i.assignee_id = ?'); args.push(Number(f.assignee)); }
      const scope = await mechanicScope(sequelize(), user);
      if (scope) {
        cond.push(INSPECTION_SCOPE_SQL);
        args.push(...inspectionScopeArgs(scope));
      }
      const column = { dueDate: 'i.due_date', fleetNumber: 'v.fleet_number', status: 'i.status' }[f.sort.field] ?? 'i.due_date';
      const { total, rows } = await workshopRepository.inspectionPage({ cond, args }, { column, dir: f.sort.dir }, { limit: f.pageSize, offset: f.offset });
      const { by } = await ctx.cornersOf([...new Set(rows.map((r) => r.vehicle_id))]);
      const t = Date.parse(`${today()}T00:00:00Z`);
      return {
        total,
        items: rows.map((r) => ({
          id: r.id,
          vehicle: { id: r.vehicle_id, fleetNumber: r.fleet_number, plate: r.plate },
          dueDate: r.due_date,
          daysLeft: Math.round((Date.parse(`${r.due_date}T00:00:00Z`) - t) / 86_400_000),
          status: r.status,
          reason: r.reason,
          trigger: r.trigger,
          assignee: r.assignee_id ? { id: r.assignee_id, name: r.assignee_name ?? '' } : null,
          depot: { id: r.depot_id, name: r.depot_name, assignedDirectly: r.assigned_depot_id !== null },
          resultsRecorded: r.results_at !== null,
          completedAt: iso(r.completed_at),
          corners: by.get(r.vehicle_id) ?? [],
        })),
      };
    },

    async detail(user: SessionUser, id: number) {
      const i = await workshopRepository.inspectionRow(id);
      if (!i) throw AppError.notFound('Inspection');
      await ctx.scopeCheck(user, i);
      const [{ by }, results, attachments, work, assignee, depot, vehicleClass] = await Promise.all([
        ctx.cornersOf([i.vehicle_id]),
        workshopRepository.cornerResults([id]),
        workshopRepository.attachments(id),
        workshopRepository.workRecords({ inspectionId: id }),
        i.assignee_id ? workshopRepository.user(i.assignee_id) : Promise.resolve(null),
        workshopRepository.depot(i.assigned_depot_id ?? i.vehicle_depot_id),
        workshopRepository.specClass(i.spec_id),
      ]);
      const corners = results.map((c) => ({
        position: c.position,
        axleIndex: c.axle_index,
        damperId: c.damper_id,
        adhesionPct: c.adhesion_pct,
        phaseDeg: c.phase_deg,
        estimateMethod: c.estimate_method,
        findings: JSON.parse(c.findings) as string[],
        verdict: c.verdict,
        nominalNsPerM: c.nominal_damping_ns_per_m,
        predictedNsPerM: c.predicted_damping_ns_per_m,
        predictedBasis: c.predicted_basis,
        measuredNsPerM: c.measured_damping_ns_per_m,
        estimateNote: c.estimate_note,
      }));
      return {
        id: i.id,
        vehicle: { id: i.vehicle_id, fleetNumber: i.fleet_number, plate: i.plate, odometerKm: i.vehicle_odometer_km, status: i.vehicle_status, vehicleClass },
        dueDate: i.due_date,
        status: i.status,
        reason: i.reason,
        trigger: i.trigger,
        basis: i.basis ? (JSON.parse(i.basis) as unknown) : null,
        assignee: assignee ? { id: assignee.id, name: assignee.name } : null,
        depot,
        assignedDepotId: i.assigned_depot_id,
        odometerKm: i.odometer_km,
        notes: i.notes,
        /** Plate amplitude the results were measured (and inverted) at [mm]; the lane's setting until results exist. */
        plateAmplitudeMm: i.plate_amplitude_mm ?? cfg.lanePlateAmplitudeMm,
        resultsAt: iso(i.results_at),
        completedAt: iso(i.completed_at),
        followUpOn: i.follow_up_on,
        predicted: by.get(i.vehicle_id) ?? [],
        results: corners,
        axleDifferences: axleDifferences(corners, cfg.laneFlagPoints),
        attachments: attachments.map((a) => ({ id: a.id, kind: a.kind, mimeType: a.mime_type, sizeBytes: a.size_bytes, originalName: a.original_name, url: `/api/attachments/${a.id}/file` })),
        workRecords: work.map(workView),
      };
    },

    async assign(id: number, body: { assigneeId?: number | null; depotId?: number | null; dueDate?: string }, by: SessionUser) {
      const i = await workshopRepository.inspectionRow(id);
      if (!i) throw AppError.notFound('Inspection');
      if (!OPEN.includes(i.status)) throw AppError.conflict('Only open inspections can be reassigned.', { status: `is ${i.status}` });
      if (body.assigneeId) {
        const u = await workshopRepository.user(body.assigneeId);
        if (!u || u.role !== 'mechanic' || !u.active) throw AppError.badRequest('Choose an active mechanic.', { assigneeId: 'must be an active mechanic' });
      }
      if (body.depotId) {
        if (!(await workshopRepository.depot(body.depotId))) throw AppError.badRequest('That depot does not exist.', { depotId: 'is not a depot' });
      }
      await workshopWrites.updateAssignment(id, body, deps.now());
      if (body.assigneeId) {
        await queueAssignmentNotes({ sequelize: sequelize(), publicUrl: deps.publicUrl, asOf: today(), now: deps.now(), runId: null }, [id]);
      }
      return this.detail(by, id);
    },

    /** Test-lane results, findings and verdicts; the model learns from each adhesion %. */
    async recordResults(
      user: SessionUser,
      id: number,
      body: {
        odometerKm: number; notes?: string | null; complete?: boolean; followUpOn?: string | null; plateAmplitudeMm?: number;
        corners: { position: string; adhesionPct: number | null; phaseDeg?: number | null; findings: string[]; verdict: string }[];
      },
    ) {
      const i = await workshopRepository.inspectionRow(id);
      if (!i) throw AppError.notFound('Inspection');
      await ctx.scopeCheck(user, i);
      if (!OPEN.includes(i.status)) throw AppError.conflict('This inspection is closed; results can no longer be changed.', { status: `is ${i.status}` });
      const rows = await workshopRepository.fittedCorners([i.vehicle_id]);
      const lives = await storedLifeModels(cfg.life.prior);
      const now = deps.now();
      const fields: Record<string, string> = {};
      body.corners.forEach((c, k) => {
        if (!rows.some((r) => r.position === c.position)) fields[`corners.${k}.position`] = `the vehicle has no damper fitted at ${c.position}`;
      });
      if (Object.keys(fields).length) throw AppError.badRequest('Some corners do not exist on this vehicle.', fields);
      await checkOdometer(sequelize(), i.vehicle_id, body.odometerKm, today());
      // "check again soon" on any corner: the follow-up the nightly scheduling books (the range is checked by the route)
      const checkAgain = body.corners.some((c) => c.verdict === CHECK_AGAIN);
      if (!checkAgain && body.followUpOn) {
        throw AppError.badRequest('A follow-up date goes with a "check again soon" verdict.', { followUpOn: 'give a corner the verdict "check again soon", or leave the follow-up date empty' });
      }
      const followUpOn = checkAgain ? (body.followUpOn ?? day(addDays(parseISO(today()), FOLLOW_UP_DEFAULT_DAYS))) : null;
      // each value is inverted at the amplitude of the lane that measured it (the lane's setting unless the mechanic gives the rig's own)
      const amplitudeMm = body.plateAmplitudeMm ?? cfg.lanePlateAmplitudeMm;
      const computed = body.corners.map((c) => {
        const r = rows.find((x) => x.position === c.position)!;
        const st = cornerState(r, lives, cfg.inspectionThreshold);
        const est = estimateDamping(cornerParams(r), c.adhesionPct, amplitudeMm, c.phaseDeg ?? null);
        return { c, r, st, est };
      });
      await inTransaction(async (t) => {
        await workshopWrites.replaceCornerResults(
          id,
          computed.map(({ c, r, st, est }) => ({
            inspectionId: id, damperId: r.damper_id, position: c.position, axleIndex: r.axle_index, adhesionPct: c.adhesionPct, phaseDeg: c.phaseDeg ?? null, findings: c.findings,
            verdict: c.verdict, nominalNsPerM: r.nominal_ns_per_m, predictedNsPerM: st.dampingNsPerM, predictedBasis: st.basis, measuredNsPerM: est.dampingNsPerM,
            estimateMethod: est.method, estimateNote: est.note, energyJAtTest: r.energy_j, lifeUsedAtTest: st.lifeUsedFraction, wearKmAtTest: r.p_wear_km ?? 0,
          })),
          now,
          t,
        );
        for (const { r, est } of computed) {
          if (est.dampingNsPerM === null) continue;
          // the damper's wear state takes the measured damping; the nightly job recomputes its
          // history with the test-lane life (createWorkshopLifeResolver) when it has duty records
          await workshopWrites.setMeasuredDamping(r.damper_id, est.dampingNsPerM, lifeUsedFromDamping(est.dampingNsPerM, r.nominal_ns_per_m), r.energy_j > 0, now, t);
        }
        await workshopWrites.saveResults(id, { odometerKm: body.odometerKm, notes: body.notes ?? null, plateAmplitudeMm: amplitudeMm, byId: user.id, followUpOn, complete: body.complete === true }, now, t);
        await workshopWrites.raiseOdometer(i.vehicle_id, body.odometerKm, now, t);
      });
      await ctx.repredict(i.vehicle_id);
      return this.detail(user, id);
    },

    async addAttachment(user: SessionUser, id: number, kind: AttachmentKind, file: { buffer: Buffer; originalname: string }) {
      const i = await workshopRepository.inspectionRow(id);
      if (!i) throw AppError.notFound('Inspection');
      await ctx.scopeCheck(user, i);
      const s = storeAttachment(deps.dataDir, kind, file);
      try {
        const aid = await workshopWrites.insertAttachment(
          { inspectionId: id, kind, mimeType: s.mimeType, sizeBytes: s.sizeBytes, storedName: s.storedName, originalName: s.originalName, uploadedById: user.id },
          deps.now(),
        );
        return { id: aid, kind, mimeType: s.mimeType, sizeBytes: s.sizeBytes, originalName: s.originalName, url: `/api/attachments/${aid}/file` };
      } catch (e) {
        fs.rmSync(attachmentPath(deps.dataDir, s.storedName), { force: true });
        throw e;
      }
    },

    async attachmentFile(user: SessionUser, id: number) {
      const a = await workshopRepository.attachment(id);
      if (!a) throw AppError.notFound('Attachment');
      const i = await workshopRepository.inspectionRow(a.inspection_id);
      if (i) await ctx.scopeCheck(user, i);
      return { path: attachmentPath(deps.dataDir, a.stored_name), mimeType: a.mime_type, originalName: a.original_name };
    },
    ...workshopWork(ctx),
    ...workshopPlanning(ctx),
  };
}
