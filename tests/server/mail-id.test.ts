import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { stableMessageId } from '../../server/mail/mailer';
import { startTestServer, type TestServer } from '../support/server';

let srv: TestServer;
beforeAll(async () => {
  srv = await startTestServer({ seed: false });
});
afterAll(() => srv?.stop());

describe('stable Message-ID', () => {
  it('when one message is sent twice through SMTP (a resend after a crash), then both copies carry the same Message-ID; another message has its own', async () => {
    const mail = { to: 'mechanic@reboundry.test', subject: 'Inspections assigned to you', text: 'two', html: '<p>two</p>', key: 'assignment:7:2026-11-30:abc' };
    const a = await srv.mailer.send(mail);
    const b = await srv.mailer.send(mail);
    const c = await srv.mailer.send({ ...mail, key: 'assignment:7:2026-11-30:def' });
    expect(a.messageId).toBe(b.messageId);
    expect(c.messageId).not.toBe(a.messageId);
    // as received by the mail catcher, in the message headers
    const [rows] = await srv.db.sequelize.query(`SELECT message_id FROM caught_mail ORDER BY id`);
    const ids = (rows as { message_id: string }[]).map((r) => r.message_id);
    expect(ids).toEqual([a.messageId, a.messageId, c.messageId]);
    expect(a.messageId).toBe(stableMessageId(mail.key, srv.config.smtpFrom));
    expect(a.messageId).toMatch(/^<[0-9a-f]{32}@reboundry\.test>$/);
  });
});
