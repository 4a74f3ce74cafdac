import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestServer, type TestServer } from '../support/server';
import { ApiClient, DEMO } from '../support/client';

let srv: TestServer;
beforeAll(async () => {
  srv = await startTestServer({ auth: { loginLimitPerAccount: 3, loginLimitPerAddress: 1000 } });
});
afterAll(() => srv?.stop());

interface ErrorBody {
  error: { code: string; message: string; fields?: Record<string, string> };
}

describe('sign-in', () => {
  it('when the demo manager signs in, then /me answers with the manager and the cookie is httpOnly and SameSite', async () => {
    const c = new ApiClient(srv.url);
    const res = await c.raw('POST', '/api/auth/login', { body: { email: DEMO.manager, password: 'reboundry-demo' } });
    expect(res.status).toBe(200);
    const cookie = res.headers.getSetCookie().find((s) => s.startsWith('rb.sid='));
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    const me = await c.get<{ user: { email: string; role: string } }>('/api/auth/me');
    expect(me.body.user).toMatchObject({ email: DEMO.manager, role: 'manager' });
  });

  it('when the password is wrong, then 401 with the common error shape and no session', async () => {
    const c = new ApiClient(srv.url);
    const r = await c.login(DEMO.mechanic, 'not-the-password');
    expect(r.status).toBe(401);
    expect((r.body as unknown as ErrorBody).error.code).toBe('invalid_credentials');
    expect((await c.get('/api/auth/me')).status).toBe(401);
  });

  it('when the e-mail is not an e-mail, then 400 naming the field', async () => {
    const c = new ApiClient(srv.url);
    const r = await c.json<ErrorBody>('POST', '/api/auth/login', { email: 'nobody', password: 'x' });
    expect(r.status).toBe(400);
    expect(r.body.error.fields).toHaveProperty('email');
  });

  it('when one account fails more than the limit, then further attempts get 429 even from a fresh client', async () => {
    const email = 'priya.nandakumar@reboundry.test';
    for (let i = 0; i < 3; i++) expect((await new ApiClient(srv.url).login(email, 'wrong-password')).status).toBe(401);
    const blocked = await new ApiClient(srv.url).login(email, 'reboundry-demo');
    expect(blocked.status).toBe(429);
    // another account from the same address is not blocked by this account's limit
    expect((await new ApiClient(srv.url).login(DEMO.driver)).status).toBe(200);
  });

  it('when a state-changing request has no CSRF token, then 403 csrf_invalid and nothing happens', async () => {
    const c = new ApiClient(srv.url);
    await c.login(DEMO.manager);
    const res = await c.raw('POST', '/api/users', {
      csrf: false,
      body: { name: 'Forged', email: 'forged@example.test', role: 'manager', password: 'long-enough-password' },
    });
    expect(res.status).toBe(403);
    expect(((await res.json()) as ErrorBody).error.code).toBe('csrf_invalid');
    const list = await c.get<{ total: number }>('/api/users?q=forged');
    expect(list.body.total).toBe(0);
  });

  it('when a user signs out, then the session no longer works', async () => {
    const c = new ApiClient(srv.url);
    await c.login(DEMO.driver);
    expect((await c.get('/api/auth/me')).status).toBe(200);
    expect((await c.raw('POST', '/api/auth/logout')).status).toBe(204);
    expect((await c.get('/api/auth/me')).status).toBe(401);
  });
});

describe('users', () => {
  it('when a manager creates a mechanic, then the mechanic can sign in; deactivated, they cannot', async () => {
    const m = new ApiClient(srv.url);
    await m.login(DEMO.manager);
    const created = await m.json<{ user: { id: number; role: string } }>('POST', '/api/users', {
      name: 'Rosa Lindqvist',
      email: 'Rosa.Lindqvist@reboundry.test',
      role: 'mechanic',
      password: 'workshop-bay-7',
    });
    expect(created.status).toBe(201);
    const rosa = new ApiClient(srv.url);
    expect((await rosa.login('rosa.lindqvist@reboundry.test', 'workshop-bay-7')).status).toBe(200);

    const off = await m.json('PATCH', `/api/users/${created.body.user.id}`, { active: false });
    expect(off.status).toBe(200);
    // the open session ends, and a new sign-in is refused
    expect((await rosa.get('/api/auth/me')).status).toBe(401);
    expect((await new ApiClient(srv.url).login('rosa.lindqvist@reboundry.test', 'workshop-bay-7')).status).toBe(401);
  });

  it('when an e-mail is taken, then 409 naming the field', async () => {
    const m = new ApiClient(srv.url);
    await m.login(DEMO.manager);
    const r = await m.json<ErrorBody>('POST', '/api/users', { name: 'Dup', email: DEMO.driver, role: 'driver', password: 'long-enough-1' });
    expect(r.status).toBe(409);
    expect(r.body.error.fields).toHaveProperty('email');
  });

  it('when the only manager would lose the role, then 409 and the role stays', async () => {
    const m = new ApiClient(srv.url);
    const me = await m.login(DEMO.manager);
    const r = await m.json<ErrorBody>('PATCH', `/api/users/${me.body.user.id}`, { role: 'driver' });
    expect(r.status).toBe(409);
    expect((await m.get<{ user: { role: string } }>('/api/auth/me')).body.user.role).toBe('manager');
  });

  it('when a body has an unknown field or a bad role, then 400 naming each field', async () => {
    const m = new ApiClient(srv.url);
    await m.login(DEMO.manager);
    const r = await m.json<ErrorBody>('POST', '/api/users', { name: '', email: 'x@y.test', role: 'admin', password: 'short', extra: 1 });
    expect(r.status).toBe(400);
    expect(Object.keys(r.body.error.fields ?? {})).toEqual(expect.arrayContaining(['name', 'role', 'password']));
  });

  it('when a user changes their password, then the old one stops working', async () => {
    const c = new ApiClient(srv.url);
    await c.login('jonah.pryce@reboundry.test');
    const bad = await c.json<ErrorBody>('POST', '/api/auth/password', { currentPassword: 'nope', newPassword: 'a-new-long-password' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('currentPassword');
    expect((await c.json('POST', '/api/auth/password', { currentPassword: 'reboundry-demo', newPassword: 'a-new-long-password' })).status).toBe(204);
    expect((await new ApiClient(srv.url).login('jonah.pryce@reboundry.test')).status).toBe(401);
    expect((await new ApiClient(srv.url).login('jonah.pryce@reboundry.test', 'a-new-long-password')).status).toBe(200);
  });

  it('when the users list is filtered by role and sorted, then it pages with a total', async () => {
    const m = new ApiClient(srv.url);
    await m.login(DEMO.manager);
    const r = await m.get<{ items: { role: string; name: string }[]; total: number }>('/api/users?role=driver&sort=-name&pageSize=5&page=2');
    expect(r.status).toBe(200);
    expect(r.body.items).toHaveLength(5);
    expect(r.body.total).toBeGreaterThanOrEqual(30);
    expect(r.body.items.every((u) => u.role === 'driver')).toBe(true);
    const names = r.body.items.map((u) => u.name);
    expect([...names].sort().reverse()).toEqual(names);
  });
});
