/**
 * What the mail rules read and mark outside the mail tables: who gets a digest, the inspections
 * that became due or overdue since managers were told, and assignments not yet told to their
 * mechanic. Each runs in the transaction that queues the mail, so an item is marked told exactly
 * when its message is queued.
 */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';

/** Ids per statement when marking many rows (well under SQLite's expression-depth limit). */
const CHUNK = 5000;

async function inChunks(ids: number[], fn: (chunk: string) => Promise<unknown>) {
  for (let i = 0; i < ids.length; i += CHUNK) await fn(ids.slice(i, i + CHUNK).map(Number).join(','));
}

export const noticeRepository = {
  /** Active managers with their depot and digest preferences. */
  digestRecipients(sq: Sequelize, transaction: Transaction) {
    return sq.query<{ id: number; name: string; email: string; depot_id: number | null; notify_inspection_digest: number; notify_ride_reports: number }>(
      `SELECT id, name, email, depot_id, notify_inspection_digest, notify_ride_reports FROM users WHERE role = 'manager' AND active ORDER BY id`,
      { type: QueryTypes.SELECT, transaction },
    );
  },

  /** Inspections due or overdue whose status managers have not been told, earliest first. */
  untoldDueInspections(sq: Sequelize, transaction: Transaction) {
    return sq.query<{ id: number; status: string; due_date: string; reason: string; vehicle_id: number; fleet_number: string; plate: string; depot_id: number; depot_name: string }>(
      `SELECT i.id, i.status, i.due_date, i.reason, v.id AS vehicle_id, v.fleet_number, v.plate, v.depot_id, d.name AS depot_name
       FROM inspections i JOIN vehicles v ON v.id = i.vehicle_id JOIN depots d ON d.id = v.depot_id
       WHERE i.status IN ('due', 'overdue') AND (i.notified_status IS NULL OR i.notified_status != i.status)
       ORDER BY i.due_date, v.fleet_number`,
      { type: QueryTypes.SELECT, transaction },
    );
  },

  /** Records that managers were told these inspections have this status. */
  async markStatusTold(sq: Sequelize, ids: number[], status: string, transaction: Transaction) {
    await inChunks(ids, (list) => sq.query(`UPDATE inspections SET notified_status = ? WHERE id IN (${list})`, { replacements: [status], transaction }));
  },

  /** Open inspections whose assignee has not been told (all, or the given ones), with the assignee. */
  untoldAssignments(sq: Sequelize, inspectionIds: number[] | undefined, transaction: Transaction) {
    return sq.query<{ id: number; due_date: string; status: string; reason: string; vehicle_id: number; fleet_number: string; plate: string; depot_name: string; user_id: number; name: string; email: string; notify: number; active: number }>(
      `SELECT i.id, i.due_date, i.status, i.reason, v.id AS vehicle_id, v.fleet_number, v.plate, d.name AS depot_name, u.id AS user_id, u.name, u.email, u.notify_assignments AS notify, u.active
       FROM inspections i JOIN vehicles v ON v.id = i.vehicle_id JOIN depots d ON d.id = v.depot_id JOIN users u ON u.id = i.assignee_id
       WHERE i.status IN ('scheduled', 'due', 'overdue') AND (i.assignee_notified_id IS NULL OR i.assignee_notified_id != i.assignee_id)
       ${inspectionIds ? `AND i.id IN (${inspectionIds.map(Number).join(',') || 'NULL'})` : ''} ORDER BY i.id`,
      { type: QueryTypes.SELECT, transaction },
    );
  },

  /** Records that each of these inspections' assignee was told. */
  async markAssigneeTold(sq: Sequelize, ids: number[], transaction: Transaction) {
    await inChunks(ids, (list) => sq.query(`UPDATE inspections SET assignee_notified_id = assignee_id WHERE id IN (${list})`, { transaction }));
  },
};
