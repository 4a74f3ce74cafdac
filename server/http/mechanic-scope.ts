/**
 * The mechanic's scope, one rule for every workshop read and write (stated in the README,
 * "Who sees what"):
 *
 * - an inspection is a mechanic's when it is assigned to them, or unassigned and its depot (the
 *   depot it was sent to, else the vehicle's) is the mechanic's depot. Only these appear in their
 *   inspection list and due list, open in detail, show their attachments and take their results;
 * - a vehicle's workshop records (work records, the vehicle's workshop view) are a mechanic's when
 *   the vehicle belongs to their depot or has an inspection that is theirs; a work record without
 *   an inspection may only be written for a vehicle of their depot.
 *
 * Managers see and act on everything. The SQL fragments take `?` placeholders in the order given.
 */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { SessionUser } from './access';

/** Condition on `i` (inspections) joined with `v` (vehicles); arguments: user id, depot id. */
export const INSPECTION_SCOPE_SQL = '(i.assignee_id = ? OR (i.assignee_id IS NULL AND COALESCE(i.assigned_depot_id, v.depot_id) = ?))';

/** Condition on `v` (vehicles); arguments: depot id, user id, depot id. */
export const VEHICLE_SCOPE_SQL = `(v.depot_id = ? OR EXISTS (SELECT 1 FROM inspections si WHERE si.vehicle_id = v.id
  AND (si.assignee_id = ? OR (si.assignee_id IS NULL AND COALESCE(si.assigned_depot_id, v.depot_id) = ?))))`;

export interface MechanicScope {
  userId: number;
  /** The mechanic's depot; -1 when they have none (then only inspections assigned to them count). */
  depotId: number;
}

/** The scope of a mechanic, or null for a manager (no restriction). Drivers never reach these routes. */
export async function mechanicScope(sequelize: Sequelize, user: SessionUser, transaction?: Transaction): Promise<MechanicScope | null> {
  if (user.role === 'manager') return null;
  const [row] = await sequelize.query<{ depot_id: number | null }>('SELECT depot_id FROM users WHERE id = ?', {
    replacements: [user.id],
    type: QueryTypes.SELECT,
    transaction,
  });
  return { userId: user.id, depotId: row?.depot_id ?? -1 };
}

export const inspectionScopeArgs = (s: MechanicScope) => [s.userId, s.depotId];
export const vehicleScopeArgs = (s: MechanicScope) => [s.depotId, s.userId, s.depotId];

/** Whether an inspection row is the mechanic's (the same rule as {@link INSPECTION_SCOPE_SQL}). */
export function inspectionInScope(s: MechanicScope, i: { assignee_id: number | null; assigned_depot_id: number | null; vehicle_depot_id: number }) {
  return i.assignee_id === s.userId || (i.assignee_id === null && (i.assigned_depot_id ?? i.vehicle_depot_id) === s.depotId);
}

/** Whether a vehicle's workshop records are the mechanic's (the same rule as {@link VEHICLE_SCOPE_SQL}). */
export async function vehicleInScope(sequelize: Sequelize, s: MechanicScope, vehicleId: number, transaction?: Transaction) {
  const rows = await sequelize.query(`SELECT 1 AS ok FROM vehicles v WHERE v.id = ? AND ${VEHICLE_SCOPE_SQL}`, {
    replacements: [vehicleId, ...vehicleScopeArgs(s)],
    type: QueryTypes.SELECT,
    transaction,
  });
  return rows.length > 0;
}
