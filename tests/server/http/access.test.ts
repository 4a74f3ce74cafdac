// The role check itself, called with a plain request object: the API-wide table of which role
// may call which route is in tests/server/role-access.test.ts.
import { describe, expect, it } from 'vitest';
import type { Request, Response } from 'express';
import { allow, currentUser, open, type SessionUser } from '../../../server/http/access';
import { AppError } from '../../../server/errors';

const user = (role: SessionUser['role']): SessionUser => ({ id: 7, name: 'Tomasz Reyes', email: 'mechanic@reboundry.test', role, active: true, mustChangePassword: false });

/** Runs a handler on a request with `user` (or none) and returns what it passed to next(). */
function nextOf(handler: ReturnType<typeof allow>, u?: SessionUser): { called: number; arg: unknown } {
  const req = { user: u } as unknown as Request;
  const seen = { called: 0, arg: undefined as unknown };
  handler(req, {} as Response, (arg?: unknown) => {
    seen.called++;
    seen.arg = arg;
  });
  return seen;
}

describe('allow(...roles)', () => {
  it('when nobody is signed in, then the request goes on to the error handler as 401 not signed in', () => {
    const r = nextOf(allow('manager', 'mechanic', 'driver'));
    expect(r.called).toBe(1);
    expect(r.arg).toBeInstanceOf(AppError);
    expect(r.arg).toMatchObject({ status: 401, code: 'not_signed_in' });
  });

  it("when the signed-in user's role is not among the allowed, then 403 forbidden", () => {
    for (const [roles, role] of [
      [['manager'], 'mechanic'],
      [['manager'], 'driver'],
      [['manager', 'mechanic'], 'driver'],
      [['driver'], 'manager'],
    ] as const) {
      const r = nextOf(allow(...roles), user(role));
      expect(r.called).toBe(1);
      expect(r.arg).toBeInstanceOf(AppError);
      expect(r.arg).toMatchObject({ status: 403, code: 'forbidden' });
    }
  });

  it('when no role is allowed, then even a manager is refused', () => {
    expect(nextOf(allow(), user('manager')).arg).toMatchObject({ status: 403 });
  });

  it("when the user's role is one of the allowed, then the request goes on once, with no error", () => {
    for (const role of ['manager', 'mechanic'] as const) {
      const r = nextOf(allow('manager', 'mechanic'), user(role));
      expect(r).toEqual({ called: 1, arg: undefined });
    }
    expect(nextOf(allow('driver'), user('driver'))).toEqual({ called: 1, arg: undefined });
  });
});

describe('open routes and the current user', () => {
  it('when a route is open, then anyone goes on, signed in or not', () => {
    expect(nextOf(open)).toEqual({ called: 1, arg: undefined });
    expect(nextOf(open, user('driver'))).toEqual({ called: 1, arg: undefined });
  });

  it('when a user is signed in, then currentUser is that user', () => {
    const u = user('mechanic');
    expect(currentUser({ user: u } as unknown as Request)).toBe(u);
  });

  it('when nobody is signed in, then currentUser throws 401 not signed in', () => {
    expect(() => currentUser({} as Request)).toThrow(AppError);
    try {
      currentUser({} as Request);
    } catch (e) {
      expect(e).toMatchObject({ status: 401, code: 'not_signed_in' });
    }
  });
});
