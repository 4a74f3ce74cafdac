// Mail storage on an empty migrated database (server/mail/repository.ts): queuing with
// de-duplication keys across the 500-message slices, what is sendable, claiming a message for
// one sender, marking sent and failed,
// what the mail catcher stores and lists, the sent counts and a user's notification preferences.
// The rules that queue and send are in tests/server/mail/service.test.ts.
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { MAIL_CLAIM_STALE_MS, MAX_MAIL_ATTEMPTS, mailRepository, type QueuedMail } from '../../../server/mail/repository';
import { freshDb } from '../../support/fresh-db';

let db: Awaited<ReturnType<typeof freshDb>>;
const NOW = new Date('2026-11-30T12:00:00Z');
/** The wall clock of claims (not the logical NOW that stamps rows). */
const WALL = new Date('2027-01-04T08:00:00Z');
/** A date as Sequelize stores it in SQLite. */
const stamp = (d: Date) => d.toISOString().replace('T', ' ').replace('Z', ' +00:00');

beforeAll(async () => {
  db = await freshDb();
});
afterAll(() => db?.dispose());

const sql = <T extends object>(q: string, replacements: unknown[] = []) => db.sequelize.query<T>(q, { replacements, type: QueryTypes.SELECT });

const mail = (key: string, o: Partial<QueuedMail> = {}): QueuedMail => ({
  dedupeKey: key,
  kind: 'digest',
  userId: null,
  toAddress: 'manager@reboundry.test',
  subject: `Subject ${key}`,
  textBody: `text ${key}`,
  htmlBody: `<p>${key}</p>`,
  jobRunId: 3,
  ...o,
});

const queue = (mails: QueuedMail[]) => db.sequelize.transaction((t) => mailRepository.queue(mails, NOW, t));

async function addUser(email: string) {
  await db.sequelize.query(
    `INSERT INTO users (name, email, role, password_hash, active, created_at, updated_at) VALUES ('Someone', ?, 'manager', 'x', 1, datetime('now'), datetime('now'))`,
    { replacements: [email] },
  );
  const [u] = await sql<{ id: number }>('SELECT id FROM users WHERE email = ?', [email]);
  return u.id;
}

describe('queue', () => {
  beforeEach(async () => {
    await db.sequelize.query('DELETE FROM mail_messages');
  });

  it('when 1001 messages are queued (three slices of 500), then every one is stored pending as given, with the time of queuing', async () => {
    const mails = Array.from({ length: 1001 }, (_, i) => mail(`k${i}`));
    expect(await queue(mails)).toBe(1001);
    const rows = await sql<Record<string, unknown>>('SELECT * FROM mail_messages ORDER BY id');
    expect(rows.map((r) => r.dedupe_key)).toEqual(mails.map((m) => m.dedupeKey));
    expect(rows[1000]).toMatchObject({
      dedupe_key: 'k1000',
      kind: 'digest',
      user_id: null,
      to_address: 'manager@reboundry.test',
      subject: 'Subject k1000',
      text_body: 'text k1000',
      html_body: '<p>k1000</p>',
      job_run_id: 3,
      status: 'pending',
      message_id: null,
      error: null,
      sent_at: null,
      attempts: 0,
    });
    // Sequelize stores dates as 'YYYY-MM-DD HH:MM:SS.SSS +00:00'
    expect(new Date(String(rows[0].created_at)).toISOString()).toBe(NOW.toISOString());
    expect(new Date(String(rows[0].updated_at)).toISOString()).toBe(NOW.toISOString());
  });

  it('when keys already used are queued again, then they are skipped and only the new ones count, also when a whole slice is old', async () => {
    await queue(Array.from({ length: 600 }, (_, i) => mail(`k${i}`)));
    // first slice of 500: all old; second slice: k500..k599 old, n0 and n1 new
    const again = [...Array.from({ length: 600 }, (_, i) => mail(`k${i}`, { subject: 'changed' })), mail('n0'), mail('n1')];
    expect(await queue(again)).toBe(2);
    const [c] = await sql<{ n: number; changed: number }>(`SELECT COUNT(*) AS n, SUM(subject = 'changed') AS changed FROM mail_messages`);
    expect(c).toEqual({ n: 602, changed: 0 });
    expect(await queue([mail('k3')])).toBe(0);
  });

  it('when one key appears twice in one call, then one message is stored', async () => {
    await queue([mail('twice'), mail('twice', { subject: 'second' })]);
    const rows = await sql<{ subject: string }>(`SELECT subject FROM mail_messages WHERE dedupe_key = 'twice'`);
    expect(rows).toEqual([{ subject: 'Subject twice' }]);
  });
});

describe('sending state', () => {
  beforeEach(async () => {
    await db.sequelize.query('DELETE FROM mail_messages');
  });

  async function idOf(key: string) {
    const [r] = await sql<{ id: number }>('SELECT id FROM mail_messages WHERE dedupe_key = ?', [key]);
    return r.id;
  }

  it(`when messages are pending, failed, sent or failed ${MAX_MAIL_ATTEMPTS} times, then the pending and failed ones under the limit are sendable, oldest first`, async () => {
    await queue([mail('a'), mail('b'), mail('c'), mail('d'), mail('e')]);
    await db.sequelize.query(`UPDATE mail_messages SET status = 'sent' WHERE dedupe_key = 'a'`);
    await db.sequelize.query(`UPDATE mail_messages SET status = 'failed', attempts = 4 WHERE dedupe_key = 'b'`);
    await db.sequelize.query(`UPDATE mail_messages SET status = 'failed', attempts = 5 WHERE dedupe_key = 'c'`);
    await db.sequelize.query(`UPDATE mail_messages SET status = 'pending', attempts = 5 WHERE dedupe_key = 'e'`);
    expect(MAX_MAIL_ATTEMPTS).toBe(5);
    expect((await mailRepository.sendable(WALL)).map((m) => m.dedupeKey)).toEqual(['b', 'd']);
  });

  it('when messages are claimed for sending, then one claimed less than 10 minutes ago is not sendable, one claimed longer ago is (its sender died), unless its attempts are used up', async () => {
    await queue([mail('fresh'), mail('edge'), mail('stale'), mail('stale-spent')]);
    const claimed = async (key: string, agoMs: number, attempts = 0) =>
      db.sequelize.query(`UPDATE mail_messages SET status = 'sending', claimed_at = ?, claimed_by = 'gone:1', attempts = ? WHERE dedupe_key = ?`, {
        replacements: [stamp(new Date(WALL.getTime() - agoMs)), attempts, key],
      });
    expect(MAIL_CLAIM_STALE_MS).toBe(10 * 60_000);
    await claimed('fresh', 60_000);
    await claimed('edge', MAIL_CLAIM_STALE_MS);
    await claimed('stale', MAIL_CLAIM_STALE_MS + 1);
    await claimed('stale-spent', MAIL_CLAIM_STALE_MS + 60_000, MAX_MAIL_ATTEMPTS);
    expect((await mailRepository.sendable(WALL)).map((m) => m.dedupeKey)).toEqual(['stale']);
  });

  it('when two senders claim one message, then only the first wins, and the loser can neither mark it failed nor claim it again until the claim is stale', async () => {
    await queue([mail('x')]);
    const id = await idOf('x');
    expect(await mailRepository.claim(id, 'sender-a', WALL)).toBe(true);
    expect(await mailRepository.claim(id, 'sender-b', WALL)).toBe(false);
    expect(await mailRepository.claim(id, 'sender-b', new Date(WALL.getTime() + MAIL_CLAIM_STALE_MS))).toBe(false);
    let [r] = await sql<Record<string, unknown>>('SELECT status, claimed_by, claimed_at, attempts FROM mail_messages WHERE id = ?', [id]);
    expect(r).toEqual({ status: 'sending', claimed_by: 'sender-a', claimed_at: stamp(WALL), attempts: 0 });
    await mailRepository.markFailed(id, 'not my claim', 'sender-b');
    [r] = await sql<Record<string, unknown>>('SELECT status, error, attempts FROM mail_messages WHERE id = ?', [id]);
    expect(r).toEqual({ status: 'sending', error: null, attempts: 0 });
    // sender-a went quiet: once its claim is stale, sender-b takes the message over
    const later = new Date(WALL.getTime() + MAIL_CLAIM_STALE_MS + 1);
    expect(await mailRepository.claim(id, 'sender-b', later)).toBe(true);
    [r] = await sql<Record<string, unknown>>('SELECT status, claimed_by, claimed_at FROM mail_messages WHERE id = ?', [id]);
    expect(r).toEqual({ status: 'sending', claimed_by: 'sender-b', claimed_at: stamp(later) });
    // what sender-a says now of its old claim changes nothing
    await mailRepository.markFailed(id, 'too late', 'sender-a');
    [r] = await sql<Record<string, unknown>>('SELECT status, claimed_by, error FROM mail_messages WHERE id = ?', [id]);
    expect(r).toEqual({ status: 'sending', claimed_by: 'sender-b', error: null });
  });

  it('when a sent or spent message is claimed, then the claim fails and the message is left as it was', async () => {
    await queue([mail('sent'), mail('spent')]);
    await db.sequelize.query(`UPDATE mail_messages SET status = 'sent' WHERE dedupe_key = 'sent'`);
    await db.sequelize.query(`UPDATE mail_messages SET status = 'failed', attempts = ? WHERE dedupe_key = 'spent'`, { replacements: [MAX_MAIL_ATTEMPTS] });
    expect(await mailRepository.claim(await idOf('sent'), 'sender', WALL)).toBe(false);
    expect(await mailRepository.claim(await idOf('spent'), 'sender', WALL)).toBe(false);
    expect(await sql(`SELECT dedupe_key, status, claimed_by FROM mail_messages ORDER BY id`)).toEqual([
      { dedupe_key: 'sent', status: 'sent', claimed_by: null },
      { dedupe_key: 'spent', status: 'failed', claimed_by: null },
    ]);
  });

  it('when a claimed message fails twice and is then sent, then each failure counts an attempt, keeps its error (at most 1000 characters) and ends the claim, and sending clears the error', async () => {
    await queue([mail('x'), mail('other')]);
    const id = await idOf('x');
    expect(await mailRepository.claim(id, 'sender', WALL)).toBe(true);
    await mailRepository.markFailed(id, 'connection refused', 'sender');
    let [r] = await sql<Record<string, unknown>>('SELECT status, error, attempts, claimed_at, claimed_by FROM mail_messages WHERE id = ?', [id]);
    expect(r).toEqual({ status: 'failed', error: 'connection refused', attempts: 1, claimed_at: null, claimed_by: null });
    expect(await mailRepository.claim(id, 'sender', WALL)).toBe(true);
    await mailRepository.markFailed(id, 'e'.repeat(1500), 'sender');
    [r] = await sql<Record<string, unknown>>('SELECT status, error, attempts FROM mail_messages WHERE id = ?', [id]);
    expect(r).toEqual({ status: 'failed', error: 'e'.repeat(1000), attempts: 2 });
    expect(await mailRepository.claim(id, 'sender', WALL)).toBe(true);
    const sentAt = new Date('2026-11-30T12:05:00Z');
    await mailRepository.markSent(id, '<abc@reboundry.test>', sentAt);
    const [s] = await sql<Record<string, unknown>>('SELECT status, error, message_id, sent_at, attempts, claimed_at, claimed_by FROM mail_messages WHERE id = ?', [id]);
    expect(s).toMatchObject({ status: 'sent', error: null, message_id: '<abc@reboundry.test>', attempts: 2, claimed_at: null, claimed_by: null });
    expect(new Date(String(s.sent_at)).toISOString()).toBe(sentAt.toISOString());
    // the other message is untouched
    [r] = await sql<Record<string, unknown>>(`SELECT status, error, attempts FROM mail_messages WHERE dedupe_key = 'other'`);
    expect(r).toEqual({ status: 'pending', error: null, attempts: 0 });
    await expect(mailRepository.markFailed(999_999, 'gone', 'sender')).resolves.toBeUndefined();
  });

  it('when messages are in each state, then the counts name pending, sending, sent and failed, zero for a state none is in', async () => {
    expect(await mailRepository.sentCounts()).toEqual({ pending: 0, sending: 0, sent: 0, failed: 0 });
    await queue([mail('a'), mail('b'), mail('c'), mail('d'), mail('e')]);
    await db.sequelize.query(`UPDATE mail_messages SET status = 'sent' WHERE dedupe_key IN ('a', 'b')`);
    await db.sequelize.query(`UPDATE mail_messages SET status = 'failed' WHERE dedupe_key = 'c'`);
    await db.sequelize.query(`UPDATE mail_messages SET status = 'sending' WHERE dedupe_key = 'e'`);
    expect(await mailRepository.sentCounts()).toEqual({ pending: 1, sending: 1, sent: 2, failed: 1 });
  });
});

describe('the mail catcher store', () => {
  const caught = (i: number, o: Partial<Parameters<typeof mailRepository.catch>[0]> = {}) => ({
    messageId: `<m${i}@reboundry.test>`,
    dedupeKey: `key${i}`,
    mailFrom: 'no-reply@reboundry.test',
    rcptTo: `person${i}@reboundry.test`,
    subject: `Digest number ${i}`,
    textBody: `Body ${i}`,
    htmlBody: `<p>Body ${i}</p>`,
    sizeBytes: 100 + i,
    receivedAt: new Date(Date.UTC(2026, 10, 30, 12, i)),
    ...o,
  });

  beforeAll(async () => {
    await db.sequelize.query('DELETE FROM caught_mail');
    for (let i = 1; i <= 5; i++) await mailRepository.catch(caught(i));
    await mailRepository.catch(caught(6, { subject: 's'.repeat(300), textBody: `  first\n\n\tsecond   third ${'w'.repeat(200)}`, rcptTo: 'alpha@x.test, beta@x.test' }));
    await mailRepository.catch(caught(7, { textBody: null, htmlBody: null, messageId: null, dedupeKey: null, mailFrom: null }));
  });

  it('when messages are listed, then the newest come first, paged, each with its fields and a one-line preview of at most 160 characters', async () => {
    const page = await mailRepository.listCaught({ offset: 0, pageSize: 3 });
    expect(page.total).toBe(7);
    expect(page.items.map((m) => m.key)).toEqual([null, 'key6', 'key5']);
    expect(page.items[2]).toEqual({
      id: expect.any(Number),
      messageId: '<m5@reboundry.test>',
      key: 'key5',
      from: 'no-reply@reboundry.test',
      to: 'person5@reboundry.test',
      subject: 'Digest number 5',
      sizeBytes: 105,
      receivedAt: '2026-11-30T12:05:00.000Z',
      preview: 'Body 5',
    });
    expect(page.items[0]).toHaveProperty('preview', '');
    // runs of white space become one space; the subject was cut to 250 characters when stored
    expect(page.items[1]).toHaveProperty('preview', ` first second third ${'w'.repeat(200)}`.slice(0, 160));
    expect(page.items[1].subject).toBe('s'.repeat(250));
    const next = await mailRepository.listCaught({ offset: 3, pageSize: 3 });
    expect(next.items.map((m) => m.key)).toEqual(['key4', 'key3', 'key2']);
    expect(next.total).toBe(7);
  });

  it('when the list is searched, then a message matches by subject or by recipient', async () => {
    expect((await mailRepository.listCaught({ offset: 0, pageSize: 10, q: 'number 3' })).items.map((m) => m.key)).toEqual(['key3']);
    const byTo = await mailRepository.listCaught({ offset: 0, pageSize: 10, q: 'beta@' });
    expect(byTo.items.map((m) => m.key)).toEqual(['key6']);
    expect(byTo.total).toBe(1);
    expect((await mailRepository.listCaught({ offset: 0, pageSize: 10, q: 'nothing like it' })).total).toBe(0);
  });

  it('when one message is read, then it has its whole text and HTML; an unknown id is none', async () => {
    const { items } = await mailRepository.listCaught({ offset: 0, pageSize: 10, q: 'number 2' });
    const m = await mailRepository.getCaught(items[0].id);
    expect(m).toEqual({ ...items[0], preview: undefined, text: 'Body 2', html: '<p>Body 2</p>' });
    expect(m).not.toHaveProperty('preview');
    expect(await mailRepository.getCaught(999_999)).toBeNull();
  });
});

describe('notification preferences', () => {
  it('when a user changes one preference at a time, then only that one changes; an unknown user has none', async () => {
    const id = await addUser('prefs@reboundry.test');
    const other = await addUser('other@reboundry.test');
    expect(await mailRepository.prefs(id)).toEqual({ inspectionDigest: true, rideReports: true, assignments: true });
    await mailRepository.setPrefs(id, { inspectionDigest: false });
    expect(await mailRepository.prefs(id)).toEqual({ inspectionDigest: false, rideReports: true, assignments: true });
    await mailRepository.setPrefs(id, { rideReports: false });
    expect(await mailRepository.prefs(id)).toEqual({ inspectionDigest: false, rideReports: false, assignments: true });
    await mailRepository.setPrefs(id, { assignments: false, inspectionDigest: true });
    expect(await mailRepository.prefs(id)).toEqual({ inspectionDigest: true, rideReports: false, assignments: false });
    expect(await mailRepository.prefs(other)).toEqual({ inspectionDigest: true, rideReports: true, assignments: true });
    expect(await mailRepository.prefs(999_999)).toBeNull();
  });
});
