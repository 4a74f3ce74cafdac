// Outgoing mail and the built-in mail catcher (server/mail/mailer.ts, server/mail/fake-smtp.ts) on
// an empty migrated database: the mailer the config asks for, what it hands to the SMTP
// transport, the stable Message-ID, and what the catcher says and stores for a message sent over
// plain SMTP. The resend carrying the same Message-ID through the whole app is in
// tests/server/mail-id.test.ts.
import { createHash } from 'node:crypto';
import net from 'node:net';
import os from 'node:os';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { QueryTypes } from 'sequelize';
import type { Transporter } from 'nodemailer';
import { loadConfig } from '../../../server/config';
import type { Logger } from '../../../server/logger';
import { createMailer, smtpMailer, stableMessageId } from '../../../server/mail/mailer';
import { startFakeSmtp, type FakeSmtp } from '../../../server/mail/fake-smtp';
import { mailRepository } from '../../../server/mail/repository';
import { freshDb } from '../../support/fresh-db';

let db: Awaited<ReturnType<typeof freshDb>>;
beforeAll(async () => {
  db = await freshDb();
});
afterAll(() => db?.dispose());

const logger = () => ({ error: vi.fn(), warn: vi.fn(), info: vi.fn(), debug: vi.fn() }) satisfies Logger;

interface CaughtRow {
  message_id: string | null;
  dedupe_key: string | null;
  mail_from: string | null;
  rcpt_to: string;
  subject: string;
  text_body: string | null;
  html_body: string | null;
  size_bytes: number;
  received_at: string;
}
async function lastCaught(): Promise<CaughtRow> {
  const rows = await db.sequelize.query<CaughtRow>('SELECT * FROM caught_mail ORDER BY id DESC LIMIT 1', { type: QueryTypes.SELECT });
  return rows[0];
}
const caughtCount = async () => (await db.sequelize.query<{ n: number }>('SELECT COUNT(*) AS n FROM caught_mail', { type: QueryTypes.SELECT }))[0].n;

/**
 * A plain SMTP conversation: sends each line once the previous reply is complete (a reply ends
 * with a line "NNN text", a space after the code) and returns every reply, the greeting first.
 */
function converse(port: number, lines: string[], host = '127.0.0.1'): Promise<string[]> {
  return new Promise((resolve, reject) => {
    const socket = net.connect(port, host);
    const replies: string[] = [];
    let buf = '';
    let next = 0;
    socket.on('error', reject);
    socket.on('data', (d) => {
      buf += d.toString('utf8');
      while (/^\d{3} .*\r\n/m.test(buf)) {
        const end = buf.search(/^\d{3} .*\r\n/m);
        const lineEnd = buf.indexOf('\r\n', end) + 2;
        replies.push(buf.slice(0, lineEnd));
        buf = buf.slice(lineEnd);
        if (next < lines.length) socket.write(lines[next++] + '\r\n');
        else socket.end();
      }
    });
    socket.on('close', () => resolve(replies));
  });
}

const MESSAGE = 'From: someone@example.test\r\nTo: a@x.test\r\n\r\nHello there.\r\n';

describe('stableMessageId', () => {
  it("when a sender is given with or without a display name, then the Message-ID is the key's SHA-256 (first 32 hex digits) at the sender's domain", () => {
    // independent: the digest of the key, computed here
    const digest = createHash('sha256').update('digest:1:2026-11-30').digest('hex').slice(0, 32);
    expect(stableMessageId('digest:1:2026-11-30', 'Reboundry <no-reply@fleet.example>')).toBe(`<${digest}@fleet.example>`);
    expect(stableMessageId('digest:1:2026-11-30', 'no-reply@fleet.example')).toBe(`<${digest}@fleet.example>`);
    expect(stableMessageId('digest:1:2026-11-30', 'Reboundry <no-reply@fleet.example>  ')).toBe(`<${digest}@fleet.example>`);
    expect(stableMessageId('digest:1:2026-11-30', 'no-reply@a.example <x@b.example>')).toBe(`<${digest}@b.example>`);
  });

  it('when the sender has no domain, then the Message-ID is at reboundry.invalid', () => {
    const digest = createHash('sha256').update('k').digest('hex').slice(0, 32);
    expect(stableMessageId('k', 'Reboundry')).toBe(`<${digest}@reboundry.invalid>`);
    expect(stableMessageId('k', 'Reboundry <no-reply@>')).toBe(`<${digest}@reboundry.invalid>`);
    expect(stableMessageId('k', 'Reboundry <no-reply@ x.example>')).toBe(`<${digest}@reboundry.invalid>`);
  });
});

describe('smtpMailer', () => {
  it('when a message is sent, then the transport gets the sender, the message, the key header and the stable Message-ID; a missing Message-ID in the answer is empty', async () => {
    const sendMail = vi.fn(async () => ({}));
    const close = vi.fn();
    const onClose = vi.fn(async () => {});
    const m = smtpMailer({ sendMail, close } as unknown as Transporter, 'Reboundry <no-reply@fleet.example>', 'a test server', true, onClose);
    expect(m.describe()).toBe('a test server');
    expect(m.catches).toBe(true);
    const out = await m.send({ to: 'a@x.test', subject: 'S', text: 'T', html: '<p>H</p>', key: 'k1' });
    expect(out).toEqual({ messageId: '' });
    expect(sendMail).toHaveBeenCalledWith({
      from: 'Reboundry <no-reply@fleet.example>',
      to: 'a@x.test',
      subject: 'S',
      text: 'T',
      html: '<p>H</p>',
      headers: { 'X-Reboundry-Key': 'k1' },
      messageId: stableMessageId('k1', 'Reboundry <no-reply@fleet.example>'),
    });
    sendMail.mockResolvedValueOnce({ messageId: '<given@x>' } as never);
    expect(await m.send({ to: 'a@x.test', subject: 'S', text: 'T', html: '', key: 'k2' })).toEqual({ messageId: '<given@x>' });
    await m.close();
    expect(close).toHaveBeenCalledTimes(1);
    expect(onClose).toHaveBeenCalledTimes(1);
    // without an onClose only the transport is closed
    await smtpMailer({ sendMail, close } as unknown as Transporter, 'x@y.z', 'd', false).close();
    expect(close).toHaveBeenCalledTimes(2);
  });
});

describe('createMailer', () => {
  it('when no SMTP_URL is set, then the built-in catcher starts, the mailer sends to it and closing stops it', async () => {
    const log = logger();
    const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: os.tmpdir(), FAKE_SMTP_PORT: '0', SMTP_FROM: 'Reboundry <no-reply@fleet.example>' });
    const { mailer, fakeSmtp } = await createMailer(config, log);
    expect(fakeSmtp).not.toBeNull();
    const port = fakeSmtp!.port;
    expect(port).toBeGreaterThan(0);
    expect(mailer.catches).toBe(true);
    expect(mailer.describe()).toBe(`the built-in mail catcher (port ${port})`);
    expect(log.info).toHaveBeenCalledWith(`mail: no SMTP_URL, built-in mail catcher on port ${port} (read it on the Outbox page)`);
    const sent = await mailer.send({ to: 'a@x.test, b@x.test', subject: 'Inspections due', text: 'Two are due.', html: '<p>Two are due.</p>', key: 'digest:9' });
    expect(sent.messageId).toBe(stableMessageId('digest:9', 'Reboundry <no-reply@fleet.example>'));
    const row = await lastCaught();
    expect(row).toMatchObject({
      message_id: sent.messageId,
      dedupe_key: 'digest:9',
      mail_from: 'no-reply@fleet.example',
      rcpt_to: 'a@x.test, b@x.test',
      subject: 'Inspections due',
      text_body: 'Two are due.',
      html_body: '<p>Two are due.</p>',
    });
    expect(row.size_bytes).toBeGreaterThan(200);
    await mailer.close();
    await expect(converse(port, [])).rejects.toMatchObject({ code: 'ECONNREFUSED' });
  });

  it('when SMTP_URL is set, then messages go to that server, which is named by host and port and catches nothing itself', async () => {
    const server = await startFakeSmtp(0, logger());
    try {
      const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: os.tmpdir(), SMTP_URL: `smtp://127.0.0.1:${server.port}` });
      const { mailer, fakeSmtp } = await createMailer(config, logger());
      expect(fakeSmtp).toBeNull();
      expect(mailer.catches).toBe(false);
      expect(mailer.describe()).toBe(`mail server 127.0.0.1:${server.port}`);
      await mailer.send({ to: 'c@x.test', subject: 'Through the server', text: 'x', html: '<b>x</b>', key: 'note:1' });
      expect(await lastCaught()).toMatchObject({ subject: 'Through the server', rcpt_to: 'c@x.test', dedupe_key: 'note:1' });
      await mailer.close();
    } finally {
      await server.close();
    }
  });
});

describe('the mail catcher', () => {
  let server: FakeSmtp;
  const log = logger();
  beforeAll(async () => {
    server = await startFakeSmtp(0, log);
  });
  afterAll(() => server?.close());

  it('when a client says hello, then the catcher names itself and offers the size limit of 5 MiB, without sign-in or TLS', async () => {
    const [greeting, ehlo] = await converse(server.port, ['EHLO client.test', 'QUIT']);
    expect(greeting).toMatch(/^220 .*Reboundry mail catcher/);
    expect(ehlo).toContain(`SIZE ${5 * 1024 * 1024}`);
    expect(ehlo).not.toMatch(/AUTH|STARTTLS/);
    // a message declared larger than the limit is refused before it is sent
    const [, , big] = await converse(server.port, ['EHLO client.test', `MAIL FROM:<a@x.test> SIZE=${5 * 1024 * 1024 + 1}`, 'QUIT']);
    expect(big).toMatch(/^552 /);
  });

  it('when a bare message comes from the null sender to two people, then it is stored with no sender, both recipients, "(no subject)", its text, no HTML and its size', async () => {
    const before = await caughtCount();
    const replies = await converse(server.port, ['EHLO client.test', 'MAIL FROM:<>', 'RCPT TO:<a@x.test>', 'RCPT TO:<b@x.test>', 'DATA', MESSAGE + '.', 'QUIT']);
    expect(replies[6]).toMatch(/^250 /);
    expect(await caughtCount()).toBe(before + 1);
    const row = await lastCaught();
    expect(row).toMatchObject({ message_id: null, dedupe_key: null, mail_from: null, rcpt_to: 'a@x.test, b@x.test', subject: '(no subject)', text_body: 'Hello there.\n', html_body: null });
    // the bytes of the message as sent (without the final dot line)
    expect(row.size_bytes).toBe(Buffer.byteLength(MESSAGE));
    const received = new Date(row.received_at).getTime();
    expect(Math.abs(received - Date.now())).toBeLessThan(60_000);
  });

  it('when a message is longer than 5 MiB, then its size is recorded and only its first 5 MiB are kept', async () => {
    const line = 'x'.repeat(998);
    const body = Array.from({ length: 6 * 1024 }, () => line).join('\r\n');
    const message = `Subject: Large\r\n\r\n${body}\r\n`;
    const replies = await converse(server.port, ['EHLO client.test', 'MAIL FROM:<a@x.test>', 'RCPT TO:<b@x.test>', 'DATA', message + '.', 'QUIT']);
    expect(replies[5]).toMatch(/^250 /);
    const row = await lastCaught();
    expect(row.subject).toBe('Large');
    expect(row.size_bytes).toBe(Buffer.byteLength(message));
    expect(row.text_body!.length).toBeLessThanOrEqual(5 * 1024 * 1024);
    expect(row.text_body!.length).toBeGreaterThan(4 * 1024 * 1024);
  }, 30_000);

  it('when a message cannot be stored, then the client is told it failed and the error is logged', async () => {
    const failure = new Error('disk full');
    const spy = vi.spyOn(mailRepository, 'catch').mockRejectedValueOnce(failure);
    try {
      const before = await caughtCount();
      const replies = await converse(server.port, ['EHLO client.test', 'MAIL FROM:<a@x.test>', 'RCPT TO:<b@x.test>', 'DATA', MESSAGE + '.', 'QUIT']);
      expect(replies[5]).toMatch(/^[45]\d\d /);
      expect(log.error).toHaveBeenCalledWith('mail catcher: could not store a message', failure);
      expect(await caughtCount()).toBe(before);
    } finally {
      spy.mockRestore();
    }
  });

  it('when the port is taken, then starting another catcher on it fails', async () => {
    await expect(startFakeSmtp(server.port, logger())).rejects.toMatchObject({ code: 'EADDRINUSE' });
  });

  const outside = Object.values(os.networkInterfaces())
    .flat()
    .find((a) => a && a.family === 'IPv4' && !a.internal)?.address;
  it.skipIf(!outside)("when a client connects on the machine's network address, then it is refused: the catcher listens on 127.0.0.1 only", async () => {
    await expect(converse(server.port, [], outside)).rejects.toMatchObject({ code: 'ECONNREFUSED' });
  });
});
