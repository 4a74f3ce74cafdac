// The mail rules called directly against the demo fleet's database (server/mail/service.ts): which
// managers get a digest with which sections and items, the notes to mechanics about inspections
// assigned to them, the de-duplication keys, the items marked told in the queuing transaction,
// and sending what is pending once (also by two senders at once), with failures kept for a
// retry. The nightly job and the workshop that call them are tested through the API
// (tests/server/nightly-job.test.ts, tests/server/digest-dedupe.test.ts,
// tests/server/workshop.test.ts); several app instances in tests/server/multi-instance.test.ts.
import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import type { Logger } from '../../../server/logger';
import type { Mailer, OutgoingMail } from '../../../server/mail/mailer';
import { stableMessageId } from '../../../server/mail/mailer';
import { queueAssignmentNotes, queueDigests, registerDigestSection, sendPending, type MailContext } from '../../../server/mail/service';
import { mailRepository } from '../../../server/mail/repository';
import { startTestServer, TEST_NOW, type TestServer } from '../../support/server';

let srv: TestServer;
let sq: Sequelize;
let ctx: MailContext;
const URL = 'http://reboundry.test';
const RUN_ID = 77;

/** The managers added for these tests (the demo's own manager, id 1, has no depot and every e-mail on). */
const managers = {
  north: 0, // depot 1, both kinds on
  millbrook: 0, // depot 2, only ride reports
  inactive: 0, // no depot, deactivated
  quiet: 0, // depot 2, both kinds off
};
/** Mechanics added: one who turned assignment notes off, one deactivated. */
let noNotes = 0;
let gone = 0;
/** Inspection added for CV-101 (depot 1): due in 2 days, managers last told it was overdue. */
let cv101 = 0;
/** Takes the planted digest section out again after the file (the registry outlives it). */
let removePlanted: () => void = () => undefined;

const hash = (parts: string[]) => createHash('sha256').update(parts.join('|')).digest('hex').slice(0, 16);

async function insertUser(name: string, email: string, role: string, o: { depot?: number | null; active?: boolean; digest?: boolean; rides?: boolean; assignments?: boolean } = {}) {
  await sq.query(
    `INSERT INTO users (name, email, role, password_hash, active, depot_id, notify_inspection_digest, notify_ride_reports, notify_assignments, created_at, updated_at)
     VALUES (?, ?, ?, 'x', ?, ?, ?, ?, ?, CURRENT_TIMESTAMP, CURRENT_TIMESTAMP)`,
    { replacements: [name, email, role, o.active ?? true, o.depot ?? null, o.digest ?? true, o.rides ?? true, o.assignments ?? true] },
  );
  const [u] = await sq.query<{ id: number }>('SELECT id FROM users WHERE email = ?', { replacements: [email], type: QueryTypes.SELECT });
  return u.id;
}

const setInspection = (id: number, status: string, due: string, notified: string | null = null) =>
  sq.query('UPDATE inspections SET status = ?, due_date = ?, notified_status = ? WHERE id = ?', { replacements: [status, due, notified, id] });

const mails = (kind: string) =>
  sq.query<{ id: number; dedupe_key: string; kind: string; user_id: number; to_address: string; subject: string; text_body: string; html_body: string; status: string; job_run_id: number; created_at: string }>(
    'SELECT id, dedupe_key, kind, user_id, to_address, subject, text_body, html_body, status, job_run_id, created_at FROM mail_messages WHERE kind = ? ORDER BY id',
    { replacements: [kind], type: QueryTypes.SELECT },
  );

/** A section planted by another area: two items (one for every manager, one for depot 2) until they are marked told. */
let planted = [
  { key: 'r1', depotId: null, title: 'Report r1', lines: ['Felt: a jolt'], link: `${URL}/ride-reports?report=1` },
  { key: 'r2', depotId: 2, title: 'Report r2', lines: [], link: `${URL}/ride-reports?report=2` },
];
const plantedMarked: string[][] = [];

beforeAll(async () => {
  srv = await startTestServer();
  sq = srv.db.sequelize;
  ctx = { sequelize: sq, publicUrl: URL, asOf: '2026-11-30', now: TEST_NOW, runId: RUN_ID };
  managers.north = await insertUser('Nora North', 'nora.north@reboundry.test', 'manager', { depot: 1 });
  managers.millbrook = await insertUser('Milo Brook', 'milo.brook@reboundry.test', 'manager', { depot: 2, digest: false });
  managers.inactive = await insertUser('Ivo Left', 'ivo.left@reboundry.test', 'manager', { active: false });
  managers.quiet = await insertUser('Quinn Quiet', 'quinn.quiet@reboundry.test', 'manager', { depot: 2, digest: false, rides: false });
  noNotes = await insertUser('Nils Nonotes', 'nils.nonotes@reboundry.test', 'mechanic', { depot: 1, assignments: false });
  gone = await insertUser('Greta Gone', 'greta.gone@reboundry.test', 'mechanic', { depot: 2, active: false });
  // the demo's open inspections (all scheduled): 5 CV-103 and 52 LV-103 (depot 1), 69 LV-112 and 29 CV-112 (depot 2), 84 RT-105 (depot 1)
  await setInspection(52, 'overdue', '2026-11-27');
  await setInspection(5, 'overdue', '2026-11-29');
  await setInspection(69, 'due', '2026-11-30');
  await setInspection(29, 'due', '2026-12-01');
  await setInspection(84, 'due', '2026-12-05', 'due'); // managers were told already
  await sq.query(
    `INSERT INTO inspections (vehicle_id, due_date, status, reason, notified_status, created_at, updated_at) VALUES (1, '2026-12-02', 'due', 'Predicted wear reaches the limit.', 'overdue', CURRENT_TIMESTAMP, CURRENT_TIMESTAMP)`,
  );
  [{ id: cv101 }] = await sq.query<{ id: number }>('SELECT id FROM inspections WHERE vehicle_id = 1 AND status = ?', { replacements: ['due'], type: QueryTypes.SELECT });
  removePlanted = registerDigestSection({
    id: 'planted',
    heading: 'Planted reports',
    pref: 'notifyRideReports',
    async collect() {
      return planted;
    },
    async markNotified(_ctx, keys) {
      plantedMarked.push(keys);
      planted = [];
    },
  });
  // a second section with the same id is not added again
  registerDigestSection({
    id: 'planted',
    heading: 'Planted twice',
    pref: 'notifyRideReports',
    async collect() {
      return [{ key: 'twice', depotId: null, title: 'Twice', lines: [], link: URL }];
    },
    async markNotified() {},
  });
}, 120_000);

afterAll(async () => {
  removePlanted();
  await srv?.stop();
});

describe('the manager digest', () => {
  it("when inspections became due or overdue and another area has items, then each manager's digest lists their depot's items in the sections they want, keyed by the items", async () => {
    const [reason52, reason5, reason69, reason29] = (
      await sq.query<{ id: number; reason: string }>('SELECT id, reason FROM inspections WHERE id IN (52, 5, 69, 29)', { type: QueryTypes.SELECT })
    ).sort((a, b) => [52, 5, 69, 29].indexOf(a.id) - [52, 5, 69, 29].indexOf(b.id)).map((r) => r.reason);
    expect(await queueDigests(ctx)).toBe(3);
    const digests = await mails('digest');
    const inspectionKeys = ['inspections:52:overdue', 'inspections:5:overdue', 'inspections:69:due', 'inspections:29:due', `inspections:${cv101}:due`];
    expect(digests.map((m) => [m.user_id, m.to_address, m.dedupe_key, m.subject, m.status, m.job_run_id, m.created_at])).toEqual([
      [1, 'manager@reboundry.test', `digest:1:2026-11-30:${hash([...inspectionKeys, 'planted:r1', 'planted:r2'])}`, 'Reboundry digest for 30 Nov 2026: 7 new items', 'pending', RUN_ID, '2026-11-30 12:00:00.000 +00:00'],
      [
        managers.north,
        'nora.north@reboundry.test',
        `digest:${managers.north}:2026-11-30:${hash(['inspections:52:overdue', 'inspections:5:overdue', `inspections:${cv101}:due`, 'planted:r1'])}`,
        'Reboundry digest for 30 Nov 2026: 4 new items',
        'pending',
        RUN_ID,
        '2026-11-30 12:00:00.000 +00:00',
      ],
      [managers.millbrook, 'milo.brook@reboundry.test', `digest:${managers.millbrook}:2026-11-30:${hash(['planted:r1', 'planted:r2'])}`, 'Reboundry digest for 30 Nov 2026: 2 new items', 'pending', RUN_ID, '2026-11-30 12:00:00.000 +00:00'],
    ]);
    const [all, north, millbrook] = digests.map((m) => m.text_body);
    expect(all).toContain(
      [
        'Hello Maren Okafor,',
        '',
        'New since your last digest (as of 30 Nov 2026):',
        '',
        '== Inspections now due or overdue (5) ==',
        '- LV-103 (BK22 UVQ), Brackenford North Yard: OVERDUE, 3 days overdue (27 Nov 2026)',
        `  ${reason52}`,
        `  ${URL}/vehicles/21`,
        '',
        '- CV-103 (BK22 CPI), Brackenford North Yard: OVERDUE, 1 day overdue (29 Nov 2026)',
        `  ${reason5}`,
        `  ${URL}/vehicles/3`,
        '',
        '- LV-112 (BK25 DMU), Millbrook Cross Depot: DUE, due today (30 Nov 2026)',
        `  ${reason69}`,
        `  ${URL}/vehicles/30`,
        '',
        '- CV-112 (BK25 LGM), Millbrook Cross Depot: DUE, due in 1 day (1 Dec 2026)',
        `  ${reason29}`,
        `  ${URL}/vehicles/12`,
        '',
        '- CV-101 (BK20 ABC), Brackenford North Yard: DUE, due in 2 days (2 Dec 2026)',
        '  Predicted wear reaches the limit.',
        `  ${URL}/vehicles/1`,
        '',
        '== Planted reports (2) ==',
        '- Report r1',
        '  Felt: a jolt',
        `  ${URL}/ride-reports?report=1`,
        '',
        '- Report r2',
        `  ${URL}/ride-reports?report=2`,
        '',
        `Due inspections: ${URL}/`,
      ].join('\n'),
    );
    expect(all).toContain(`Turn this e-mail off in your account settings: ${URL}/account`);
    expect(all).not.toContain('Twice');
    expect(north).toContain('Hello Nora North,');
    expect(north).toContain('== Inspections now due or overdue (3) ==');
    expect(north).toContain('== Planted reports (1) ==');
    expect(north).not.toContain('Millbrook Cross Depot');
    expect(millbrook).not.toContain('Inspections now due');
    expect(millbrook).toContain('== Planted reports (2) ==');
    expect(digests[0].html_body).toContain(`href="${URL}/vehicles/21"`);
  });

  it("when the digests are queued, then every item is marked told in the same step: each inspection with the status told, the other section's keys handed back", async () => {
    const told = await sq.query<{ id: number; notified_status: string }>('SELECT id, notified_status FROM inspections WHERE id IN (5, 29, 52, 69, 84, ?) ORDER BY id', { replacements: [cv101], type: QueryTypes.SELECT });
    expect(told).toEqual([
      { id: 5, notified_status: 'overdue' },
      { id: 29, notified_status: 'due' },
      { id: 52, notified_status: 'overdue' },
      { id: 69, notified_status: 'due' },
      { id: 84, notified_status: 'due' },
      { id: cv101, notified_status: 'due' },
    ]);
    expect(plantedMarked).toEqual([['r1', 'r2']]);
  });

  it('when nothing is new, then no digest is queued (not even an empty one) and nothing is marked', async () => {
    const before = (await mails('digest')).length;
    expect(await queueDigests(ctx)).toBe(0);
    expect((await mails('digest')).length).toBe(before);
    expect(plantedMarked).toEqual([['r1', 'r2'], []]);
  });

  it('when an inspection turns overdue after managers were told it was due, then the next digest tells them again', async () => {
    await setInspection(69, 'overdue', '2026-11-28', 'due');
    expect(await queueDigests({ ...ctx, runId: null })).toBe(1);
    const last = (await mails('digest')).at(-1)!;
    expect([last.user_id, last.dedupe_key, last.subject, last.job_run_id]).toEqual([1, `digest:1:2026-11-30:${hash(['inspections:69:overdue'])}`, 'Reboundry digest for 30 Nov 2026: 1 new item', null]);
    expect(last.text_body).toContain('LV-112 (BK25 DMU), Millbrook Cross Depot: OVERDUE, 2 days overdue (28 Nov 2026)');
  });
});

describe('notes to mechanics', () => {
  it('when inspections are assigned, then each mechanic who wants notes gets one listing theirs, keyed by inspection (one) or by the list (several); everyone assigned is marked told', async () => {
    const assign = (id: number, to: number) => sq.query('UPDATE inspections SET assignee_id = ?, assignee_notified_id = NULL WHERE id = ?', { replacements: [to, id] });
    await assign(5, 2);
    await assign(52, 2);
    await assign(69, 3);
    await assign(29, noNotes);
    await assign(84, gone);
    expect(await queueAssignmentNotes(ctx)).toBe(2);
    const notes = await mails('assignment');
    expect(notes.map((m) => [m.user_id, m.to_address, m.dedupe_key, m.subject, m.status, m.job_run_id])).toEqual([
      [2, 'mechanic@reboundry.test', `assignments:2:${hash(['5', '52'])}`, '2 inspections assigned to you, first due 27 Nov 2026', 'pending', RUN_ID],
      [3, 'mechanic.millbrook@reboundry.test', 'assignment:69:3', 'Inspection of LV-112 assigned to you, due 28 Nov 2026', 'pending', RUN_ID],
    ]);
    const [two, one] = notes.map((m) => m.text_body);
    expect(two).toContain('Hello Tomasz Reyes,');
    expect(two).toContain('- LV-103 (BK22 UVQ, Brackenford North Yard): due 27 Nov 2026 (overdue)');
    expect(two).toContain(`  Open the inspection: ${URL}/inspections/5\n  The vehicle: ${URL}/vehicles/3`);
    expect(two).toContain(`Turn these notes off in your account settings: ${URL}/account`);
    expect(one).toContain('Hello Ines Garland,');
    expect(one).toContain(`  Open the inspection: ${URL}/inspections/69\n  The vehicle: ${URL}/vehicles/30`);
    const told = await sq.query<{ id: number; told: number | null }>('SELECT id, assignee_notified_id AS told FROM inspections WHERE id IN (5, 29, 52, 69, 84) ORDER BY id', { type: QueryTypes.SELECT });
    expect(told).toEqual([
      { id: 5, told: 2 },
      { id: 29, told: noNotes },
      { id: 52, told: 2 },
      { id: 69, told: 3 },
      { id: 84, told: gone },
    ]);
    expect(await queueAssignmentNotes(ctx)).toBe(0);
  });

  it('when only some inspections are named, then only their assignees are told; naming none tells nobody', async () => {
    await sq.query('UPDATE inspections SET assignee_id = 2 WHERE id = 69');
    await sq.query('UPDATE inspections SET assignee_id = 3 WHERE id = ?', { replacements: [cv101] });
    expect(await queueAssignmentNotes(ctx, [])).toBe(0);
    expect(await queueAssignmentNotes({ ...ctx, runId: null }, [69])).toBe(1);
    const last = (await mails('assignment')).at(-1)!;
    expect([last.user_id, last.dedupe_key, last.subject, last.job_run_id]).toEqual([2, 'assignment:69:2', 'Inspection of LV-112 assigned to you, due 28 Nov 2026', null]);
    const [untold] = await sq.query<{ told: number | null }>('SELECT assignee_notified_id AS told FROM inspections WHERE id = ?', { replacements: [cv101], type: QueryTypes.SELECT });
    expect(untold.told).toBeNull();
  });

  it('when more inspections are assigned than a note lists, then the note ends with a link to the workshop list', async () => {
    const free = await sq.query<{ id: number }>(
      `SELECT id FROM vehicles v WHERE NOT EXISTS (SELECT 1 FROM inspections i WHERE i.vehicle_id = v.id AND i.status IN ('scheduled', 'due', 'overdue')) ORDER BY id LIMIT 31`,
      { type: QueryTypes.SELECT },
    );
    expect(free).toHaveLength(31);
    for (const v of free) {
      await sq.query(`INSERT INTO inspections (vehicle_id, due_date, status, reason, assignee_id, created_at, updated_at) VALUES (?, '2026-12-20', 'scheduled', 'Annual service.', ?, CURRENT_TIMESTAMP, CURRENT_TIMESTAMP)`, {
        replacements: [v.id, noNotes],
      });
    }
    await sq.query('UPDATE users SET notify_assignments = TRUE WHERE id = ?', { replacements: [noNotes] });
    expect(await queueAssignmentNotes(ctx)).toBe(2);
    const long = (await mails('assignment')).find((m) => m.user_id === noNotes)!;
    expect(long.subject).toBe('31 inspections assigned to you, first due 20 Dec 2026');
    expect(long.text_body).toContain(`…and 1 more, all in My inspections: ${URL}/workshop`);
  });
});

describe('sending what is pending', () => {
  const quietLog = () => ({ error: vi.fn(), warn: vi.fn(), info: vi.fn(), debug: vi.fn() }) satisfies Logger;
  const sendable = () => sq.query<{ id: number; dedupe_key: string; to_address: string; subject: string; text_body: string; html_body: string }>(
    "SELECT id, dedupe_key, to_address, subject, text_body, html_body FROM mail_messages WHERE status IN ('pending', 'failed') ORDER BY id",
    { type: QueryTypes.SELECT },
  );

  it('when sending is stopped before or during a run, then nothing more is sent after the stop', async () => {
    const pending = await sendable();
    const sent: string[] = [];
    const stop = new AbortController();
    const mailer = { catches: true, describe: () => 'test', close: async () => {}, send: async (m: OutgoingMail) => (sent.push(m.key), stop.abort(), { messageId: `<${m.key}@test>` }) } satisfies Mailer;
    const aborted = new AbortController();
    aborted.abort();
    expect(await sendPending(mailer, TEST_NOW, quietLog(), { signal: aborted.signal })).toEqual({ sent: 0, failed: [] });
    expect(await sendPending(mailer, TEST_NOW, quietLog(), { signal: stop.signal })).toEqual({ sent: 1, failed: [] });
    expect(sent).toEqual([pending[0].dedupe_key]);
  });

  it('when a message is refused, then it is kept as failed with the reason and logged, the others are sent, and the next run sends it', async () => {
    const pending = await sendable();
    expect(pending.length).toBeGreaterThan(2);
    const refused = pending[1];
    const got: OutgoingMail[] = [];
    const flaky = {
      catches: true,
      describe: () => 'test',
      close: async () => {},
      send: async (m: OutgoingMail) => {
        if (m.key === refused.dedupe_key) throw new Error('mailbox full');
        got.push(m);
        return { messageId: `<${m.key}@test>` };
      },
    } satisfies Mailer;
    const log = quietLog();
    expect(await sendPending(flaky, TEST_NOW, log)).toEqual({ sent: pending.length - 1, failed: [{ item: `mail ${refused.dedupe_key}`, message: 'mailbox full' }] });
    expect(log.warn).toHaveBeenCalledWith(`mail ${refused.dedupe_key} to ${refused.to_address} failed: mailbox full`);
    expect(got[0]).toEqual({ to: pending[0].to_address, subject: pending[0].subject, text: pending[0].text_body, html: pending[0].html_body, key: pending[0].dedupe_key });
    const rows = await sq.query<{ id: number; status: string; message_id: string | null; error: string | null; attempts: number; sent_at: string | null }>(
      'SELECT id, status, message_id, error, attempts, sent_at FROM mail_messages WHERE id IN (?, ?) ORDER BY id',
      { replacements: [pending[0].id, refused.id], type: QueryTypes.SELECT },
    );
    expect(rows).toEqual([
      { id: pending[0].id, status: 'sent', message_id: `<${pending[0].dedupe_key}@test>`, error: null, attempts: 0, sent_at: '2026-11-30 12:00:00.000 +00:00' },
      { id: refused.id, status: 'failed', message_id: null, error: 'mailbox full', attempts: 1, sent_at: null },
    ]);
    // the next run, through the real mailer to the built-in catcher
    expect(await sendPending(srv.mailer, TEST_NOW, log)).toEqual({ sent: 1, failed: [] });
    const [again] = await sq.query<{ status: string; message_id: string }>('SELECT status, message_id FROM mail_messages WHERE id = ?', { replacements: [refused.id], type: QueryTypes.SELECT });
    expect(again).toEqual({ status: 'sent', message_id: stableMessageId(refused.dedupe_key, srv.config.smtpFrom) });
    expect(await sendPending(srv.mailer, TEST_NOW, log)).toEqual({ sent: 0, failed: [] });
  });

  it('when two calls send the same pending messages at once, then each message is sent by exactly one of them and ends sent with its claim cleared', async () => {
    const keys = Array.from({ length: 12 }, (_, i) => `both-at-once:${i}`);
    await sq.transaction((t) =>
      mailRepository.queue(keys.map((k) => ({ dedupeKey: k, kind: 'note', userId: null, toAddress: 'someone@reboundry.test', subject: k, textBody: k, htmlBody: `<p>${k}</p>`, jobRunId: null })), TEST_NOW, t),
    );
    const sent: string[] = [];
    // each send takes a moment, so the two calls go through the list side by side
    const slow = { catches: true, describe: () => 'test', close: async () => {}, send: async (m: OutgoingMail) => (await new Promise((r) => setTimeout(r, 5)), sent.push(m.key), { messageId: `<${m.key}@test>` }) } satisfies Mailer;
    const [a, b] = await Promise.all([sendPending(slow, TEST_NOW, quietLog()), sendPending(slow, TEST_NOW, quietLog())]);
    expect(a.sent + b.sent).toBe(keys.length);
    expect(a.sent).toBeGreaterThan(0);
    expect(b.sent).toBeGreaterThan(0);
    expect([...sent].sort()).toEqual([...keys].sort());
    const rows = await sq.query<{ status: string; claimed_at: string | null; claimed_by: string | null }>(
      "SELECT status, claimed_at, claimed_by FROM mail_messages WHERE dedupe_key LIKE 'both-at-once:%'",
      { type: QueryTypes.SELECT },
    );
    expect(rows).toEqual(keys.map(() => ({ status: 'sent', claimed_at: null, claimed_by: null })));
  });
});
