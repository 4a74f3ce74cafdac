import { describe, expect, it } from 'vitest';
import { managerForFile } from '../support/server';
import { ApiClient, DEMO } from '../support/client';

/**
 * A password a fleet manager sets for someone (a new account or a reset) is temporary: until its
 * owner chooses their own, the API answers only who is signed in, the form token, the password
 * change, sign-in and sign-out.
 */

interface ErrorBody {
  error: { code: string; message: string; fields?: Record<string, string> };
}
interface Me {
  user: { id: number; email: string; mustChangePassword: boolean };
}

const { srv, manager } = managerForFile({ auth: { loginLimitPerPair: 1000, loginLimitPerAddress: 1000 } });

/** A driver account whose temporary password is already replaced by `password`, as after a first sign-in. */
async function settledDriver(email: string, password: string) {
  const created = await manager.json<{ user: { id: number } }>('POST', '/api/users', { name: 'Temp Tester', email, role: 'driver', password: 'first-from-manager' });
  expect(created.status).toBe(201);
  const c = new ApiClient(srv.url);
  expect((await c.login(email, 'first-from-manager')).status).toBe(200);
  expect((await c.json('POST', '/api/auth/password', { currentPassword: 'first-from-manager', newPassword: password })).status).toBe(204);
  return created.body.user.id;
}

const flagOf = async (id: number) =>
  Boolean(((await srv.db.sequelize.query('SELECT must_change_password AS f FROM users WHERE id = ?', { replacements: [id], plain: true })) as { f: number }).f);

describe('temporary passwords', () => {
  it('when a manager sets a temporary password, then old sessions end, the user signs in with it, everything but the password change answers 403 until they choose a new one', async () => {
    const id = await settledDriver('temp.one@reboundry.test', 'own-password-one');
    const before = new ApiClient(srv.url);
    expect((await before.login('temp.one@reboundry.test', 'own-password-one')).status).toBe(200);
    expect((await before.get('/api/vehicles')).status).toBe(200);

    expect((await manager.json('PATCH', `/api/users/${id}`, { password: 'temporary-from-manager' })).status).toBe(200);
    expect((await before.get('/api/auth/me')).status).toBe(401);

    const c = new ApiClient(srv.url);
    const signedIn = await c.login('temp.one@reboundry.test', 'temporary-from-manager');
    expect(signedIn.status).toBe(200);
    expect(signedIn.body.user).toMatchObject({ mustChangePassword: true });
    const me = await c.get<Me>('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.user.mustChangePassword).toBe(true);

    const blocked = await c.get<ErrorBody>('/api/vehicles');
    expect(blocked.status).toBe(403);
    expect(blocked.body.error.code).toBe('password_change_required');
    expect(blocked.body.error.message).toMatch(/Choose a new password/);
    // a write is refused before it happens
    const report = await c.json<ErrorBody>('POST', '/api/ride-reports', {});
    expect(report.body.error.code).toBe('password_change_required');

    const same = await c.json<ErrorBody>('POST', '/api/auth/password', { currentPassword: 'temporary-from-manager', newPassword: 'temporary-from-manager' });
    expect(same.status).toBe(400);
    expect(same.body.error.fields?.newPassword).toBe('must differ from the current password');
    expect((await c.get<Me>('/api/auth/me')).body.user.mustChangePassword).toBe(true);
    expect((await c.get('/api/vehicles')).status).toBe(403);

    expect((await c.json('POST', '/api/auth/password', { currentPassword: 'temporary-from-manager', newPassword: 'chosen-by-myself-2' })).status).toBe(204);
    expect((await c.get<Me>('/api/auth/me')).body.user.mustChangePassword).toBe(false);
    expect((await c.get('/api/vehicles')).status).toBe(200);
    expect(await flagOf(id)).toBe(false);
  });

  it('when a manager creates an account, then its first password is temporary; the user is asked to change it at first sign-in', async () => {
    const created = await manager.json<{ user: { id: number; mustChangePassword: boolean } }>('POST', '/api/users', {
      name: 'New Starter', email: 'temp.new@reboundry.test', role: 'mechanic', password: 'first-from-manager',
    });
    expect(created.status).toBe(201);
    expect(created.body.user.mustChangePassword).toBe(true);
    const c = new ApiClient(srv.url);
    await c.login('temp.new@reboundry.test', 'first-from-manager');
    expect((await c.get<Me>('/api/auth/me')).body.user.mustChangePassword).toBe(true);
    expect((await c.get<ErrorBody>('/api/inspections')).body.error.code).toBe('password_change_required');
  });

  it('when the password is temporary, then every API route but me, csrf, the password change, sign-in and sign-out answers 403 password_change_required', async () => {
    await manager.json('POST', '/api/users', { name: 'Every Route', email: 'temp.routes@reboundry.test', role: 'manager', password: 'first-from-manager' });
    const c = new ApiClient(srv.url);
    expect((await c.login('temp.routes@reboundry.test', 'first-from-manager')).status).toBe(200);
    const open = ['GET /api/auth/me', 'GET /api/auth/csrf', 'POST /api/auth/password', 'POST /api/auth/login', 'POST /api/auth/logout', 'GET /api/health'];
    const routes: string[] = [];
    for (const layer of (srv.api as unknown as { stack: { route?: { path: string; methods: Record<string, boolean> } }[] }).stack) {
      if (!layer.route) continue;
      for (const [m, on] of Object.entries(layer.route.methods)) if (on && m !== '_all') routes.push(`${m.toUpperCase()} /api${layer.route.path}`);
    }
    expect(routes.length).toBeGreaterThan(50);
    const got: string[] = [];
    const want: string[] = [];
    for (const key of routes.filter((k) => !open.includes(k))) {
      const [method, pattern] = key.split(' ');
      const res = await c.raw(method, pattern.replace(/:[A-Za-z]+/g, '1'), { body: method === 'GET' ? undefined : {} });
      const body = (await res.json().catch(() => null)) as ErrorBody | null;
      got.push(`${key} → ${res.status} ${body?.error?.code ?? ''}`);
      want.push(`${key} → 403 password_change_required`);
    }
    expect(got).toEqual(want);
    expect((await c.raw('GET', '/api/auth/csrf')).status).toBe(200);
    expect((await c.raw('GET', '/api/health')).status).toBe(200);
    expect((await c.raw('POST', '/api/auth/logout')).status).toBe(204);
    expect((await c.get('/api/auth/me')).status).toBe(401);
  });

  it('when a user changes their own password, then it is never marked temporary, and the same password again is refused', async () => {
    const id = await settledDriver('temp.own@reboundry.test', 'own-password-one');
    expect(await flagOf(id)).toBe(false);
    const c = new ApiClient(srv.url);
    await c.login('temp.own@reboundry.test', 'own-password-one');
    expect((await c.json('POST', '/api/auth/password', { currentPassword: 'own-password-one', newPassword: 'own-password-two' })).status).toBe(204);
    expect(await flagOf(id)).toBe(false);
    expect((await c.get<Me>('/api/auth/me')).body.user.mustChangePassword).toBe(false);
    expect((await c.get('/api/vehicles')).status).toBe(200);
    const same = await c.json<ErrorBody>('POST', '/api/auth/password', { currentPassword: 'own-password-two', newPassword: 'own-password-two' });
    expect(same.status).toBe(400);
    expect(Object.keys(same.body.error.fields ?? {})).toEqual(['newPassword']);
  });

  it('when a manager sets their own password through the People page, then it is not temporary for them', async () => {
    const m = new ApiClient(srv.url);
    const me = await m.login(DEMO.manager);
    expect((await m.json('PATCH', `/api/users/${me.body.user.id}`, { password: 'manager-own-choice' })).status).toBe(200);
    expect(await flagOf(me.body.user.id)).toBe(false);
    // the reset ended the manager's sessions, the shared one of this file too: sign in again with the new one
    await manager.refreshCsrf();
    expect((await manager.login(DEMO.manager, 'manager-own-choice')).status).toBe(200);
    expect((await manager.get('/api/vehicles')).status).toBe(200);
  });
});
