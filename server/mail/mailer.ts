/**
 * Outgoing mail. With `SMTP_URL` set, messages go through that server (nodemailer). Without it
 * the app starts its own mail catcher (a local SMTP server, {@link startFakeSmtp}) and sends to
 * it over real SMTP, so nothing leaves the machine and managers read every message on the
 * Outbox page.
 */
import { createHash } from 'node:crypto';
import nodemailer, { type Transporter } from 'nodemailer';
import type { Config } from '../config';
import type { Logger } from '../logger';
import { startFakeSmtp, type FakeSmtp } from './fake-smtp';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html: string;
  /** De-duplication key, sent as the `X-Reboundry-Key` header. */
  key: string;
}

export interface Mailer {
  /** Sends one message; resolves with the Message-ID once the server accepted it. */
  send(mail: OutgoingMail): Promise<{ messageId: string }>;
  /** Where mail goes, in words (for the Outbox page). */
  describe(): string;
  /** Whether messages land in the built-in catcher (shown on the Outbox page). */
  catches: boolean;
  close(): Promise<void>;
}

/**
 * The Message-ID of a message, fixed by its de-duplication key: a message sent again (after a
 * crash between the server accepting it and the outbox marking it sent) carries the same
 * Message-ID, so a mail server or client can recognise the second copy. The domain is the
 * sender address's.
 */
export function stableMessageId(key: string, from: string): string {
  const domain = /@([^>\s]+)>?\s*$/.exec(from)?.[1] ?? 'reboundry.invalid';
  return `<${createHash('sha256').update(key).digest('hex').slice(0, 32)}@${domain}>`;
}

/** A mailer over a nodemailer SMTP transport. */
export function smtpMailer(transport: Transporter, from: string, description: string, catches: boolean, onClose?: () => Promise<void>): Mailer {
  return {
    catches,
    describe: () => description,
    async send(mail) {
      const info = await transport.sendMail({
        from,
        to: mail.to,
        subject: mail.subject,
        text: mail.text,
        html: mail.html,
        headers: { 'X-Reboundry-Key': mail.key },
        messageId: stableMessageId(mail.key, from),
      });
      return { messageId: String(info.messageId ?? '') };
    },
    async close() {
      transport.close();
      await onClose?.();
    },
  };
}

/**
 * The mailer the config asks for: the real server of `SMTP_URL`, or the built-in catcher on
 * `FAKE_SMTP_PORT` (0 = any free port).
 */
export async function createMailer(config: Config, log: Logger): Promise<{ mailer: Mailer; fakeSmtp: FakeSmtp | null }> {
  if (config.smtpUrl) {
    const transport = nodemailer.createTransport(config.smtpUrl);
    const host = new URL(config.smtpUrl).host;
    return { mailer: smtpMailer(transport, config.smtpFrom, `mail server ${host}`, false), fakeSmtp: null };
  }
  const fake = await startFakeSmtp(config.fakeSmtpPort, log);
  // one pooled connection: a night with thousands of notes does not open thousands of sockets
  const transport = nodemailer.createTransport({ host: '127.0.0.1', port: fake.port, secure: false, ignoreTLS: true, pool: true, maxConnections: 1, maxMessages: Infinity });
  log.info(`mail: no SMTP_URL, built-in mail catcher on port ${fake.port} (read it on the Outbox page)`);
  return {
    mailer: smtpMailer(transport, config.smtpFrom, `the built-in mail catcher (port ${fake.port})`, true, () => fake.close()),
    fakeSmtp: fake,
  };
}
