// The mechanic's scope called directly against the demo fleet's database (the rule is stated in
// server/http/mechanic-scope.ts and the README, "Who sees what"); the workshop routes that use it
// are tested through the API in tests/server/workshop.test.ts.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import { INSPECTION_SCOPE_SQL, inspectionInScope, inspectionScopeArgs, mechanicScope, vehicleInScope, type MechanicScope } from '../../../server/http/mechanic-scope';
import type { SessionUser } from '../../../server/http/access';
import { startTestServer, type TestServer } from '../../support/server';

let srv: TestServer;
let sq: Sequelize;
/** The new mechanics' ids: one at depot 1, one with no depot. */
let atDepot1: number;
let noDepot: number;
/** Depot-2 vehicles with inspections: untouched (A), one assigned to the depot-1 mechanic (B), one sent to depot 1 unassigned (C), one sent to depot 1 but assigned to another mechanic (D). */
let A: number, B: number, C: number, D: number;
/** A depot-2 vehicle with an inspection assigned to the mechanic with no depot. */
let E: number;
let depot1Vehicle: number;

const sessionUser = (id: number, role: SessionUser['role']): SessionUser => ({ id, name: 'x', email: 'x@reboundry.test', role, active: true, mustChangePassword: false });

async function insertMechanic(email: string, depotId: number | null): Promise<number> {
  await sq.query("INSERT INTO users (name, email, role, password_hash, active, depot_id, created_at, updated_at) VALUES ('Test Mechanic', ?, 'mechanic', 'x', TRUE, ?, CURRENT_TIMESTAMP, CURRENT_TIMESTAMP)", {
    replacements: [email, depotId],
  });
  const [row] = await sq.query<{ id: number }>('SELECT id FROM users WHERE email = ?', { replacements: [email], type: QueryTypes.SELECT });
  return row.id;
}

const firstInspection = async (vehicleId: number) =>
  (await sq.query<{ id: number }>('SELECT MIN(id) AS id FROM inspections WHERE vehicle_id = ?', { replacements: [vehicleId], type: QueryTypes.SELECT }))[0].id;

beforeAll(async () => {
  srv = await startTestServer();
  sq = srv.db.sequelize;
  atDepot1 = await insertMechanic('scope-depot1@reboundry.test', 1);
  noDepot = await insertMechanic('scope-nodepot@reboundry.test', null);
  // every inspection unassigned and not sent anywhere: each belongs to its vehicle's depot
  await sq.query('UPDATE inspections SET assignee_id = NULL, assigned_depot_id = NULL');
  const withInspections = await sq.query<{ id: number; depot_id: number }>('SELECT DISTINCT v.id, v.depot_id FROM vehicles v JOIN inspections i ON i.vehicle_id = v.id ORDER BY v.id', { type: QueryTypes.SELECT });
  [A, B, C, D, E] = withInspections.filter((v) => v.depot_id === 2).map((v) => v.id);
  depot1Vehicle = withInspections.find((v) => v.depot_id === 1)!.id;
  await sq.query('UPDATE inspections SET assignee_id = ? WHERE id = ?', { replacements: [atDepot1, await firstInspection(B)] });
  await sq.query('UPDATE inspections SET assigned_depot_id = 1 WHERE id = ?', { replacements: [await firstInspection(C)] });
  await sq.query('UPDATE inspections SET assigned_depot_id = 1, assignee_id = 3 WHERE id = ?', { replacements: [await firstInspection(D)] });
  await sq.query('UPDATE inspections SET assignee_id = ? WHERE id = ?', { replacements: [noDepot, await firstInspection(E)] });
}, 120_000);

afterAll(async () => {
  await srv?.stop();
});

describe("a user's scope", () => {
  it('when the user is a manager, then there is no scope (everything is theirs)', async () => {
    expect(await mechanicScope(sq, sessionUser(1, 'manager'))).toBeNull();
  });

  it("when the user is a mechanic, then the scope is their id and their depot as stored (not the session's copy)", async () => {
    expect(await mechanicScope(sq, sessionUser(atDepot1, 'mechanic'))).toEqual({ userId: atDepot1, depotId: 1 });
    // the demo's second mechanic, Ines Garland, works at depot 2
    expect(await mechanicScope(sq, sessionUser(3, 'mechanic'))).toEqual({ userId: 3, depotId: 2 });
  });

  it('when a mechanic has no depot, or is no longer stored, then the depot is -1 (only what is assigned to them)', async () => {
    expect(await mechanicScope(sq, sessionUser(noDepot, 'mechanic'))).toEqual({ userId: noDepot, depotId: -1 });
    expect(await mechanicScope(sq, sessionUser(99_999, 'mechanic'))).toEqual({ userId: 99_999, depotId: -1 });
  });

  it('when read inside a transaction that moved the mechanic, then the scope is read in that transaction', async () => {
    const t = await sq.transaction();
    try {
      await sq.query('UPDATE users SET depot_id = 2 WHERE id = ?', { replacements: [atDepot1], transaction: t });
      expect(await mechanicScope(sq, sessionUser(atDepot1, 'mechanic'), t)).toEqual({ userId: atDepot1, depotId: 2 });
    } finally {
      await t.rollback();
    }
    expect(await mechanicScope(sq, sessionUser(atDepot1, 'mechanic'))).toEqual({ userId: atDepot1, depotId: 1 });
  });
});

describe('whether an inspection is the mechanic’s', () => {
  const s: MechanicScope = { userId: 10, depotId: 1 };

  it('when it is assigned to them, then it is theirs whatever its depot', () => {
    expect(inspectionInScope(s, { assignee_id: 10, assigned_depot_id: 2, vehicle_depot_id: 2 })).toBe(true);
    expect(inspectionInScope({ userId: 10, depotId: -1 }, { assignee_id: 10, assigned_depot_id: null, vehicle_depot_id: 2 })).toBe(true);
  });

  it('when it is assigned to another mechanic, then it is not theirs, even at their depot', () => {
    expect(inspectionInScope(s, { assignee_id: 11, assigned_depot_id: 1, vehicle_depot_id: 1 })).toBe(false);
  });

  it('when it is unassigned, then the depot it was sent to decides, else the vehicle’s depot', () => {
    expect(inspectionInScope(s, { assignee_id: null, assigned_depot_id: 1, vehicle_depot_id: 2 })).toBe(true);
    expect(inspectionInScope(s, { assignee_id: null, assigned_depot_id: 2, vehicle_depot_id: 1 })).toBe(false);
    expect(inspectionInScope(s, { assignee_id: null, assigned_depot_id: null, vehicle_depot_id: 1 })).toBe(true);
    expect(inspectionInScope(s, { assignee_id: null, assigned_depot_id: null, vehicle_depot_id: 2 })).toBe(false);
  });

  it('when the scope is the SQL condition, then it picks the same inspections as the row rule', async () => {
    const rows = await sq.query<{ id: number; assignee_id: number | null; assigned_depot_id: number | null; vehicle_depot_id: number }>(
      'SELECT i.id, i.assignee_id, i.assigned_depot_id, v.depot_id AS vehicle_depot_id FROM inspections i JOIN vehicles v ON v.id = i.vehicle_id ORDER BY i.id',
      { type: QueryTypes.SELECT },
    );
    for (const scope of [{ userId: atDepot1, depotId: 1 }, { userId: 3, depotId: 2 }, { userId: noDepot, depotId: -1 }]) {
      const inSql = await sq.query<{ id: number }>(`SELECT i.id FROM inspections i JOIN vehicles v ON v.id = i.vehicle_id WHERE ${INSPECTION_SCOPE_SQL} ORDER BY i.id`, {
        replacements: inspectionScopeArgs(scope),
        type: QueryTypes.SELECT,
      });
      const ids = inSql.map((r) => r.id);
      expect(ids.length).toBeGreaterThan(0);
      expect(ids).toEqual(rows.filter((r) => inspectionInScope(scope, r)).map((r) => r.id));
    }
  });
});

describe('whether a vehicle’s workshop records are the mechanic’s', () => {
  const mine = (): MechanicScope => ({ userId: atDepot1, depotId: 1 });

  it('when the vehicle belongs to their depot, then it is theirs', async () => {
    expect(await vehicleInScope(sq, mine(), depot1Vehicle)).toBe(true);
  });

  it('when the vehicle is at another depot and none of its inspections is theirs, then it is not', async () => {
    expect(await vehicleInScope(sq, mine(), A)).toBe(false);
    // sent to their depot but assigned to another mechanic
    expect(await vehicleInScope(sq, mine(), D)).toBe(false);
  });

  it('when the vehicle is at another depot but has an inspection assigned to them or sent unassigned to their depot, then it is theirs', async () => {
    expect(await vehicleInScope(sq, mine(), B)).toBe(true);
    expect(await vehicleInScope(sq, mine(), C)).toBe(true);
  });

  it('when the mechanic has no depot, then only vehicles with an inspection assigned to them are theirs', async () => {
    expect(await vehicleInScope(sq, { userId: noDepot, depotId: -1 }, depot1Vehicle)).toBe(false);
    expect(await vehicleInScope(sq, { userId: noDepot, depotId: -1 }, E)).toBe(true);
    expect(await vehicleInScope(sq, { userId: 3, depotId: -1 }, D)).toBe(true);
  });

  it('when the vehicle does not exist, then it is no one’s', async () => {
    expect(await vehicleInScope(sq, mine(), 99_999)).toBe(false);
  });

  it('when asked inside a transaction that assigned an inspection to them, then the vehicle is theirs in that transaction only', async () => {
    const insp = await firstInspection(A);
    const t = await sq.transaction();
    try {
      await sq.query('UPDATE inspections SET assignee_id = ? WHERE id = ?', { replacements: [atDepot1, insp], transaction: t });
      expect(await vehicleInScope(sq, mine(), A, t)).toBe(true);
    } finally {
      await t.rollback();
    }
    expect(await vehicleInScope(sq, mine(), A)).toBe(false);
  });
});
