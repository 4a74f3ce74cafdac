import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Op, QueryTypes } from 'sequelize';
import { CaughtMail, JobRun, MailMessage } from '../../server/db/models';
import { MAIL_CLAIM_STALE_MS, mailRepository } from '../../server/mail/repository';
import { defaultTestDatabase, startTestServer, TEST_NOW, type TestServer } from '../support/server';
import { startAppInstance, type AppInstance } from '../support/app-instance';
import { ApiClient, DEMO } from '../support/client';

/**
 * Several app instances behind a proxy share one database (the SQLite file here, PostgreSQL in the
 * `pg` project): two instances, each a process of its own with its own mail catcher, on the demo
 * fleet after one nightly run. A session signed in on one is the session on the other; the outbox
 * sent by both at once sends each message once; their two schedulers firing for one day make one
 * run; a claim on a message left by an instance that died is taken over; failed sign-ins count
 * against one limit whichever instance they reach.
 */
let srv: TestServer;
let A: AppInstance;
let B: AppInstance;
beforeAll(async () => {
  srv = await startTestServer({ afterNightly: true });
  expect(srv.db.dialect).toBe(defaultTestDatabase());
  // each send waits a moment, so two instances sending at once go through the outbox side by side
  [A, B] = await Promise.all([startAppInstance(srv, TEST_NOW, { INSTANCE_SEND_DELAY_MS: '15' }), startAppInstance(srv, TEST_NOW, { INSTANCE_SEND_DELAY_MS: '15' })]);
}, 300_000);
afterAll(async () => {
  await Promise.all([A?.stop(), B?.stop()]);
  await srv?.stop();
});

const note = (key: string) => ({ dedupeKey: key, kind: 'note' as const, userId: null, toAddress: 'fleet@reboundry.test', subject: `Note ${key}`, textBody: key, htmlBody: `<p>${key}</p>`, jobRunId: null });
const queue = (keys: string[]) => srv.db.sequelize.transaction((t) => mailRepository.queue(keys.map(note), TEST_NOW, t));
/** How many copies of each message the instances' mail catchers received. */
async function caughtCopies(keys: string[]) {
  const rows = await CaughtMail.findAll({ attributes: ['dedupeKey'], where: { dedupeKey: { [Op.in]: keys } }, raw: true });
  const copies = Object.fromEntries(keys.map((k) => [k, 0]));
  for (const r of rows) copies[r.dedupeKey!]++;
  return copies;
}

describe('sessions', () => {
  it('when someone signs in on one instance, then the other accepts the session and its form token, and signing out on the other ends it on both', async () => {
    const onA = new ApiClient(A.url);
    expect((await onA.login(DEMO.manager)).status).toBe(200);
    const me = await onA.get<{ user: { id: number; role: string } }>('/api/auth/me');
    expect(me.body.user).toMatchObject({ role: 'manager' });
    // the next requests reach the other instance, with the same cookies
    await onA.refreshCsrf();
    const onB = onA.at(B.url);
    expect((await onB.get<{ user: { id: number } }>('/api/auth/me')).body.user.id).toBe(me.body.user.id);
    // a form token issued by A is good on B: both sign with the one SESSION_SECRET
    const saved = await onB.json<{ preferences: { rideReports: boolean } }>('PATCH', '/api/account/notifications', { rideReports: true });
    expect(saved.status).toBe(200);
    expect((await onB.json('POST', '/api/auth/logout')).status).toBe(204);
    // the same cookies, back on A: the session is gone there too
    expect((await onA.get('/api/auth/me')).status).toBe(401);
    expect((await onA.get('/api/vehicles')).status).toBe(401);
  });
});

describe('the outbox', () => {
  it('when both instances send the outbox at once, then each pending message is sent exactly once, some by each, and every one ends sent', async () => {
    expect(await mailRepository.sendable(new Date())).toEqual([]);
    const keys = Array.from({ length: 40 }, (_, i) => `multi-instance:${i}`);
    expect(await queue(keys)).toBe(keys.length);
    const [a, b] = await Promise.all([A.sendPending(TEST_NOW), B.sendPending(TEST_NOW)]);
    expect([a.failed, b.failed]).toEqual([[], []]);
    expect(a.sent + b.sent).toBe(keys.length);
    expect(Math.min(a.sent, b.sent), `A sent ${a.sent}, B sent ${b.sent}`).toBeGreaterThan(0);
    expect(Object.values(await caughtCopies(keys))).toEqual(keys.map(() => 1));
    const rows = await MailMessage.findAll({ attributes: ['status', 'claimedBy', 'claimedAt'], where: { dedupeKey: { [Op.in]: keys } }, raw: true });
    expect(rows).toEqual(keys.map(() => ({ status: 'sent', claimedBy: null, claimedAt: null })));
  }, 120_000);

  it('when an instance died holding claims, then a claim older than 10 minutes is taken over and sent once, and a younger one is left to its holder', async () => {
    const [stale, young] = ['died-sending:stale', 'died-sending:young'];
    await queue([stale, young]);
    const claim = (key: string, agoMs: number) =>
      MailMessage.update({ status: 'sending', claimedAt: new Date(Date.now() - agoMs), claimedBy: 'gone-host:4242:abcdef' }, { where: { dedupeKey: key } });
    await claim(stale, MAIL_CLAIM_STALE_MS + 60_000);
    await claim(young, 60_000);
    expect(await A.sendPending(TEST_NOW)).toEqual({ sent: 1, failed: [] });
    expect(await B.sendPending(TEST_NOW)).toEqual({ sent: 0, failed: [] });
    expect(await caughtCopies([stale, young])).toEqual({ [stale]: 1, [young]: 0 });
    const rows = await MailMessage.findAll({ attributes: ['dedupeKey', 'status', 'claimedBy'], where: { dedupeKey: { [Op.in]: [stale, young] } }, order: [['id', 'ASC']], raw: true });
    expect(rows).toEqual([
      { dedupeKey: stale, status: 'sent', claimedBy: null },
      { dedupeKey: young, status: 'sending', claimedBy: 'gone-host:4242:abcdef' },
    ]);
  }, 60_000);
});

describe('the nightly schedule', () => {
  const scheduledRuns = () => JobRun.findAll({ attributes: ['id', 'status', 'asOf'], where: { trigger: 'schedule' }, order: [['id', 'ASC']], raw: true });

  it('when both schedulers fire for the same day, then one run happens; a firing seconds after it ended, on either instance, does nothing; "run now" still starts a run', async () => {
    const [a, b] = await Promise.all([A.fireNightly(TEST_NOW), B.fireNightly(TEST_NOW)]);
    const ran = [a, b].filter((o) => o.outcome === 'ran');
    expect(ran, JSON.stringify([a, b])).toHaveLength(1);
    expect(ran[0]).toMatchObject({ status: 'succeeded' });
    const runId = (ran[0] as { runId: number }).runId;
    // the other found the lock held, or (had it come after the run) the day done
    const other = a === ran[0] ? b : a;
    expect(['busy', 'already done']).toContain(other.outcome);
    expect(await scheduledRuns()).toEqual([{ id: runId, status: 'succeeded', asOf: '2026-11-30' }]);
    // an instance whose clock is a few seconds behind fires after the run has ended
    const later = new Date(TEST_NOW.getTime() + 5_000);
    expect(await B.fireNightly(later)).toEqual({ outcome: 'already done', runId });
    expect(await A.fireNightly(later)).toEqual({ outcome: 'already done', runId });
    expect(await scheduledRuns()).toHaveLength(1);
    // a manager's "run now" is not a scheduled run: it runs whatever the schedule did
    const manager = new ApiClient(B.url);
    await manager.login(DEMO.manager);
    const started = await manager.json<{ runId: number }>('POST', '/api/jobs/nightly/run', {});
    expect(started.status).toBe(202);
    let status = 'running';
    for (let i = 0; i < 600 && status === 'running'; i++) {
      await new Promise((r) => setTimeout(r, 200));
      status = (await manager.get<{ run: { status: string } }>(`/api/jobs/runs/${started.body.runId}`)).body.run.status;
    }
    expect(status).toBe('succeeded');
    expect(await scheduledRuns()).toHaveLength(1);
  }, 300_000);

  it('when the day\'s scheduled run failed, then the next firing for that day runs it again', async () => {
    const [first] = await scheduledRuns();
    await JobRun.update({ status: 'failed' }, { where: { id: first.id } });
    const again = await A.fireNightly(new Date(TEST_NOW.getTime() + 60_000));
    expect(again).toMatchObject({ outcome: 'ran', status: 'succeeded' });
    expect((await scheduledRuns()).map((r) => r.status)).toEqual(['failed', 'succeeded']);
    expect(await B.fireNightly(new Date(TEST_NOW.getTime() + 120_000))).toEqual({ outcome: 'already done', runId: (again as { runId: number }).runId });
  }, 300_000);
});

describe('failed sign-ins', () => {
  // The default limits (server/auth/routes.ts): 30 failures per address, 8 per account and address pair, in 15 minutes.
  it('when failures from one address are spread over both instances, then they count together: the pair limit after 8 on one account, the address limit after 30', async () => {
    const attempt = (url: string, email: string) => new ApiClient(url).login(email, 'not-the-password');
    // one account, four failures on each instance (the account's spacing, counted across both too,
    // makes the sixth to eighth wait their turns of a few seconds)
    for (const url of [A.url, B.url, A.url, B.url, A.url, B.url, A.url, B.url]) expect((await attempt(url, DEMO.mechanic)).status).toBe(401);
    const ninth = await attempt(A.url, DEMO.mechanic);
    expect(ninth.status).toBe(429);
    expect(JSON.stringify(ninth.body)).toMatch(/for this account from this address/);
    // other accounts from the same address: 9 attempts counted so far (the refused one too), 21 more reach the address limit
    for (let i = 0; i < 21; i++) expect((await attempt(i % 2 ? A.url : B.url, `nobody${i}@reboundry.test`)).status).toBe(401);
    const over = await attempt(B.url, 'nobody-else@reboundry.test');
    expect(over.status).toBe(429);
    expect(JSON.stringify(over.body)).toMatch(/attempts from this address/);
    // the counts are the database's: forgetting them there frees the address on both instances
    await srv.db.sequelize.query('DELETE FROM sign_in_counts');
    expect((await new ApiClient(A.url).login(DEMO.mechanic)).status).toBe(200);
  }, 120_000);

  it('when an account fails on both instances, then its spacing counts every failure and either instance’s sign-in clears it', async () => {
    const spaced = async () => (await srv.db.sequelize.query<{ failures: number }>(`SELECT failures FROM sign_in_delays WHERE account_key = ?`, { replacements: [DEMO.driver], type: QueryTypes.SELECT })).map((r) => Number(r.failures));
    for (const url of [A.url, B.url, A.url, B.url]) expect((await new ApiClient(url).login(DEMO.driver, 'not-the-password')).status).toBe(401);
    // with each instance's own count, each would hold two
    expect(await spaced()).toEqual([4]);
    expect((await new ApiClient(B.url).login(DEMO.driver)).status).toBe(200);
    expect(await spaced()).toEqual([]);
  });
});
