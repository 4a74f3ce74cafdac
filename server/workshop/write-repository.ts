/**
 * The workshop's writes: assignments, test-lane results, attachments and work records. Each takes
 * the transaction it belongs to where the service groups several into one all-or-nothing change.
 */
import type { Transaction } from 'sequelize';
import { sqlFor } from '../db/dialect';
import { exec, insert, inTransaction, sequelize, stamp } from './repository';

export { inTransaction };

export interface CornerResultRow {
  inspectionId: number;
  damperId: number;
  position: string;
  axleIndex: number;
  adhesionPct: number | null;
  phaseDeg: number | null;
  findings: string[];
  verdict: string;
  nominalNsPerM: number;
  predictedNsPerM: number;
  predictedBasis: string;
  measuredNsPerM: number | null;
  estimateMethod: string | null;
  estimateNote: string | null;
  energyJAtTest: number;
  lifeUsedAtTest: number;
  wearKmAtTest: number;
}

export const workshopWrites = {
  /** Sets the given columns of an inspection (assignee, depot, due date). */
  async updateAssignment(id: number, set: { assigneeId?: number | null; depotId?: number | null; dueDate?: string }, now: Date) {
    const sets: string[] = [];
    const args: unknown[] = [];
    if (set.assigneeId !== undefined) { sets.push('assignee_id = ?'); args.push(set.assigneeId); }
    if (set.depotId !== undefined) { sets.push('assigned_depot_id = ?'); args.push(set.depotId); }
    if (set.dueDate !== undefined) { sets.push('due_date = ?'); args.push(set.dueDate); }
    sets.push('updated_at = ?');
    args.push(stamp(now));
    await exec(`UPDATE inspections SET ${sets.join(', ')} WHERE id = ?`, [...args, id]);
  },

  /** Replaces an inspection's corner results with the given rows. */
  async replaceCornerResults(inspectionId: number, rows: CornerResultRow[], now: Date, t: Transaction) {
    await exec('DELETE FROM inspection_corners WHERE inspection_id = ?', [inspectionId], t);
    for (const r of rows) {
      await exec(
        `INSERT INTO inspection_corners (inspection_id, damper_id, position, axle_index, adhesion_pct, phase_deg, findings, verdict, nominal_damping_ns_per_m, predicted_damping_ns_per_m,
           predicted_basis, measured_damping_ns_per_m, estimate_method, estimate_note, energy_j_at_test, life_used_at_test, wear_km_at_test, created_at, updated_at)
         VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
        [r.inspectionId, r.damperId, r.position, r.axleIndex, r.adhesionPct, r.phaseDeg, JSON.stringify(r.findings), r.verdict, r.nominalNsPerM, r.predictedNsPerM,
          r.predictedBasis, r.measuredNsPerM, r.estimateMethod, r.estimateNote, r.energyJAtTest, r.lifeUsedAtTest, r.wearKmAtTest, stamp(now), stamp(now)],
        t,
      );
    }
  },

  /**
   * A damper takes a measured damping and the life used it implies; with duty on record its wear
   * history is marked for the nightly job to recompute from fitting.
   */
  async setMeasuredDamping(damperId: number, dampingNsPerM: number, lifeUsedFraction: number, recompute: boolean, now: Date, t: Transaction) {
    await exec(
      `UPDATE dampers SET damping_ns_per_m = ?, life_used_fraction = ?, wear_updated_at = ?, updated_at = ?${recompute ? ', wear_dirty_from = installed_at' : ''} WHERE id = ?`,
      [dampingNsPerM, lifeUsedFraction, stamp(now), stamp(now), damperId],
      t,
    );
  },

  async saveResults(
    id: number,
    r: { odometerKm: number; notes: string | null; plateAmplitudeMm: number; byId: number; followUpOn: string | null; complete: boolean },
    now: Date,
    t: Transaction,
  ) {
    await exec(
      `UPDATE inspections SET odometer_km = ?, notes = ?, plate_amplitude_mm = ?, results_at = ?, results_by_id = ?, follow_up_on = ?, updated_at = ?${r.complete ? `, status = 'done', completed_at = ?` : ''} WHERE id = ?`,
      [r.odometerKm, r.notes, r.plateAmplitudeMm, stamp(now), r.byId, r.followUpOn, stamp(now), ...(r.complete ? [stamp(now)] : []), id],
      t,
    );
  },

  /** The vehicle's odometer takes a workshop reading if it is higher (a reading never lowers it). */
  async raiseOdometer(vehicleId: number, km: number, now: Date, t: Transaction) {
    await exec(`UPDATE vehicles SET odometer_km = ${sqlFor(sequelize()).greatest}(odometer_km, ?), updated_at = ? WHERE id = ?`, [km, stamp(now), vehicleId], t);
  },

  async insertAttachment(a: { inspectionId: number; kind: string; mimeType: string; sizeBytes: number; storedName: string; originalName: string; uploadedById: number }, now: Date) {
    return insert(
      `INSERT INTO inspection_attachments (inspection_id, kind, mime_type, size_bytes, stored_name, original_name, uploaded_by_id, created_at, updated_at) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)`,
      [a.inspectionId, a.kind, a.mimeType, a.sizeBytes, a.storedName, a.originalName, a.uploadedById, stamp(now), stamp(now)],
    );
  },

  async insertWorkRecord(
    w: { vehicleId: number; inspectionId: number | null; mechanicId: number; performedOn: string; odometerKm: number; summary: string; partsCost: number; labourHours: number; notes: string | null },
    now: Date,
    t: Transaction,
  ) {
    return insert(
      `INSERT INTO work_records (vehicle_id, inspection_id, mechanic_id, performed_at, odometer_km, summary, parts_cost, labour_hours, notes, created_at, updated_at)
       VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
      [w.vehicleId, w.inspectionId, w.mechanicId, `${w.performedOn} 12:00:00.000 +00:00`, w.odometerKm, w.summary, w.partsCost, w.labourHours, w.notes, stamp(now), stamp(now)],
      t,
    );
  },

  /** Retires the fitted damper `damperId` and fits a new one at the same corner; returns the new damper's id. */
  async replaceDamper(
    old: { damperId: number; vehicleId: number; position: string; axleIndex: number },
    r: { on: string; odometerKm: number; reason: string; workRecordId: number; partNumber: string | null },
    now: Date,
    t: Transaction,
  ) {
    await exec(
      'UPDATE dampers SET removed_at = ?, removed_odometer_km = ?, removal_reason = ?, removed_by_work_record_id = ?, updated_at = ? WHERE id = ?',
      [r.on, r.odometerKm, r.reason, r.workRecordId, stamp(now), old.damperId],
      t,
    );
    return insert(
      `INSERT INTO dampers (vehicle_id, position, axle_index, part_number, installed_at, installed_odometer_km, energy_j, fatigue_damage, life_used_fraction, created_at, updated_at)
       VALUES (?, ?, ?, ?, ?, ?, 0, 0, 0, ?, ?)`,
      [old.vehicleId, old.position, old.axleIndex, r.partNumber, r.on, r.odometerKm, stamp(now), stamp(now)],
      t,
    );
  },

  async insertWorkItem(
    it: { workRecordId: number; position: string; axleIndex: number; component: string; partDescription: string; partNumber: string | null; cost: number; removalReason: string; removedDamperId: number | null; installedDamperId: number | null },
    now: Date,
    t: Transaction,
  ) {
    await exec(
      `INSERT INTO work_record_items (work_record_id, position, axle_index, component, part_description, part_number, cost, removal_reason, removed_damper_id, installed_damper_id, created_at, updated_at)
       VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
      [it.workRecordId, it.position, it.axleIndex, it.component, it.partDescription, it.partNumber, it.cost, it.removalReason, it.removedDamperId, it.installedDamperId, stamp(now), stamp(now)],
      t,
    );
  },

  /** Closes an inspection by the work that answered it (its odometer kept if results gave one). */
  async closeByWork(inspectionId: number, odometerKm: number, now: Date, t: Transaction) {
    await exec(`UPDATE inspections SET status = 'done', completed_at = ?, odometer_km = COALESCE(odometer_km, ?), updated_at = ? WHERE id = ?`, [stamp(now), odometerKm, stamp(now), inspectionId], t);
  },
};
