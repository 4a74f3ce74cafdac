import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestServer, type TestServer } from '../support/server';
import { ApiClient, DEMO } from '../support/client';

let srv: TestServer;
beforeAll(async () => {
  srv = await startTestServer({ auth: { loginLimitPerPair: 3, loginLimitPerAddress: 1000, accountDelay: { freeFailures: 50, baseDelayMs: 100, maxDelayMs: 200, maxWaitMs: 1000 } } });
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

  // the test server trusts a proxy on loopback, so X-Forwarded-For stands for the client's address
  const loginFrom = (address: string, email: string, password: string) =>
    new ApiClient(srv.url).raw('POST', '/api/auth/login', { body: { email, password }, headers: { 'x-forwarded-for': address } });

  it('when one address fails more than the limit on an account, then it gets 429 there while the owner signs in from elsewhere', async () => {
    const email = 'priya.nandakumar@reboundry.test';
    for (let i = 0; i < 3; i++) expect((await loginFrom('203.0.113.7', email, 'wrong-password')).status).toBe(401);
    const blocked = await loginFrom('203.0.113.7', email, 'reboundry-demo');
    expect(blocked.status).toBe(429);
    expect(((await blocked.json()) as ErrorBody).error.code).toBe('too_many_attempts');
    // no lock-out handed to the attacker: the owner, from another address, signs in
    expect((await loginFrom('198.51.100.20', email, 'reboundry-demo')).status).toBe(200);
    // and the attacking address may still try other accounts (its own limit is per address)
    expect((await loginFrom('203.0.113.7', DEMO.driver, 'reboundry-demo')).status).toBe(200);
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

describe('sessions', () => {
  const sessionRows = async () => Number(((await srv.db.sequelize.query('SELECT COUNT(*) AS n FROM sessions', { plain: true })) as { n: number }).n);

  it('when anonymous visitors fetch a form token, then no session row is stored, and sign-in with that token still works', async () => {
    const before = await sessionRows();
    for (let i = 0; i < 20; i++) expect((await new ApiClient(srv.url).raw('GET', '/api/auth/csrf')).status).toBe(200);
    expect(await sessionRows()).toBe(before);
    const c = new ApiClient(srv.url);
    expect((await c.login(DEMO.driver)).status).toBe(200);
    expect(await sessionRows()).toBe(before + 1);
    // a token fetched for one anonymous visitor does not serve another
    const a = new ApiClient(srv.url);
    const token = ((await (await a.raw('GET', '/api/auth/csrf')).json()) as { token: string }).token;
    const res = await fetch(`${srv.url}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json', 'x-csrf-token': token }, body: JSON.stringify({ email: DEMO.driver, password: 'reboundry-demo' }) });
    expect(res.status).toBe(403);
  });

  it('when a session has expired, then pruning removes its row', async () => {
    await srv.db.sequelize.query(`INSERT INTO sessions (sid, expires, data, created_at, updated_at) VALUES ('old-one', '2020-01-01 00:00:00.000 +00:00', '{}', '2020-01-01', '2020-01-01')`);
    await srv.pruneSessions();
    const [rows] = await srv.db.sequelize.query(`SELECT sid FROM sessions WHERE sid = 'old-one'`);
    expect(rows).toEqual([]);
  });

  const newUser = async (email: string, password = 'first-password-1') => {
    const m = new ApiClient(srv.url);
    await m.login(DEMO.manager);
    const r = await m.json<{ user: { id: number } }>('POST', '/api/users', { name: 'Session Tester', email, role: 'driver', password });
    expect(r.status).toBe(201);
    return { manager: m, id: r.body.user.id };
  };

  it('when a user changes their password, then their other sessions end and the one they used stays', async () => {
    await newUser('sessions.one@reboundry.test');
    const phone = new ApiClient(srv.url);
    const laptop = new ApiClient(srv.url);
    await phone.login('sessions.one@reboundry.test', 'first-password-1');
    await laptop.login('sessions.one@reboundry.test', 'first-password-1');
    expect((await phone.json('POST', '/api/auth/password', { currentPassword: 'first-password-1', newPassword: 'second-password-2' })).status).toBe(204);
    expect((await phone.get('/api/auth/me')).status).toBe(200);
    expect((await laptop.get('/api/auth/me')).status).toBe(401);
  });

  it('when a manager resets a password, then every session of that user ends and the new password signs in', async () => {
    const { manager, id } = await newUser('sessions.two@reboundry.test');
    const c = new ApiClient(srv.url);
    await c.login('sessions.two@reboundry.test', 'first-password-1');
    expect((await manager.json('PATCH', `/api/users/${id}`, { password: 'reset-by-manager-3' })).status).toBe(200);
    expect((await c.get('/api/auth/me')).status).toBe(401);
    expect((await new ApiClient(srv.url).login('sessions.two@reboundry.test', 'first-password-1')).status).toBe(401);
    expect((await new ApiClient(srv.url).login('sessions.two@reboundry.test', 'reset-by-manager-3')).status).toBe(200);
    // the manager's own session is untouched
    expect((await manager.get('/api/auth/me')).status).toBe(200);
  });

  it('when a password is longer than 72 bytes or shorter than 10 characters, then it is refused with the rule; 72 bytes and 10 characters pass', async () => {
    const m = new ApiClient(srv.url);
    await m.login(DEMO.manager);
    const make = (email: string, password: string) => m.json<ErrorBody>('POST', '/api/users', { name: 'Length Rule', email, role: 'driver', password });
    const long = await make('len.one@reboundry.test', 'x'.repeat(73));
    expect(long.status).toBe(400);
    expect(long.body.error.fields?.password).toMatch(/72 bytes/);
    // 37 characters, 74 bytes in UTF-8
    expect((await make('len.two@reboundry.test', 'é'.repeat(37))).status).toBe(400);
    expect((await make('len.three@reboundry.test', 'short-pw1')).body.error.fields?.password).toMatch(/at least 10/);
    expect((await make('len.four@reboundry.test', 'y'.repeat(72))).status).toBe(201);
    expect((await make('len.five@reboundry.test', 'ten-chars!')).status).toBe(201);
    // a longer password cannot sign in as its first 72 bytes (bcrypt's silent cut): it is refused
    expect((await new ApiClient(srv.url).login('len.four@reboundry.test', `${'y'.repeat(72)}z`)).status).toBe(400);
    expect((await new ApiClient(srv.url).login('len.four@reboundry.test', 'y'.repeat(72))).status).toBe(200);
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
