// The Outbox and notification-preference routes (server/mail/routes.ts) in a bare app on an empty
// migrated database: who may call them, what they answer, and the request rules. The same
// routes in the whole app, behind sign-in and CSRF, are in tests/server/role-access.test.ts.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import type { Mailer } from '../../../server/mail/mailer';
import { registerMailRoutes } from '../../../server/mail/routes';
import { mailRepository } from '../../../server/mail/repository';
import { freshDb } from '../../support/fresh-db';
import { asUser, miniApp, type MiniApp } from '../../support/mini-app';

let db: Awaited<ReturnType<typeof freshDb>>;
let withMailer: MiniApp;
let without: MiniApp;
let userId = 0;

const mailer: Mailer = { catches: true, describe: () => 'the built-in mail catcher (port 2525)', send: async () => ({ messageId: '' }), close: async () => {} };

beforeAll(async () => {
  db = await freshDb();
  await db.sequelize.query(`INSERT INTO users (name, email, role, password_hash, active, created_at, updated_at) VALUES ('Tomasz Reyes', 'mechanic@reboundry.test', 'mechanic', 'x', 1, datetime('now'), datetime('now'))`);
  [{ id: userId }] = await db.sequelize.query<{ id: number }>(`SELECT id FROM users`, { type: QueryTypes.SELECT });
  for (let i = 1; i <= 3; i++) {
    await mailRepository.catch({ messageId: `<m${i}@x>`, dedupeKey: `k${i}`, mailFrom: 'no-reply@reboundry.test', rcptTo: i === 2 ? 'nora@reboundry.test' : 'milo@reboundry.test', subject: `Digest ${i}`, textBody: `Body ${i}`, htmlBody: `<p>${i}</p>`, sizeBytes: 10, receivedAt: new Date(Date.UTC(2026, 10, 30, i)) });
  }
  await db.sequelize.query(`INSERT INTO mail_messages (dedupe_key, kind, to_address, subject, text_body, html_body, status, attempts, created_at, updated_at) VALUES ('a', 'digest', 'x@y', 's', 't', 'h', 'sent', 0, datetime('now'), datetime('now')), ('b', 'digest', 'x@y', 's', 't', 'h', 'failed', 1, datetime('now'), datetime('now')), ('c', 'digest', 'x@y', 's', 't', 'h', 'sending', 0, datetime('now'), datetime('now'))`);
  withMailer = await miniApp((r) => registerMailRoutes(r, { mailer }));
  without = await miniApp((r) => registerMailRoutes(r, { mailer: null }));
});
afterAll(async () => {
  await withMailer?.close();
  await without?.close();
  await db?.dispose();
});

const manager = asUser(1, 'manager');

describe('the Outbox', () => {
  it('when a manager opens it, then it lists caught messages newest first with the total, the transport, whether it catches, and the sent counts', async () => {
    const r = await withMailer.call('GET', '/api/outbox?pageSize=2', { user: manager });
    expect(r.status).toBe(200);
    const body = (await r.json()) as { items: { key: string }[]; total: number; transport: string; catches: boolean; sent: Record<string, number> };
    expect(body.items.map((m) => m.key)).toEqual(['k3', 'k2']);
    expect(body).toMatchObject({ total: 3, transport: 'the built-in mail catcher (port 2525)', catches: true, sent: { pending: 0, sending: 1, sent: 1, failed: 1 } });
    const page2 = (await (await withMailer.call('GET', '/api/outbox?pageSize=2&page=2', { user: manager })).json()) as { items: { key: string }[] };
    expect(page2.items.map((m) => m.key)).toEqual(['k1']);
  });

  it('when the list is searched, then the search words are trimmed and match by recipient', async () => {
    const body = (await (await withMailer.call('GET', `/api/outbox?q=${encodeURIComponent('  nora@ ')}`, { user: manager })).json()) as { items: { key: string }[]; total: number };
    expect(body.items.map((m) => m.key)).toEqual(['k2']);
    expect(body.total).toBe(1);
    const long = await withMailer.call('GET', `/api/outbox?q=${'x'.repeat(101)}`, { user: manager });
    expect(long.status).toBe(400);
    expect(((await long.json()) as { error: { fields: Record<string, string> } }).error.fields).toHaveProperty('q');
  });

  it('when no mailer is set up, then the Outbox says so and catches nothing', async () => {
    const body = (await (await without.call('GET', '/api/outbox', { user: manager })).json()) as { transport: string; catches: boolean; total: number };
    expect(body).toMatchObject({ transport: 'not configured', catches: false, total: 3 });
  });

  it('when one message is opened, then it comes whole; an unknown id is 404 and a bad id names the address', async () => {
    const list = (await (await withMailer.call('GET', '/api/outbox?q=Digest%201', { user: manager })).json()) as { items: { id: number }[] };
    const one = await withMailer.call('GET', `/api/outbox/${list.items[0].id}`, { user: manager });
    expect(one.status).toBe(200);
    expect(((await one.json()) as { message: unknown }).message).toMatchObject({ key: 'k1', subject: 'Digest 1', text: 'Body 1', html: '<p>1</p>' });
    const missing = await withMailer.call('GET', '/api/outbox/99999', { user: manager });
    expect(missing.status).toBe(404);
    expect(((await missing.json()) as { error: { message: string } }).error.message).toBe('Message was not found.');
    const bad = await withMailer.call('GET', '/api/outbox/abc', { user: manager });
    expect(bad.status).toBe(400);
  });

  it('when a mechanic, a driver or nobody asks for the Outbox or a message, then it is refused', async () => {
    for (const path of ['/api/outbox', '/api/outbox/1']) {
      expect((await withMailer.call('GET', path, { user: asUser(userId, 'mechanic') })).status).toBe(403);
      expect((await withMailer.call('GET', path, { user: asUser(userId, 'driver') })).status).toBe(403);
      expect((await withMailer.call('GET', path)).status).toBe(401);
    }
  });
});

describe('notification preferences', () => {
  it('when a signed-in user reads and changes their preferences, then each change is kept and answered with all three', async () => {
    const me = asUser(userId, 'mechanic');
    const read = await withMailer.call('GET', '/api/account/notifications', { user: me });
    expect(read.status).toBe(200);
    expect(await read.json()).toEqual({ preferences: { inspectionDigest: true, rideReports: true, assignments: true } });
    const patched = await withMailer.call('PATCH', '/api/account/notifications', { user: me, json: { assignments: false } });
    expect(patched.status).toBe(200);
    expect(await patched.json()).toEqual({ preferences: { inspectionDigest: true, rideReports: true, assignments: false } });
    expect(await mailRepository.prefs(userId)).toEqual({ inspectionDigest: true, rideReports: true, assignments: false });
    // a driver and a manager may use the same routes for themselves
    expect((await withMailer.call('GET', '/api/account/notifications', { user: asUser(userId, 'driver') })).status).toBe(200);
    expect((await withMailer.call('GET', '/api/account/notifications', { user: asUser(userId, 'manager') })).status).toBe(200);
  });

  it('when the change is empty, not true or false, or names an unknown preference, then it is refused with the reason and nothing changes', async () => {
    const me = asUser(userId, 'mechanic');
    const before = await mailRepository.prefs(userId);
    const empty = await withMailer.call('PATCH', '/api/account/notifications', { user: me, json: {} });
    expect(empty.status).toBe(400);
    expect(JSON.stringify(await empty.json())).toContain('give at least one of inspectionDigest, rideReports, assignments');
    for (const [body, field, words] of [
      [{ inspectionDigest: 'yes' }, 'inspectionDigest', 'must be true or false'],
      [{ rideReports: 1 }, 'rideReports', 'must be true or false'],
      [{ assignments: null }, 'assignments', 'must be true or false'],
    ] as const) {
      const r = await withMailer.call('PATCH', '/api/account/notifications', { user: me, json: body });
      expect(r.status, JSON.stringify(body)).toBe(400);
      expect(((await r.json()) as { error: { fields: Record<string, string> } }).error.fields[field]).toBe(words);
    }
    const unknown = await withMailer.call('PATCH', '/api/account/notifications', { user: me, json: { assignments: true, sms: true } });
    expect(unknown.status).toBe(400);
    expect(await mailRepository.prefs(userId)).toEqual(before);
  });

  it('when the signed-in user no longer exists, then reading their preferences is 404; without a session both routes are 401', async () => {
    const gone = await withMailer.call('GET', '/api/account/notifications', { user: asUser(99_999, 'driver') });
    expect(gone.status).toBe(404);
    expect(((await gone.json()) as { error: { message: string } }).error.message).toBe('User was not found.');
    expect((await withMailer.call('GET', '/api/account/notifications')).status).toBe(401);
    expect((await withMailer.call('PATCH', '/api/account/notifications', { json: { assignments: true } })).status).toBe(401);
  });
});
