/** What the outbox endpoints answer, as the client reads it. */

/**
 * Where a queued message is: waiting to be sent (`pending`), claimed by one app instance that is
 * sending it now (`sending`), accepted by the mail server (`sent`), or refused the last time it
 * was tried (`failed`, tried again until its attempts run out).
 */
export const MAIL_STATUSES = ['pending', 'sending', 'sent', 'failed'] as const;
export type MailStatus = (typeof MAIL_STATUSES)[number];

/** How many queued messages are in each status (`sent` in `GET /api/outbox`), zero for a status none is in. */
export type MailStatusCounts = Record<MailStatus, number>;
