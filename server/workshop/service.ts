/**
 * Workshop rules: who sees and records which inspection, test-lane results and what the model
 * learns from them, work records (replacements in one transaction), forecast, workload and the
 * model check.
 */
import fs from 'node:fs';
import { addDays, formatISO, parseISO, startOfISOWeek } from 'date-fns';
import { estimateFromLane } from '../physics/lane-estimate';
import type { CornerParams } from '../physics/types';
import { estimatedDamping } from '../wear/wear';
import { repredictVehicle } from '../wear/repredict';
import { queueAssignmentNotes } from '../mail/service';
import { AppError } from '../errors';
import type { Transaction } from 'sequelize';
import type { SessionUser } from '../http/access';
import { sequelize, exec, inList, insert, inTransaction, q, stamp, workshopRepository, type FittedCornerRow } from './repository';
import { backtest, lifeUsedFromDamping, modelNote, specLife, storedLifeModels } from './life';
import { lifeKmAt, type LifeModel } from '../reliability/life-model';
import { attachmentPath, storeAttachment, type AttachmentKind } from './attachments';
import type { WorkshopConfig } from './config';
import { INSPECTION_SCOPE_SQL, VEHICLE_SCOPE_SQL, inspectionInScope, inspectionScopeArgs, mechanicScope, vehicleInScope, vehicleScopeArgs } from '../http/mechanic-scope';
import { checkOdometer } from './odometer';

export const FINDINGS = ['oil_leak', 'mount_loose_or_cracked', 'bush_worn', 'bump_stop_damaged', 'spring_cracked_or_sagging', 'tyre_uneven_wear'] as const;
export const VERDICTS = ['ok', 'monitor', 'replace'] as const;
/** The verdict "keep, check again soon": it sets the inspection's follow-up date. */
export const CHECK_AGAIN = 'monitor';
/** Days from the inspection to the follow-up when the mechanic gives no date (stated default). */
export const FOLLOW_UP_DEFAULT_DAYS = 30;
export const OPEN = ['scheduled', 'due', 'overdue'];

const day = (d: Date) => formatISO(d, { representation: 'date' });
/** A stored SQLite timestamp ('YYYY-MM-DD HH:MM:SS.sss +00:00') as ISO 8601, or null. */
const iso = (s: string | null) => (s ? new Date(String(s).replace(' ', 'T').replace(/ ?\+00:00$/, 'Z')).toISOString() : null);

export interface CornerState {
  damperId: number;
  position: string;
  axleIndex: number;
  partNumber: string | null;
  installedAt: string;
  kmSinceFitted: number;
  lifeUsedFraction: number;
  /** Predicted present damping [N·s/m]. */
  dampingNsPerM: number;
  nominalNsPerM: number;
  /** 'wear model' (nightly job) or 'km estimate' (no duty computed yet). */
  basis: string;
  state: 'ok' | 'watch' | 'due' | 'past_life';
  thresholdDate: string | null;
  endOfLifeDate: string | null;
  /** P10–P90 range of the end-of-life date from the fitted scatter. */
  endOfLifeP10Date: string | null;
  endOfLifeP90Date: string | null;
  /** Share of life used before the trips on record (opening wear), null before the nightly job. */
  openingShare: number | null;
  /** Median life [km] at the damper's own recent wear rate (or on the rated road before the nightly job). */
  lifeKm: number;
  lifeSource: string;
}

/** The corner's word: the same bands as the vehicle page (watch from ¾ of the inspection threshold, inspect from it). */
const stateOf = (u: number, threshold: number): CornerState['state'] => (u >= 1 ? 'past_life' : u >= threshold ? 'due' : u >= threshold * 0.75 - 1e-9 ? 'watch' : 'ok');

/** Each corner's predicted state from the nightly wear state, or a km estimate before it. */
export function cornerState(r: FittedCornerRow, models: Map<number, LifeModel>, threshold = 0.8): CornerState {
  const model = models.get(r.spec_id);
  const ratedRoadKm = model ? lifeKmAt(model, r.rated_damper_life_km, 1, 0.5) : r.rated_damper_life_km;
  const perKm = r.p_window_km && r.p_window_km > 0 && r.p_window_wear_km !== null ? r.p_window_wear_km / r.p_window_km : null;
  const lifeKm = r.p_life_wear_km !== null && perKm ? r.p_life_wear_km / perKm : ratedRoadKm;
  const km = Math.max(0, r.odometer_km - r.installed_odometer_km);
  const fromModel = r.wear_updated_at !== null;
  const u = fromModel ? r.life_used_fraction : km / lifeKm;
  const damping = fromModel && r.damping_ns_per_m !== null ? r.damping_ns_per_m : estimatedDamping(r.nominal_ns_per_m, u);
  return {
    damperId: r.damper_id,
    position: r.position,
    axleIndex: r.axle_index,
    partNumber: r.part_number,
    installedAt: r.installed_at,
    kmSinceFitted: km,
    lifeUsedFraction: u,
    dampingNsPerM: damping,
    nominalNsPerM: r.nominal_ns_per_m,
    basis: fromModel ? 'wear model' : 'km estimate',
    state: stateOf(u, threshold),
    thresholdDate: r.p_threshold_date,
    endOfLifeDate: r.p_end_date,
    endOfLifeP10Date: r.p_end_p10,
    endOfLifeP90Date: r.p_end_p90,
    openingShare: r.p_opening_share,
    lifeKm,
    lifeSource: r.p_source ?? model?.source ?? 'prior',
  };
}

const cornerParams = (r: FittedCornerRow): CornerParams => ({
  sprungMassKg: r.sprung_mass_kg,
  unsprungMassKg: r.unsprung_mass_kg,
  springRateNPerM: r.spring_rate_n_per_m,
  dampingNsPerM: r.nominal_ns_per_m,
  tireRateNPerM: r.tire_rate_n_per_m,
});

/**
 * Present damping from a corner's lane readings (adhesion %, minimum phase, or both) with the
 * engine's inverses; with both, the better-conditioned one, named (docs/methods.md
 * "Phase-shift method"). Null with the reason when no reading explains a damping.
 *
 * @param c corner with its nominal damping [N·s/m]
 * @param pct measured adhesion [%], null if not measured
 * @param plateAmplitudeMm plate amplitude (zero-to-peak) of the lane that measured it [mm]
 * @param phaseDeg measured minimum phase [°], null if not measured
 */
export function estimateDamping(
  c: CornerParams,
  pct: number | null,
  plateAmplitudeMm: number,
  phaseDeg: number | null = null,
): { dampingNsPerM: number | null; method: 'adhesion' | 'phase' | null; note: string | null } {
  if (pct === null && phaseDeg === null) return { dampingNsPerM: null, method: null, note: null };
  try {
    const e = estimateFromLane(c, { adhesionPct: pct, phaseDeg, amplitudeM: plateAmplitudeMm / 1000 });
    // one reading alone: no need to say which it came from unless it failed
    const note = e.dampingNsPerM !== null && e.inversions.length === 1 ? null : e.note;
    return { dampingNsPerM: e.dampingNsPerM, method: e.method, note };
  } catch (e) {
    return { dampingNsPerM: null, method: null, note: `no estimate: ${(e as Error).message}` };
  }
}

/** Left–right adhesion difference per axle [points], flagged above the configured limit. */
export function axleDifferences(corners: { position: string; axleIndex: number; adhesionPct: number | null }[], limit: number) {
  const axles = [...new Set(corners.map((c) => c.axleIndex))].sort();
  return axles.map((axleIndex) => {
    const on = corners.filter((c) => c.axleIndex === axleIndex && c.adhesionPct !== null);
    const l = on.find((c) => c.position.endsWith('L'));
    const r = on.find((c) => c.position.endsWith('R'));
    const diff = l && r ? Math.abs(l.adhesionPct! - r.adhesionPct!) : null;
    return { axleIndex, differencePoints: diff, flagged: diff !== null && diff > limit, limitPoints: limit };
  });
}

/** Dampers less likely than this to need replacing within the horizon are left out of the forecast list. */
export const FORECAST_MIN_CHANCE = 0.02;

/**
 * Chance a damper reaches end of life within the horizon, given it has lasted so far: its
 * Weibull life in wear km (from the prediction's median and P10–P90) conditioned on the wear
 * km it has used, at its recent wear rate; 1 when its calendar limit falls inside the horizon.
 * Before the nightly job has run, the km estimate of its spec's model at the vehicle's
 * distance per day (severity 1).
 */
export function replacementChance(r: FittedCornerRow, st: CornerState, days: number, from: string, to: string, kmPerDay: number, model?: LifeModel): { chance: number; basis: string } {
  if (st.endOfLifeDate !== null && st.endOfLifeDate <= to && r.p_governed === 'calendar') return { chance: 1, basis: `calendar limit reached on ${st.endOfLifeDate}` };
  const z = (p: number) => Math.log(-Math.log(1 - p));
  if (r.p_life_wear_km !== null && r.p_p10_wear_km !== null && r.p_p90_wear_km !== null && r.p_wear_km !== null) {
    const sigma = (Math.log(r.p_p90_wear_km) - Math.log(r.p_p10_wear_km)) / (z(0.9) - z(0.1));
    const scale = r.p_life_wear_km / Math.pow(Math.log(2), sigma);
    const h = (w: number) => Math.pow(Math.max(0, w) / scale, 1 / sigma);
    const dw = (r.p_rate ?? 0) * days;
    const chance = 1 - Math.exp(-(h(r.p_wear_km + dw) - h(r.p_wear_km)));
    return { chance, basis: `wear model: ${Math.round(st.lifeUsedFraction * 100)} % of expected life used, ${Math.round(chance * 100)} % chance of reaching end of life by ${to}` };
  }
  if (!model) return { chance: 0, basis: 'no prediction yet' };
  const scale = r.rated_damper_life_km * Math.exp(model.beta0);
  const h = (km: number) => Math.pow(Math.max(0, km) / scale, model.shape);
  const chance = 1 - Math.exp(-(h(st.kmSinceFitted + kmPerDay * days) - h(st.kmSinceFitted)));
  return { chance, basis: `km estimate from ${from}: ${Math.round(kmPerDay)} km/day on its spec's life at the rated road (${Math.round(chance * 100)} %)` };
}

export function workshopService(cfg: WorkshopConfig, deps: { now: () => Date; dataDir: string; publicUrl: string; timeZone: string }) {
  const today = () => day(deps.now());
  /** The vehicle's predictions as of today, with the life the results just saved imply (server/wear/repredict.ts). */
  const repredict = (vehicleId: number) =>
    repredictVehicle(sequelize(), vehicleId, { now: deps.now(), asOf: today(), timeZone: deps.timeZone, thresholdFraction: cfg.inspectionThreshold, workshop: cfg });

  // the mechanic's scope: server/http/mechanic-scope.ts
  async function scopeCheck(user: SessionUser, insp: { assignee_id: number | null; assigned_depot_id: number | null; vehicle_depot_id: number }) {
    const s = await mechanicScope(sequelize(), user);
    // not a matter of role: the client says the depot (or the other mechanic) is the reason
    if (s && !inspectionInScope(s, insp)) throw new AppError(403, 'other_depot', insp.assignee_id !== null ? 'This inspection is assigned to another mechanic.' : 'This inspection belongs to another depot.');
  }

  async function vehicleScopeCheck(user: SessionUser, vehicleId: number, t?: Transaction) {
    const s = await mechanicScope(sequelize(), user, t);
    if (s && !(await vehicleInScope(sequelize(), s, vehicleId, t))) throw AppError.forbidden('This vehicle belongs to another depot.');
  }

  async function cornersOf(vehicleIds: number[]) {
    const [rows, lives] = await Promise.all([workshopRepository.fittedCorners(vehicleIds), storedLifeModels(cfg.life.prior)]);
    const by = new Map<number, CornerState[]>();
    for (const r of rows) {
      if (!by.has(r.vehicle_id)) by.set(r.vehicle_id, []);
      by.get(r.vehicle_id)!.push(cornerState(r, lives, cfg.inspectionThreshold));
    }
    return { by, rows, lives };
  }

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
      const where = cond.length ? `WHERE ${cond.join(' AND ')}` : '';
      const order = { dueDate: 'i.due_date', fleetNumber: 'v.fleet_number', status: 'i.status' }[f.sort.field] ?? 'i.due_date';
      const from = `FROM inspections i JOIN vehicles v ON v.id = i.vehicle_id JOIN depots d ON d.id = COALESCE(i.assigned_depot_id, v.depot_id) LEFT JOIN users u ON u.id = i.assignee_id`;
      const [{ n }] = await q<{ n: number }>(`SELECT COUNT(*) AS n ${from} ${where}`, args);
      const rows = await q<{
        id: number; vehicle_id: number; fleet_number: string; plate: string; due_date: string; status: string; reason: string; trigger: string | null;
        assignee_id: number | null; assignee_name: string | null; depot_id: number; depot_name: string; assigned_depot_id: number | null; results_at: string | null; completed_at: string | null;
      }>(
        `SELECT i.id, i.vehicle_id, v.fleet_number, v.plate, i.due_date, i.status, i.reason, i."trigger", i.assignee_id, u.name AS assignee_name, d.id AS depot_id, d.name AS depot_name,
                i.assigned_depot_id, i.results_at, i.completed_at
         ${from} ${where} ORDER BY ${order} ${f.sort.dir}, v.fleet_number LIMIT ? OFFSET ?`,
        [...args, f.pageSize, f.offset],
      );
      const { by } = await cornersOf([...new Set(rows.map((r) => r.vehicle_id))]);
      const t = Date.parse(`${today()}T00:00:00Z`);
      return {
        total: Number(n),
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
      await scopeCheck(user, i);
      const [{ by }, results, attachments, work, assignee, depot, spec] = await Promise.all([
        cornersOf([i.vehicle_id]),
        workshopRepository.cornerResults([id]),
        workshopRepository.attachments(id),
        workshopRepository.workRecords({ inspectionId: id }),
        i.assignee_id ? workshopRepository.user(i.assignee_id) : Promise.resolve(null),
        q<{ id: number; name: string }>('SELECT id, name FROM depots WHERE id = ?', [i.assigned_depot_id ?? i.vehicle_depot_id]),
        q<{ vehicle_class: string }>('SELECT vehicle_class FROM suspension_specs WHERE id = ?', [i.spec_id]),
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
        vehicle: { id: i.vehicle_id, fleetNumber: i.fleet_number, plate: i.plate, odometerKm: i.vehicle_odometer_km, status: i.vehicle_status, vehicleClass: spec[0]?.vehicle_class ?? null },
        dueDate: i.due_date,
        status: i.status,
        reason: i.reason,
        trigger: i.trigger,
        basis: i.basis ? (JSON.parse(i.basis) as unknown) : null,
        assignee: assignee ? { id: assignee.id, name: assignee.name } : null,
        depot: depot[0] ?? null,
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
        const d = await q('SELECT id FROM depots WHERE id = ?', [body.depotId]);
        if (!d.length) throw AppError.badRequest('That depot does not exist.', { depotId: 'is not a depot' });
      }
      const sets: string[] = [];
      const args: unknown[] = [];
      if (body.assigneeId !== undefined) { sets.push('assignee_id = ?'); args.push(body.assigneeId); }
      if (body.depotId !== undefined) { sets.push('assigned_depot_id = ?'); args.push(body.depotId); }
      if (body.dueDate !== undefined) { sets.push('due_date = ?'); args.push(body.dueDate); }
      sets.push('updated_at = ?');
      args.push(stamp(deps.now()));
      await exec(`UPDATE inspections SET ${sets.join(', ')} WHERE id = ?`, [...args, id]);
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
      await scopeCheck(user, i);
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
        await exec('DELETE FROM inspection_corners WHERE inspection_id = ?', [id], t);
        for (const { c, r, st, est } of computed) {
          await exec(
            `INSERT INTO inspection_corners (inspection_id, damper_id, position, axle_index, adhesion_pct, phase_deg, findings, verdict, nominal_damping_ns_per_m, predicted_damping_ns_per_m,
               predicted_basis, measured_damping_ns_per_m, estimate_method, estimate_note, energy_j_at_test, life_used_at_test, wear_km_at_test, created_at, updated_at)
             VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
            [id, r.damper_id, c.position, r.axle_index, c.adhesionPct, c.phaseDeg ?? null, JSON.stringify(c.findings), c.verdict, r.nominal_ns_per_m, st.dampingNsPerM, st.basis,
              est.dampingNsPerM, est.method, est.note, r.energy_j, st.lifeUsedFraction, r.p_wear_km ?? 0, stamp(now), stamp(now)],
            t,
          );
          if (est.dampingNsPerM !== null) {
            // the damper's wear state takes the measured damping; the nightly job recomputes its
            // history with the test-lane life (createWorkshopLifeResolver) when it has duty records
            const u = lifeUsedFromDamping(est.dampingNsPerM, r.nominal_ns_per_m);
            await exec(
              `UPDATE dampers SET damping_ns_per_m = ?, life_used_fraction = ?, wear_updated_at = ?, updated_at = ?${r.energy_j > 0 ? ', wear_dirty_from = installed_at' : ''} WHERE id = ?`,
              [est.dampingNsPerM, u, stamp(now), stamp(now), r.damper_id],
              t,
            );
          }
        }
        await exec(
          `UPDATE inspections SET odometer_km = ?, notes = ?, plate_amplitude_mm = ?, results_at = ?, results_by_id = ?, follow_up_on = ?, updated_at = ?${body.complete ? `, status = 'done', completed_at = ?` : ''} WHERE id = ?`,
          [body.odometerKm, body.notes ?? null, amplitudeMm, stamp(now), user.id, followUpOn, stamp(now), ...(body.complete ? [stamp(now)] : []), id],
          t,
        );
        await exec('UPDATE vehicles SET odometer_km = MAX(odometer_km, ?), updated_at = ? WHERE id = ?', [body.odometerKm, stamp(now), i.vehicle_id], t);
      });
      await repredict(i.vehicle_id);
      return this.detail(user, id);
    },

    async addAttachment(user: SessionUser, id: number, kind: AttachmentKind, file: { buffer: Buffer; originalname: string }) {
      const i = await workshopRepository.inspectionRow(id);
      if (!i) throw AppError.notFound('Inspection');
      await scopeCheck(user, i);
      const s = storeAttachment(deps.dataDir, kind, file);
      try {
        const aid = await insert(
          `INSERT INTO inspection_attachments (inspection_id, kind, mime_type, size_bytes, stored_name, original_name, uploaded_by_id, created_at, updated_at) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)`,
          [id, kind, s.mimeType, s.sizeBytes, s.storedName, s.originalName, user.id, stamp(deps.now()), stamp(deps.now())],
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
      if (i) await scopeCheck(user, i);
      return { path: attachmentPath(deps.dataDir, a.stored_name), mimeType: a.mime_type, originalName: a.original_name };
    },

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
        const [v] = await q<{ id: number; status: string; odometer_km: number; depot_id: number }>('SELECT id, status, odometer_km, depot_id FROM vehicles WHERE id = ?', [body.vehicleId], t);
        if (!v) throw AppError.badRequest('That vehicle does not exist.', { vehicleId: 'is not a vehicle' });
        if (v.status === 'retired') throw AppError.badRequest('The vehicle is retired.', { vehicleId: 'is retired' });
        if (body.inspectionId) {
          const i = await workshopRepository.inspectionRow(body.inspectionId, t);
          if (!i || i.vehicle_id !== body.vehicleId) throw AppError.badRequest('That inspection is not one of this vehicle.', { inspectionId: 'is not an inspection of this vehicle' });
          await scopeCheck(user, i);
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
        const wid = await insert(
          `INSERT INTO work_records (vehicle_id, inspection_id, mechanic_id, performed_at, odometer_km, summary, parts_cost, labour_hours, notes, created_at, updated_at)
           VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
          [body.vehicleId, body.inspectionId ?? null, user.id, `${body.performedOn} 12:00:00.000 +00:00`, body.odometerKm, body.summary, partsCost, body.labourHours, body.notes ?? null, stamp(now), stamp(now)],
          t,
        );
        // item by item inside the transaction: a bad row rolls back everything before it
        for (const [k, it] of body.items.entries()) {
          const [fitted] = await q<{ id: number; axle_index: number; installed_odometer_km: number; installed_at: string }>(
            'SELECT id, axle_index, installed_odometer_km, installed_at FROM dampers WHERE vehicle_id = ? AND position = ? AND removed_at IS NULL',
            [body.vehicleId, it.position],
            t,
          );
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
            await exec(
              'UPDATE dampers SET removed_at = ?, removed_odometer_km = ?, removal_reason = ?, removed_by_work_record_id = ?, updated_at = ? WHERE id = ?',
              [body.performedOn, body.odometerKm, it.removalReason, wid, stamp(now), fitted.id],
              t,
            );
            installed = await insert(
              `INSERT INTO dampers (vehicle_id, position, axle_index, part_number, installed_at, installed_odometer_km, energy_j, fatigue_damage, life_used_fraction, created_at, updated_at)
               VALUES (?, ?, ?, ?, ?, ?, 0, 0, 0, ?, ?)`,
              [body.vehicleId, it.position, fitted.axle_index, it.partNumber ?? null, body.performedOn, body.odometerKm, stamp(now), stamp(now)],
              t,
            );
          }
          await exec(
            `INSERT INTO work_record_items (work_record_id, position, axle_index, component, part_description, part_number, cost, removal_reason, removed_damper_id, installed_damper_id, created_at, updated_at)
             VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
            [wid, it.position, fitted.axle_index, it.component, it.partDescription, it.partNumber ?? null, it.cost, it.removalReason, removed, installed, stamp(now), stamp(now)],
            t,
          );
        }
        if (body.inspectionId) {
          await exec(
            `UPDATE inspections SET status = 'done', completed_at = ?, odometer_km = COALESCE(odometer_km, ?), updated_at = ? WHERE id = ?`,
            [stamp(now), body.odometerKm, stamp(now), body.inspectionId],
            t,
          );
        }
        await exec('UPDATE vehicles SET odometer_km = MAX(odometer_km, ?), updated_at = ? WHERE id = ?', [body.odometerKm, stamp(now), body.vehicleId], t);
        return wid;
      });
      await repredict(body.vehicleId);
      return this.workRecord(workId);
    },

    async workRecord(id: number, user?: SessionUser) {
      const [w] = await workshopRepository.workRecords({ id });
      if (!w) throw AppError.notFound('Work record');
      if (user) await vehicleScopeCheck(user, w.vehicle_id);
      return workView(w);
    },

    async workRecords(user: SessionUser, f: { vehicleId?: number }) {
      const scope = await mechanicScope(sequelize(), user);
      const rows = await workshopRepository.workRecords({ ...f, scope: scope ? { sql: VEHICLE_SCOPE_SQL, args: vehicleScopeArgs(scope) } : undefined });
      return { items: rows.map(workView), total: rows.length };
    },

    async fleetLife(specId: number) {
      const [s] = await q<{ id: number; name: string }>('SELECT id, name FROM suspension_specs WHERE id = ?', [specId]);
      if (!s) throw AppError.notFound('Suspension spec');
      return specLife(s.id, s.name, cfg.life);
    },

    /** What the model trained only on earlier data predicted for each removal, against what happened. */
    async lifeBacktest(specId: number) {
      const [s] = await q<{ id: number; name: string }>('SELECT id, name FROM suspension_specs WHERE id = ?', [specId]);
      if (!s) throw AppError.notFound('Suspension spec');
      return { specName: s.name, ...(await backtest(s.id, cfg.life, today())) };
    },

    /** Expected damper replacements in the next `days` days, with cost, by spec and depot. */
    async forecast(days: number) {
      const from = today();
      const to = day(addDays(new Date(`${from}T00:00:00Z`), days));
      const [{ rows, lives }, km30, costs] = await Promise.all([
        Promise.all([workshopRepository.fittedCorners('all'), storedLifeModels(cfg.life.prior)]).then(([rows, lives]) => ({ rows, lives })),
        workshopRepository.km30(`${from} 23:59:59`),
        q<{ spec_id: number; cost: number; n: number }>(
          `SELECT v.spec_id, AVG(i.cost) AS cost, COUNT(*) AS n FROM work_record_items i JOIN work_records w ON w.id = i.work_record_id JOIN vehicles v ON v.id = w.vehicle_id
           WHERE i.component = 'damper' AND i.cost IS NOT NULL GROUP BY v.spec_id`,
        ),
      ]);
      // older work records without items: parts cost shared by the dampers they removed
      const legacy = await q<{ spec_id: number; cost: number }>(
        `SELECT v.spec_id, AVG(w.parts_cost / (SELECT COUNT(*) FROM dampers d WHERE d.removed_by_work_record_id = w.id)) AS cost
         FROM work_records w JOIN vehicles v ON v.id = w.vehicle_id
         WHERE w.parts_cost IS NOT NULL AND (SELECT COUNT(*) FROM dampers d WHERE d.removed_by_work_record_id = w.id) > 0 GROUP BY v.spec_id`,
      );
      const costOf = new Map<number, { cost: number; basis: string }>();
      for (const l of legacy) costOf.set(l.spec_id, { cost: l.cost, basis: 'parts cost of past work records per damper' });
      for (const c of costs) costOf.set(c.spec_id, { cost: c.cost, basis: `mean of ${c.n} damper part cost(s) recorded` });
      const meta = await q<{ id: number; fleet_number: string; depot_id: number; depot_name: string; spec_name: string }>(
        `SELECT v.id, v.fleet_number, v.depot_id, d.name AS depot_name, s.name AS spec_name FROM vehicles v JOIN depots d ON d.id = v.depot_id JOIN suspension_specs s ON s.id = v.spec_id`,
      );
      const vm = new Map(meta.map((m) => [m.id, m]));
      const items = [];
      for (const r of rows) {
        const st = cornerState(r, lives, cfg.inspectionThreshold);
        const c0 = replacementChance(r, st, days, from, to, (km30.get(r.vehicle_id) ?? 0) / 30, lives.get(r.spec_id));
        if (c0.chance < FORECAST_MIN_CHANCE) continue;
        const m = vm.get(r.vehicle_id)!;
        const c = costOf.get(r.spec_id);
        items.push({
          vehicleId: r.vehicle_id, fleetNumber: m.fleet_number, position: r.position, damperId: r.damper_id, date: st.endOfLifeDate, chance: c0.chance, basis: c0.basis,
          specId: r.spec_id, specName: m.spec_name, depotId: m.depot_id, depotName: m.depot_name, cost: c?.cost ?? null, lifeUsedFraction: st.lifeUsedFraction,
        });
      }
      items.sort((a, b) => b.chance - a.chance || a.fleetNumber.localeCompare(b.fleetNumber) || a.position.localeCompare(b.position));
      const groups = new Map<string, { specId: number; specName: string; depotId: number; depotName: string; replacements: number; cost: number; costKnown: boolean }>();
      for (const it of items) {
        const key = `${it.specId}/${it.depotId}`;
        const g = groups.get(key) ?? { specId: it.specId, specName: it.specName, depotId: it.depotId, depotName: it.depotName, replacements: 0, cost: 0, costKnown: true };
        g.replacements += it.chance;
        if (it.cost === null) g.costKnown = false;
        else g.cost += it.chance * it.cost;
        groups.set(key, g);
      }
      const rowsOut = [...groups.values()]
        .map((g) => ({ ...g, replacements: Math.round(g.replacements * 10) / 10 }))
        .sort((a, b) => a.specName.localeCompare(b.specName) || a.depotName.localeCompare(b.depotName));
      return {
        from,
        to,
        days,
        rows: rowsOut,
        totals: { replacements: Math.round(items.reduce((s, x) => s + x.chance, 0) * 10) / 10, cost: rowsOut.reduce((s, g) => s + g.cost, 0) },
        method: `Expected replacements: for each fitted damper, the chance it reaches end of life within ${days} days given it has lasted so far (its fitted Weibull life at its last 30 days' wear rate; 1 when its calendar limit falls inside), summed; dampers under ${Math.round(FORECAST_MIN_CHANCE * 100)} % are left out of the list.`,
        costBasis: [...costOf.entries()].map(([specId, c]) => ({ specId, specName: meta.find((m) => vm.get(m.id) && rows.some((r) => r.spec_id === specId && r.vehicle_id === m.id))?.spec_name ?? `spec ${specId}`, ...c })),
        items,
      };
    },

    /** Open inspections per depot and ISO week of their due date (overdue in their own column). */
    async workload(weeks: number) {
      const t = today();
      const rows = await q<{ depot_id: number; depot_name: string; due_date: string; status: string; assignee_id: number | null }>(
        `SELECT d.id AS depot_id, d.name AS depot_name, i.due_date, i.status, i.assignee_id FROM inspections i JOIN vehicles v ON v.id = i.vehicle_id
         JOIN depots d ON d.id = COALESCE(i.assigned_depot_id, v.depot_id) WHERE i.status IN ('scheduled','due','overdue')`,
      );
      const depots = await q<{ id: number; name: string; mechanics: number }>(
        `SELECT d.id, d.name, (SELECT COUNT(*) FROM users u WHERE u.depot_id = d.id AND u.role = 'mechanic' AND u.active = 1) AS mechanics FROM depots d ORDER BY d.name`,
      );
      const week0 = startOfISOWeek(new Date(`${t}T00:00:00Z`));
      const weekStarts = Array.from({ length: weeks }, (_, k) => day(addDays(week0, 7 * k)));
      const out = depots.map((d) => ({ depotId: d.id, depotName: d.name, mechanics: Number(d.mechanics), overdue: 0, later: 0, unassigned: 0, weeks: weekStarts.map((w) => ({ weekStart: w, inspections: 0 })) }));
      for (const r of rows) {
        const o = out.find((x) => x.depotId === r.depot_id);
        if (!o) continue;
        if (r.assignee_id === null) o.unassigned++;
        if (r.due_date < t) {
          o.overdue++;
          continue;
        }
        const w = day(startOfISOWeek(new Date(`${r.due_date}T00:00:00Z`)));
        const cell = o.weeks.find((x) => x.weekStart === w);
        if (cell) cell.inspections++;
        else o.later++;
      }
      return { weekStarts, depots: out };
    },

    /** Predicted against measured damping over every inspection with an estimate. */
    async modelCheck() {
      const rows = await q<{ inspection_id: number; position: string; predicted: number; measured: number; nominal: number; basis: string | null; fleet_number: string; vehicle_id: number; completed: string | null }>(
        `SELECT c.inspection_id, c.position, c.predicted_damping_ns_per_m AS predicted, c.measured_damping_ns_per_m AS measured, c.nominal_damping_ns_per_m AS nominal, c.predicted_basis AS basis,
                v.fleet_number, v.id AS vehicle_id, COALESCE(i.completed_at, i.results_at) AS completed
         FROM inspection_corners c JOIN inspections i ON i.id = c.inspection_id JOIN vehicles v ON v.id = i.vehicle_id
         WHERE c.measured_damping_ns_per_m IS NOT NULL AND c.predicted_damping_ns_per_m IS NOT NULL ORDER BY c.id`,
      );
      const [{ noEstimate }] = await q<{ noEstimate: number }>(`SELECT COUNT(*) AS noEstimate FROM inspection_corners WHERE adhesion_pct IS NOT NULL AND measured_damping_ns_per_m IS NULL`);
      const diffs = rows.map((r) => r.predicted - r.measured);
      const n = diffs.length;
      const bias = n ? diffs.reduce((s, x) => s + x, 0) / n : null;
      const spread = n > 1 ? Math.sqrt(diffs.reduce((s, x) => s + (x - bias!) ** 2, 0) / (n - 1)) : null;
      const rel = rows.map((r) => (r.predicted - r.measured) / r.nominal);
      return {
        points: rows.map((r) => ({ inspectionId: r.inspection_id, vehicleId: r.vehicle_id, fleetNumber: r.fleet_number, position: r.position, predictedNsPerM: r.predicted, measuredNsPerM: r.measured, nominalNsPerM: r.nominal, basis: r.basis, date: iso(r.completed) })),
        n,
        biasNsPerM: bias,
        spreadNsPerM: spread,
        biasPctOfNominal: n ? (rel.reduce((s, x) => s + x, 0) / n) * 100 : null,
        noEstimate: Number(noEstimate),
        definitions: 'bias = mean of (predicted − measured); spread = standard deviation of (predicted − measured), n − 1 in the denominator',
      };
    },

    /** The vehicle page's workshop view: corners, life used, predicted vs measured history. */
    async vehicleWorkshop(user: SessionUser, vehicleId: number) {
      const [v] = await q<{ id: number; spec_id: number }>('SELECT id, spec_id FROM vehicles WHERE id = ?', [vehicleId]);
      if (!v) throw AppError.notFound('Vehicle');
      await vehicleScopeCheck(user, vehicleId);
      const { by, lives } = await cornersOf([vehicleId]);
      const life = lives.get(v.spec_id)!;
      const comparisons = await q<{ inspection_id: number; position: string; adhesion_pct: number | null; predicted: number | null; measured: number | null; nominal: number; note: string | null; verdict: string; at: string | null; basis: string | null; amplitude: number | null; phase: number | null; method: string | null }>(
        `SELECT c.inspection_id, c.position, c.adhesion_pct, c.predicted_damping_ns_per_m AS predicted, c.measured_damping_ns_per_m AS measured, c.nominal_damping_ns_per_m AS nominal,
                c.estimate_note AS note, c.verdict, COALESCE(i.results_at, i.completed_at) AS at, c.predicted_basis AS basis, i.plate_amplitude_mm AS amplitude, c.phase_deg AS phase, c.estimate_method AS method
         FROM inspection_corners c JOIN inspections i ON i.id = c.inspection_id WHERE i.vehicle_id = ? ORDER BY i.results_at DESC, c.axle_index, c.position`,
        [vehicleId],
      );
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
      return q<{ id: number; vehicle_id: number }>(`SELECT id, vehicle_id FROM inspections WHERE vehicle_id IN (${inList(vehicleIds)}) AND status IN ('scheduled','due','overdue')`);
    },
  };
}

type WorkRow = Awaited<ReturnType<typeof workshopRepository.workRecords>>[number];
function workView(w: WorkRow) {
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
