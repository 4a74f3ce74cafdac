/**
 * Mail storage: the sent-mail log with de-duplication keys (`mail_messages`), what the
 * built-in catcher received (`caught_mail`) and users' notification preferences.
 */
import { Op, type Transaction } from 'sequelize';
import { CaughtMail, MailMessage, type MailKind } from '../db/models';
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
        fresh.map((m) => ({ ...m, status: 'pending' as const, messageId: null, error: null, sentAt: null, createdAt: now, updatedAt: now })),
        { transaction, ignoreDuplicates: true },
      );
      n += fresh.length;
    }
    return n;
  },

  async sendable() {
    return MailMessage.findAll({ where: { status: { [Op.in]: ['pending', 'failed'] }, attempts: { [Op.lt]: MAX_MAIL_ATTEMPTS } }, order: [['id', 'ASC']] });
  },

  async markSent(id: number, messageId: string, now: Date) {
    await MailMessage.update({ status: 'sent', messageId, sentAt: now, error: null, }, { where: { id } });
  },

  async markFailed(id: number, error: string) {
    const m = await MailMessage.findByPk(id);
    if (m) await m.update({ status: 'failed', error: error.slice(0, 1000), attempts: m.attempts + 1 });
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

  async sentCounts() {
    const rows = (await MailMessage.findAll({ attributes: ['status'], raw: true })) as unknown as { status: string }[];
    const out: Record<string, number> = { pending: 0, sent: 0, failed: 0 };
    for (const r of rows) out[r.status] = (out[r.status] ?? 0) + 1;
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
