// What the mail rules read and mark outside the mail tables (server/mail/notice-repository.ts), on
// the demo fleet's vehicles and depots with every demo inspection closed and every demo user
// deactivated, so only the rows planted here count: who gets a digest, the inspections managers
// have not been told about, the assignments not told to their mechanic, and the marking in chunks.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { noticeRepository } from '../../../server/mail/notice-repository';
import { startTestServer, type TestServer } from '../../support/server';

let srv: TestServer;
let sq: Sequelize;
type Vehicle = { id: number; fleet_number: string; plate: string; depot_id: number; depot_name: string };
/** Demo vehicles with their depot's name: `b` in another depot than `a`, the rest in fleet-number order (one open inspection each, as the schema allows). */
let a: Vehicle;
let b: Vehicle;
let v: Vehicle[];
const users: Record<string, number> = {};

const select = <T extends object>(q: string, replacements: unknown[] = []) => sq.query<T>(q, { replacements, type: QueryTypes.SELECT });

async function addUser(key: string, role: string, o: { active?: boolean; depot?: number | null; notify?: boolean } = {}) {
  await sq.query(
    `INSERT INTO users (name, email, role, password_hash, active, depot_id, notify_inspection_digest, notify_ride_reports, notify_assignments, created_at, updated_at)
     VALUES (?, ?, ?, 'x', ?, ?, TRUE, FALSE, ?, CURRENT_TIMESTAMP, CURRENT_TIMESTAMP)`,
    { replacements: [`Person ${key}`, `${key}@notice.test`, role, o.active ?? true, o.depot ?? null, o.notify ?? true] },
  );
  users[key] = (await select<{ id: number }>('SELECT id FROM users WHERE email = ?', [`${key}@notice.test`]))[0].id;
}

async function addInspection(vehicle: number, status: string, due: string, o: { notified?: string | null; assignee?: number | null; assigneeNotified?: number | null } = {}) {
  await sq.query(
    `INSERT INTO inspections (vehicle_id, due_date, status, reason, notified_status, assignee_id, assignee_notified_id, created_at, updated_at)
     VALUES (?, ?, ?, ?, ?, ?, ?, CURRENT_TIMESTAMP, CURRENT_TIMESTAMP)`,
    { replacements: [vehicle, due, status, `Reason ${status} ${due}`, o.notified ?? null, o.assignee ?? null, o.assigneeNotified ?? null] },
  );
  return (await select<{ id: number }>('SELECT MAX(id) AS id FROM inspections'))[0].id;
}

const ins: Record<string, number> = {};

beforeAll(async () => {
  srv = await startTestServer();
  sq = srv.db.sequelize;
  await sq.query(`UPDATE inspections SET status = 'done'`);
  await sq.query(`UPDATE users SET active = FALSE`);
  const vs = await select<typeof a>(
    `SELECT v.id, v.fleet_number, v.plate, v.depot_id, d.name AS depot_name FROM vehicles v JOIN depots d ON d.id = v.depot_id ORDER BY v.fleet_number`,
  );
  a = vs[0];
  b = vs.find((x) => x.depot_id !== a.depot_id)!;
  v = vs.filter((x) => x.id !== b.id);
  await addUser('m1', 'manager', { depot: a.depot_id });
  await addUser('m2', 'manager');
  await addUser('mGone', 'manager', { active: false });
  await addUser('mech', 'mechanic', { depot: a.depot_id });
  await addUser('mech2', 'mechanic', { notify: false, active: false });
  await addUser('driver', 'driver');
  // told about: due and told due; untold: overdue told due, due never told, overdue never told (two on one day)
  ins.toldDue = await addInspection(v[1].id, 'due', '2026-12-01', { notified: 'due' });
  // the later fleet number first, so the order by fleet number is not the order of ids
  ins.overdueLater = await addInspection(v[3].id, 'overdue', '2026-11-28');
  ins.overdueWasDue = await addInspection(v[2].id, 'overdue', '2026-11-28', { notified: 'due' });
  ins.dueNew = await addInspection(b.id, 'due', '2026-12-03');
  ins.scheduled = await addInspection(v[4].id, 'scheduled', '2026-12-20', { assignee: users.mech });
  ins.done = await addInspection(v[0].id, 'done', '2026-11-01', { assignee: users.mech });
  ins.cancelled = await addInspection(v[0].id, 'cancelled', '2026-11-02', { assignee: users.mech });
  ins.toldAssignee = await addInspection(v[5].id, 'due', '2026-12-04', { notified: 'due', assignee: users.mech, assigneeNotified: users.mech });
  ins.reassigned = await addInspection(v[6].id, 'overdue', '2026-11-29', { notified: 'overdue', assignee: users.mech2, assigneeNotified: users.mech });
});
afterAll(() => srv?.stop());

const inTransaction = <T>(fn: (t: Transaction) => Promise<T>) => sq.transaction(fn);

describe('digest recipients', () => {
  it('when managers are active or not, then the active ones are the recipients, by id, with their depot and preferences', async () => {
    const rows = await inTransaction((t) => noticeRepository.digestRecipients(sq, t));
    expect(rows).toEqual([
      { id: users.m1, name: 'Person m1', email: 'm1@notice.test', depot_id: a.depot_id, notify_inspection_digest: 1, notify_ride_reports: 0 },
      { id: users.m2, name: 'Person m2', email: 'm2@notice.test', depot_id: null, notify_inspection_digest: 1, notify_ride_reports: 0 },
    ]);
  });
});

describe('inspections managers have not been told about', () => {
  it('when due and overdue inspections were told another status or none, then those are listed by due date then fleet number, with vehicle and depot', async () => {
    const rows = await inTransaction((t) => noticeRepository.untoldDueInspections(sq, t));
    expect(v[2].fleet_number < v[3].fleet_number).toBe(true);
    expect(rows.map((r) => r.id)).toEqual([ins.overdueWasDue, ins.overdueLater, ins.dueNew]);
    expect(rows.find((r) => r.id === ins.dueNew)).toEqual({
      id: ins.dueNew,
      status: 'due',
      due_date: '2026-12-03',
      reason: 'Reason due 2026-12-03',
      vehicle_id: b.id,
      fleet_number: b.fleet_number,
      plate: b.plate,
      depot_id: b.depot_id,
      depot_name: b.depot_name,
    });
  });

  it('when the status is marked told in chunks of 5000 ids, then every listed inspection is told, one in the second chunk too, and no other changes', async () => {
    const other = await addInspection(v[8].id, 'due', '2026-12-10');
    try {
      // 5001 ids: a real one first and last, numbers no inspection has between
      const ids = [ins.dueNew, ...Array.from({ length: 4999 }, (_, i) => 10_000_000 + i), ins.overdueLater];
      await inTransaction((t) => noticeRepository.markStatusTold(sq, ids, 'overdue', t));
      const told = await select<{ id: number; notified_status: string | null }>('SELECT id, notified_status FROM inspections WHERE id IN (?) ORDER BY id', [[ins.dueNew, ins.overdueLater, other, ins.overdueWasDue]]);
      expect(Object.fromEntries(told.map((r) => [r.id, r.notified_status]))).toEqual({ [ins.dueNew]: 'overdue', [ins.overdueLater]: 'overdue', [other]: null, [ins.overdueWasDue]: 'due' });
      // the due one was told "overdue", not its status: it is still untold
      expect((await inTransaction((t) => noticeRepository.untoldDueInspections(sq, t))).map((r) => r.id)).toEqual([ins.overdueWasDue, ins.dueNew, other]);
    } finally {
      await sq.query('UPDATE inspections SET notified_status = NULL WHERE id IN (?)', { replacements: [[ins.dueNew, ins.overdueLater]] });
      await sq.query(`UPDATE inspections SET status = 'done' WHERE id = ?`, { replacements: [other] });
    }
  });
});

describe('assignments not told to their mechanic', () => {
  it('when open inspections have an assignee not yet told (never, or another one told), then they are listed by id with the assignee and their settings', async () => {
    const rows = await inTransaction((t) => noticeRepository.untoldAssignments(sq, undefined, t));
    expect(rows.map((r) => r.id)).toEqual([ins.scheduled, ins.reassigned]);
    expect(rows[1]).toEqual({
      id: ins.reassigned,
      due_date: '2026-11-29',
      status: 'overdue',
      reason: 'Reason overdue 2026-11-29',
      vehicle_id: v[6].id,
      fleet_number: v[6].fleet_number,
      plate: v[6].plate,
      depot_name: v[6].depot_name,
      user_id: users.mech2,
      name: 'Person mech2',
      email: 'mech2@notice.test',
      notify: 0,
      active: 0,
    });
    expect(rows[0]).toMatchObject({ status: 'scheduled', user_id: users.mech, notify: 1, active: 1 });
  });

  it('when only some inspections are asked about, then only those are listed; none asked, none listed', async () => {
    expect((await inTransaction((t) => noticeRepository.untoldAssignments(sq, [ins.reassigned, ins.done, ins.toldAssignee], t))).map((r) => r.id)).toEqual([ins.reassigned]);
    expect(await inTransaction((t) => noticeRepository.untoldAssignments(sq, [], t))).toEqual([]);
  });

  it('when the assignees are marked told, then each inspection records its own assignee and is no longer listed', async () => {
    await inTransaction((t) => noticeRepository.markAssigneeTold(sq, [ins.reassigned], t));
    const [r] = await select<{ assignee_notified_id: number }>('SELECT assignee_notified_id FROM inspections WHERE id = ?', [ins.reassigned]);
    expect(r.assignee_notified_id).toBe(users.mech2);
    expect((await inTransaction((t) => noticeRepository.untoldAssignments(sq, undefined, t))).map((x) => x.id)).toEqual([ins.scheduled]);
    const [s] = await select<{ assignee_notified_id: number | null }>('SELECT assignee_notified_id FROM inspections WHERE id = ?', [ins.scheduled]);
    expect(s.assignee_notified_id).toBeNull();
  });
});
