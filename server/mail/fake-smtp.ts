/**
 * The built-in mail catcher: a local SMTP server (npm `smtp-server`) that accepts every
 * message, parses it (`mailparser`) and stores it in `caught_mail` for the Outbox page.
 * Listens on 127.0.0.1 only.
 */
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';
import type { AddressInfo } from 'node:net';
import type { Logger } from '../logger';
import { mailRepository } from './repository';

export interface FakeSmtp {
  port: number;
  close(): Promise<void>;
}

const MAX_MESSAGE_BYTES = 5 * 1024 * 1024;

export async function startFakeSmtp(port: number, log: Logger): Promise<FakeSmtp> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['AUTH', 'STARTTLS'],
    banner: 'Reboundry mail catcher',
    size: MAX_MESSAGE_BYTES,
    logger: false,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      let size = 0;
      stream.on('data', (c: Buffer) => {
        size += c.length;
        if (size <= MAX_MESSAGE_BYTES) chunks.push(c);
      });
      stream.on('end', () => {
        const raw = Buffer.concat(chunks);
        simpleParser(raw)
          .then((m) =>
            mailRepository.catch({
              messageId: m.messageId ?? null,
              dedupeKey: (m.headers.get('x-reboundry-key') as string | undefined) ?? null,
              // the null sender (MAIL FROM:<>, as bounces use) has the empty address: stored as none
              mailFrom: session.envelope.mailFrom ? session.envelope.mailFrom.address || null : null,
              rcptTo: session.envelope.rcptTo.map((r) => r.address).join(', '),
              subject: m.subject ?? '(no subject)',
              textBody: m.text ?? null,
              htmlBody: typeof m.html === 'string' ? m.html : null,
              sizeBytes: size,
              receivedAt: new Date(),
            }),
          )
          .then(() => callback())
          .catch((err: Error) => {
            log.error('mail catcher: could not store a message', err);
            callback(err);
          });
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => resolve());
  });
  server.on('error', (err) => log.error('mail catcher error', err));
  const address = server.server.address() as AddressInfo;
  return {
    port: address.port,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
