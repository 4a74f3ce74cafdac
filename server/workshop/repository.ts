/**
 * Workshop data access (the only workshop code that talks to the database). Plain objects out.
 */
import { QueryTypes, type Transaction } from 'sequelize';
import { Damper } from '../db/models';
import { isPostgres, sqlFor } from '../db/dialect';

const db = () => Damper.sequelize!;
export const sequelize = db;
export const q = <T extends object>(sql: string, replacements: unknown[] = [], transaction?: Transaction) =>
  db().query<T>(sql, { replacements: replacements as never, type: QueryTypes.SELECT, transaction });
export const exec = (sql: string, replacements: unknown[] = [], transaction?: Transaction) => db().query(sql, { replacements: replacements as never, transaction });
export const insert = async (sql: string, replacements: unknown[], transaction?: Transaction): Promise<number> => {
  if (isPostgres(db())) return (await q<{ id: number }>(`${sql} RETURNING id`, replacements, transaction))[0].id;
  await db().query(sql, { replacements: replacements as never, transaction });
  const [row] = await q<{ id: number }>('SELECT last_insert_rowid() AS id', [], transaction);
  return row.id;
};
export const inTransaction = <T>(fn: (t: Transaction) => Promise<T>) => db().transaction(fn);
/** Sequelize's SQLite text form of an instant, for the raw statements below. */
export { sqlStamp as stamp } from '../lib/days';
export const inList = (ids: number[]) => (ids.length ? ids.map((i) => Number(i)).join(',') : 'NULL');

export interface FittedCornerRow {
  damper_id: number;
  vehicle_id: number;
  position: string;
  axle_index: number;
  part_number: string | null;
  installed_at: string;
  installed_odometer_km: number;
  energy_j: number;
  life_used_fraction: number;
  damping_ns_per_m: number | null;
  wear_updated_at: string | null;
  odometer_km: number;
  spec_id: number;
  sprung_mass_kg: number;
  unsprung_mass_kg: number;
  spring_rate_n_per_m: number;
  nominal_ns_per_m: number;
  tire_rate_n_per_m: number;
  rated_damper_life_km: number;
  p_life: number | null;
  p_damping: number | null;
  p_source: string | null;
  p_threshold_date: string | null;
  p_end_date: string | null;
  p_rate: number | null;
  p_life_wear_km: number | null;
  p_window_km: number | null;
  p_window_wear_km: number | null;
  p_end_p10: string | null;
  p_end_p90: string | null;
  p_opening_share: number | null;
  p_p10_wear_km: number | null;
  p_p90_wear_km: number | null;
  p_wear_km: number | null;
  p_governed: string | null;
  p_distance_life: number | null;
}

export const workshopRepository = {
  /** Installed dampers with their spec axle and the nightly job's latest prediction. */
  async fittedCorners(vehicleIds: number[] | 'all', transaction?: Transaction): Promise<FittedCornerRow[]> {
    return q<FittedCornerRow>(
      `SELECT d.id AS damper_id, d.vehicle_id, d.position, d.axle_index, d.part_number, d.installed_at, d.installed_odometer_km, d.energy_j,
              d.life_used_fraction, d.damping_ns_per_m, d.wear_updated_at, v.odometer_km, v.spec_id,
              a.sprung_mass_kg, a.unsprung_mass_kg, a.spring_rate_n_per_m, a.damping_ns_per_m AS nominal_ns_per_m, a.tire_rate_n_per_m, a.rated_damper_life_km,
              p.life_used_fraction AS p_life, p.damping_ns_per_m AS p_damping, p.life_source AS p_source, p.threshold_date AS p_threshold_date,
              p.end_of_life_date AS p_end_date, p.wear_km_per_day AS p_rate, p.life_wear_km AS p_life_wear_km, p.window_km AS p_window_km,
              p.window_wear_km AS p_window_wear_km, p.end_of_life_p10_date AS p_end_p10, p.end_of_life_p90_date AS p_end_p90, p.opening_share AS p_opening_share,
              p.life_p10_wear_km AS p_p10_wear_km, p.life_p90_wear_km AS p_p90_wear_km, p.wear_km AS p_wear_km, p.governed_by AS p_governed, p.distance_life_used AS p_distance_life
       FROM dampers d JOIN vehicles v ON v.id = d.vehicle_id
       JOIN spec_axles a ON a.spec_id = v.spec_id AND a.axle_index = d.axle_index
       LEFT JOIN damper_predictions p ON p.damper_id = d.id
       WHERE d.removed_at IS NULL AND v.status != 'retired' ${vehicleIds === 'all' ? '' : `AND d.vehicle_id IN (${inList(vehicleIds)})`}
       ORDER BY d.vehicle_id, d.axle_index, d.position`,
      [],
      transaction,
    );
  },

  /** Distance per vehicle over the last 30 days of trips before `before` [km]. */
  async km30(before: string) {
    const rows = await q<{ vehicle_id: number; km: number }>(
      `SELECT vehicle_id, SUM(distance_km) AS km FROM trips WHERE started_at >= ${sqlFor(db()).daysBefore('?', 30)} AND started_at < ? GROUP BY vehicle_id`,
      [before, before],
    );
    return new Map(rows.map((r) => [r.vehicle_id, Number(r.km)]));
  },

  async user(id: number) {
    const [u] = await q<{ id: number; name: string; role: string; depot_id: number | null; active: number }>('SELECT id, name, role, depot_id, active FROM users WHERE id = ?', [id]);
    return u ?? null;
  },

  async inspectionRow(id: number, transaction?: Transaction) {
    const [r] = await q<{
      id: number; vehicle_id: number; due_date: string; status: string; reason: string; assignee_id: number | null; assigned_depot_id: number | null;
      completed_at: string | null; odometer_km: number | null; notes: string | null; trigger: string | null; basis: string | null; results_at: string | null;
      results_by_id: number | null; follow_up_on: string | null; plate_amplitude_mm: number | null; vehicle_depot_id: number; fleet_number: string; plate: string; spec_id: number; vehicle_odometer_km: number; vehicle_status: string;
    }>(
      `SELECT i.id, i.vehicle_id, i.due_date, i.status, i.reason, i.assignee_id, i.assigned_depot_id, i.completed_at, i.odometer_km, i.notes, i."trigger", i.basis,
              i.results_at, i.results_by_id, i.follow_up_on, i.plate_amplitude_mm, v.depot_id AS vehicle_depot_id, v.fleet_number, v.plate, v.spec_id, v.odometer_km AS vehicle_odometer_km, v.status AS vehicle_status
       FROM inspections i JOIN vehicles v ON v.id = i.vehicle_id WHERE i.id = ?`,
      [id],
      transaction,
    );
    return r ?? null;
  },

  async cornerResults(inspectionIds: number[]) {
    return q<{
      id: number; inspection_id: number; damper_id: number | null; position: string; axle_index: number; adhesion_pct: number | null; findings: string; verdict: string;
      nominal_damping_ns_per_m: number; predicted_damping_ns_per_m: number | null; predicted_basis: string | null; measured_damping_ns_per_m: number | null;
      estimate_note: string | null; energy_j_at_test: number | null; life_used_at_test: number | null; phase_deg: number | null; estimate_method: string | null;
    }>(`SELECT * FROM inspection_corners WHERE inspection_id IN (${inList(inspectionIds)}) ORDER BY inspection_id, axle_index, position`);
  },

  async attachments(inspectionId: number) {
    return q<{ id: number; kind: string; mime_type: string; size_bytes: number; original_name: string; created_at: string; uploaded_by_id: number | null }>(
      'SELECT id, kind, mime_type, size_bytes, original_name, created_at, uploaded_by_id FROM inspection_attachments WHERE inspection_id = ? ORDER BY id',
      [inspectionId],
    );
  },

  async attachment(id: number) {
    const [r] = await q<{ id: number; inspection_id: number; mime_type: string; stored_name: string; original_name: string }>(
      'SELECT id, inspection_id, mime_type, stored_name, original_name FROM inspection_attachments WHERE id = ?',
      [id],
    );
    return r ?? null;
  },

  async workRecords(where: { vehicleId?: number; inspectionId?: number; id?: number; scope?: { sql: string; args: unknown[] } }) {
    const cond: string[] = [];
    const args: unknown[] = [];
    if (where.scope) { cond.push(where.scope.sql); args.push(...where.scope.args); }
    if (where.vehicleId) { cond.push('w.vehicle_id = ?'); args.push(where.vehicleId); }
    if (where.inspectionId) { cond.push('w.inspection_id = ?'); args.push(where.inspectionId); }
    if (where.id) { cond.push('w.id = ?'); args.push(where.id); }
    const rows = await q<{
      id: number; vehicle_id: number; inspection_id: number | null; mechanic_id: number | null; mechanic_name: string | null; performed_at: string; odometer_km: number;
      summary: string; parts_cost: number | null; labour_hours: number | null; notes: string | null; fleet_number: string; plate: string; depot_name: string; spec_name: string;
    }>(
      `SELECT w.id, w.vehicle_id, w.inspection_id, w.mechanic_id, u.name AS mechanic_name, w.performed_at, w.odometer_km, w.summary, w.parts_cost, w.labour_hours, w.notes,
              v.fleet_number, v.plate, d.name AS depot_name, s.name AS spec_name
       FROM work_records w JOIN vehicles v ON v.id = w.vehicle_id JOIN depots d ON d.id = v.depot_id JOIN suspension_specs s ON s.id = v.spec_id
       LEFT JOIN users u ON u.id = w.mechanic_id ${cond.length ? `WHERE ${cond.join(' AND ')}` : ''} ORDER BY w.performed_at DESC, w.id DESC LIMIT 200`,
      args,
    );
    const items = await q<{
      id: number; work_record_id: number; position: string; axle_index: number; component: string; part_description: string; part_number: string | null; cost: number | null;
      removal_reason: string; removed_damper_id: number | null; installed_damper_id: number | null;
    }>(`SELECT * FROM work_record_items WHERE work_record_id IN (${inList(rows.map((r) => r.id))}) ORDER BY work_record_id, axle_index, position, component`);
    return rows.map((r) => ({ ...r, items: items.filter((i) => i.work_record_id === r.id) }));
  },

  /** Life records of every damper ever fitted to vehicles of a spec. */
  async specs() {
    return q<{ id: number; name: string }>('SELECT id, name FROM suspension_specs ORDER BY name');
  },

  /** The latest test-lane estimate of each installed damper that has one. */
  async latestMeasurements() {
    return q<{ damper_id: number; measured_damping_ns_per_m: number; nominal_damping_ns_per_m: number; wear_km_at_test: number; inspection_id: number }>(
      `SELECT c.damper_id, c.measured_damping_ns_per_m, c.nominal_damping_ns_per_m, COALESCE(c.wear_km_at_test, 0) AS wear_km_at_test, c.inspection_id
       FROM inspection_corners c JOIN dampers d ON d.id = c.damper_id
       WHERE d.removed_at IS NULL AND c.measured_damping_ns_per_m IS NOT NULL
         AND c.id = (SELECT x.id FROM inspection_corners x WHERE x.damper_id = c.damper_id AND x.measured_damping_ns_per_m IS NOT NULL ORDER BY x.id DESC LIMIT 1)`,
    );
  },

  async damperSpecs() {
    return q<{ id: number; spec_id: number; axle_index: number }>(
      'SELECT d.id, v.spec_id, d.axle_index FROM dampers d JOIN vehicles v ON v.id = d.vehicle_id WHERE d.removed_at IS NULL',
    );
  },

  async specName(id: number) {
    const [s] = await q<{ id: number; name: string }>('SELECT id, name FROM suspension_specs WHERE id = ?', [id]);
    return s ?? null;
  },

  async specClass(id: number) {
    const [s] = await q<{ vehicle_class: string }>('SELECT vehicle_class FROM suspension_specs WHERE id = ?', [id]);
    return s?.vehicle_class ?? null;
  },

  async depot(id: number) {
    const [d] = await q<{ id: number; name: string }>('SELECT id, name FROM depots WHERE id = ?', [id]);
    return d ?? null;
  },

  /** One page of inspections under the given conditions (SQL over `i` inspections, `v` vehicles), with the total. */
  async inspectionPage(where: { cond: string[]; args: unknown[] }, order: { column: string; dir: 'ASC' | 'DESC' }, page: { limit: number; offset: number }) {
    const w = where.cond.length ? `WHERE ${where.cond.join(' AND ')}` : '';
    const from = `FROM inspections i JOIN vehicles v ON v.id = i.vehicle_id JOIN depots d ON d.id = COALESCE(i.assigned_depot_id, v.depot_id) LEFT JOIN users u ON u.id = i.assignee_id`;
    const [{ n }] = await q<{ n: number }>(`SELECT COUNT(*) AS n ${from} ${w}`, where.args);
    const rows = await q<{
      id: number; vehicle_id: number; fleet_number: string; plate: string; due_date: string; status: string; reason: string; trigger: string | null;
      assignee_id: number | null; assignee_name: string | null; depot_id: number; depot_name: string; assigned_depot_id: number | null; results_at: string | null; completed_at: string | null;
    }>(
      `SELECT i.id, i.vehicle_id, v.fleet_number, v.plate, i.due_date, i.status, i.reason, i."trigger", i.assignee_id, u.name AS assignee_name, d.id AS depot_id, d.name AS depot_name,
              i.assigned_depot_id, i.results_at, i.completed_at
       ${from} ${w} ORDER BY ${order.column} ${order.dir}, v.fleet_number LIMIT ? OFFSET ?`,
      [...where.args, page.limit, page.offset],
    );
    return { total: Number(n), rows };
  },

  /** The vehicle a work record is for, read inside the record's transaction. */
  async vehicleForWork(id: number, transaction: Transaction) {
    const [v] = await q<{ id: number; status: string; odometer_km: number; depot_id: number }>('SELECT id, status, odometer_km, depot_id FROM vehicles WHERE id = ?', [id], transaction);
    return v ?? null;
  },

  async vehicleSpecId(id: number) {
    const [v] = await q<{ id: number; spec_id: number }>('SELECT id, spec_id FROM vehicles WHERE id = ?', [id]);
    return v ?? null;
  },

  /** The damper fitted at a corner now, read inside a work record's transaction. */
  async fittedAt(vehicleId: number, position: string, transaction: Transaction) {
    const [d] = await q<{ id: number; axle_index: number; installed_odometer_km: number; installed_at: string }>(
      'SELECT id, axle_index, installed_odometer_km, installed_at FROM dampers WHERE vehicle_id = ? AND position = ? AND removed_at IS NULL',
      [vehicleId, position],
      transaction,
    );
    return d ?? null;
  },

  /** Mean damper part cost per spec from work record items. */
  async damperPartCosts() {
    return q<{ spec_id: number; cost: number; n: number }>(
      `SELECT v.spec_id, AVG(i.cost) AS cost, COUNT(*) AS n FROM work_record_items i JOIN work_records w ON w.id = i.work_record_id JOIN vehicles v ON v.id = w.vehicle_id
       WHERE i.component = 'damper' AND i.cost IS NOT NULL GROUP BY v.spec_id`,
    );
  },

  /** Older work records without items: parts cost shared by the dampers they removed, per spec. */
  async legacyDamperCosts() {
    return q<{ spec_id: number; cost: number }>(
      `SELECT v.spec_id, AVG(w.parts_cost / (SELECT COUNT(*) FROM dampers d WHERE d.removed_by_work_record_id = w.id)) AS cost
       FROM work_records w JOIN vehicles v ON v.id = w.vehicle_id
       WHERE w.parts_cost IS NOT NULL AND (SELECT COUNT(*) FROM dampers d WHERE d.removed_by_work_record_id = w.id) > 0 GROUP BY v.spec_id`,
    );
  },

  async vehicleNames() {
    return q<{ id: number; fleet_number: string; depot_id: number; depot_name: string; spec_name: string }>(
      `SELECT v.id, v.fleet_number, v.depot_id, d.name AS depot_name, s.name AS spec_name FROM vehicles v JOIN depots d ON d.id = v.depot_id JOIN suspension_specs s ON s.id = v.spec_id`,
    );
  },

  /** Every open inspection with the depot that does it (assigned, else the vehicle's). */
  async openInspectionsByDepot() {
    return q<{ depot_id: number; depot_name: string; due_date: string; status: string; assignee_id: number | null }>(
      `SELECT d.id AS depot_id, d.name AS depot_name, i.due_date, i.status, i.assignee_id FROM inspections i JOIN vehicles v ON v.id = i.vehicle_id
       JOIN depots d ON d.id = COALESCE(i.assigned_depot_id, v.depot_id) WHERE i.status IN ('scheduled','due','overdue')`,
    );
  },

  async depotsWithMechanics() {
    return q<{ id: number; name: string; mechanics: number }>(
      `SELECT d.id, d.name, (SELECT COUNT(*) FROM users u WHERE u.depot_id = d.id AND u.role = 'mechanic' AND u.active) AS mechanics FROM depots d ORDER BY d.name`,
    );
  },

  /** Predicted against measured damping of every corner that has both. */
  async predictedAgainstMeasured() {
    return q<{ inspection_id: number; position: string; predicted: number; measured: number; nominal: number; basis: string | null; fleet_number: string; vehicle_id: number; completed: string | null }>(
      `SELECT c.inspection_id, c.position, c.predicted_damping_ns_per_m AS predicted, c.measured_damping_ns_per_m AS measured, c.nominal_damping_ns_per_m AS nominal, c.predicted_basis AS basis,
              v.fleet_number, v.id AS vehicle_id, COALESCE(i.completed_at, i.results_at) AS completed
       FROM inspection_corners c JOIN inspections i ON i.id = c.inspection_id JOIN vehicles v ON v.id = i.vehicle_id
       WHERE c.measured_damping_ns_per_m IS NOT NULL AND c.predicted_damping_ns_per_m IS NOT NULL ORDER BY c.id`,
    );
  },

  /** Corners with an adhesion reading that gave no damping estimate. */
  async cornersWithoutEstimate() {
    const [{ n }] = await q<{ n: number }>(`SELECT COUNT(*) AS n FROM inspection_corners WHERE adhesion_pct IS NOT NULL AND measured_damping_ns_per_m IS NULL`);
    return Number(n);
  },

  /** A vehicle's lane results against the predictions, newest first. */
  async vehicleComparisons(vehicleId: number) {
    return q<{ inspection_id: number; position: string; adhesion_pct: number | null; predicted: number | null; measured: number | null; nominal: number; note: string | null; verdict: string; at: string | null; basis: string | null; amplitude: number | null; phase: number | null; method: string | null }>(
      `SELECT c.inspection_id, c.position, c.adhesion_pct, c.predicted_damping_ns_per_m AS predicted, c.measured_damping_ns_per_m AS measured, c.nominal_damping_ns_per_m AS nominal,
              c.estimate_note AS note, c.verdict, COALESCE(i.results_at, i.completed_at) AS at, c.predicted_basis AS basis, i.plate_amplitude_mm AS amplitude, c.phase_deg AS phase, c.estimate_method AS method
       FROM inspection_corners c JOIN inspections i ON i.id = c.inspection_id WHERE i.vehicle_id = ? ORDER BY i.results_at DESC, c.axle_index, c.position`,
      [vehicleId],
    );
  },

  async openInspectionsOf(vehicleIds: number[]) {
    return q<{ id: number; vehicle_id: number }>(`SELECT id, vehicle_id FROM inspections WHERE vehicle_id IN (${inList(vehicleIds)}) AND status IN ('scheduled','due','overdue')`);
  },
};
