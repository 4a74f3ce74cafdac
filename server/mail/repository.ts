/**
 * Mail storage: the sent-mail log with de-duplication keys (`mail_messages`), what the
 * built-in catcher received (`caught_mail`) and users' notification preferences.
 */
import { Op, literal, type Transaction, type WhereOptions } from 'sequelize';
import { CaughtMail, MAIL_STATUSES, MailMessage, type MailKind } from '../db/models';
import type { MailStatusCounts } from '../contracts/mail';
import { User } from '../db/models';
import { likeOp } from '../db/dialect';

export interface QueuedMail {
  dedupeKey: string;
  kind: MailKind;
  userId: number | null;
  toAddress: string;
  subject: string;
  textBody: string;
  htmlBody: string;
  jobRunId: number | null;
}

export interface NotificationPrefs {
  inspectionDigest: boolean;
  rideReports: boolean;
  assignments: boolean;
}

/** Attempts after which a failing message is no longer retried. */
export const MAX_MAIL_ATTEMPTS = 5;

/**
 * How long a claim on a message ('sending') stands: an older claim belonged to an instance that
 * died while sending (a send gives up long before: the SMTP client's own time-outs are minutes),
 * and another instance may claim the message again.
 */
export const MAIL_CLAIM_STALE_MS = 10 * 60_000;

/**
 * The messages a sender may claim at wall-clock time `wallNow`: waiting or failed with attempts
 * left, or claimed by an instance whose claim went stale.
 */
const claimable = (wallNow: Date): WhereOptions<MailMessage> => ({
  attempts: { [Op.lt]: MAX_MAIL_ATTEMPTS },
  [Op.or]: [{ status: { [Op.in]: ['pending', 'failed'] } }, { status: 'sending', claimedAt: { [Op.lt]: new Date(wallNow.getTime() - MAIL_CLAIM_STALE_MS) } }],
});

const caughtRow = (m: CaughtMail, full: boolean) => ({
  id: m.id,
  messageId: m.messageId,
  key: m.dedupeKey,
  from: m.mailFrom,
  to: m.rcptTo,
  subject: m.subject,
  sizeBytes: m.sizeBytes,
  receivedAt: m.receivedAt.toISOString(),
  ...(full ? { text: m.textBody, html: m.htmlBody } : { preview: (m.textBody ?? '').replace(/\s+/g, ' ').slice(0, 160) }),
});

export const mailRepository = {
  /** Queues messages; a key already used is skipped (never sent twice). Returns how many were new. */
  async queue(mails: QueuedMail[], now: Date, transaction: Transaction): Promise<number> {
    let n = 0;
    for (let i = 0; i < mails.length; i += 500) {
      const part = mails.slice(i, i + 500);
      const existing = new Set(
        (await MailMessage.findAll({ attributes: ['dedupeKey'], where: { dedupeKey: { [Op.in]: part.map((m) => m.dedupeKey) } }, transaction, raw: true })).map((r) => r.dedupeKey),
      );
      const fresh = part.filter((m) => !existing.has(m.dedupeKey));
      if (!fresh.length) continue;
      await MailMessage.bulkCreate(
        fresh.map((m) => ({ ...m, status: 'pending' as const, messageId: null, error: null, sentAt: null, claimedAt: null, claimedBy: null, createdAt: now, updatedAt: now })),
        { transaction, ignoreDuplicates: true },
      );
      n += fresh.length;
    }
    return n;
  },

  /** Messages that may be claimed for sending now (wall clock), oldest first. */
  async sendable(wallNow: Date) {
    return MailMessage.findAll({ where: claimable(wallNow), order: [['id', 'ASC']] });
  },

  /**
   * Claims message `id` for the sending call `claimant`: one UPDATE that only one of several
   * instances can win, since each re-checks that the message is still claimable as it writes
   * (SQLite writes one at a time; PostgreSQL makes the second writer of a row re-read it).
   * Returns whether this call won it.
   */
  async claim(id: number, claimant: string, wallNow: Date): Promise<boolean> {
    const [n] = await MailMessage.update({ status: 'sending', claimedAt: wallNow, claimedBy: claimant }, { where: { [Op.and]: [{ id }, claimable(wallNow)] } });
    return n === 1;
  },

  /** Marks a message sent, whoever held its claim: the mail server has it. */
  async markSent(id: number, messageId: string, now: Date) {
    await MailMessage.update({ status: 'sent', messageId, sentAt: now, error: null, claimedAt: null, claimedBy: null }, { where: { id } });
  },

  /**
   * Records a failed attempt of the claim `claimant` holds. Nothing when the claim is no longer
   * its own (it went stale and another instance took it over, and may have sent the message).
   */
  async markFailed(id: number, error: string, claimant: string) {
    await MailMessage.update(
      { status: 'failed', error: error.slice(0, 1000), attempts: literal('attempts + 1'), claimedAt: null, claimedBy: null },
      { where: { id, status: 'sending', claimedBy: claimant } },
    );
  },

  async catch(m: { messageId: string | null; dedupeKey: string | null; mailFrom: string | null; rcptTo: string; subject: string; textBody: string | null; htmlBody: string | null; sizeBytes: number; receivedAt: Date }) {
    await CaughtMail.create({ ...m, subject: m.subject.slice(0, 250) });
  },

  async listCaught(opts: { offset: number; pageSize: number; q?: string }) {
    const like = likeOp(CaughtMail.sequelize!);
    const where = opts.q ? { [Op.or]: [{ subject: { [like]: `%${opts.q}%` } }, { rcptTo: { [like]: `%${opts.q}%` } }] } : {};
    const { rows, count } = await CaughtMail.findAndCountAll({ where, order: [['id', 'DESC']], offset: opts.offset, limit: opts.pageSize });
    return { items: rows.map((r) => caughtRow(r, false)), total: count };
  },

  async getCaught(id: number) {
    const m = await CaughtMail.findByPk(id);
    return m ? caughtRow(m, true) : null;
  },

  async sentCounts(): Promise<MailStatusCounts> {
    const out = Object.fromEntries(MAIL_STATUSES.map((s) => [s, 0])) as MailStatusCounts;
    for (const r of await MailMessage.count({ group: ['status'] })) {
      const status = r.status as keyof MailStatusCounts;
      if (status in out) out[status] = Number(r.count);
    }
    return out;
  },

  async prefs(userId: number): Promise<NotificationPrefs | null> {
    const u = await User.findByPk(userId, { attributes: ['id', 'notifyInspectionDigest', 'notifyRideReports', 'notifyAssignments'] });
    return u ? { inspectionDigest: u.notifyInspectionDigest, rideReports: u.notifyRideReports, assignments: u.notifyAssignments } : null;
  },

  async setPrefs(userId: number, patch: Partial<NotificationPrefs>) {
    const values: Partial<{ notifyInspectionDigest: boolean; notifyRideReports: boolean; notifyAssignments: boolean }> = {};
    if (patch.inspectionDigest !== undefined) values.notifyInspectionDigest = patch.inspectionDigest;
    if (patch.rideReports !== undefined) values.notifyRideReports = patch.rideReports;
    if (patch.assignments !== undefined) values.notifyAssignments = patch.assignments;
    await User.update(values, { where: { id: userId } });
  },
};
