/**
 * Which e-mail to send, and sending it once. Every message gets a de-duplication key stored
 * with it (`mail_messages.dedupe_key`, unique); the items a message covers are marked in the
 * same transaction that queues it, so a rerun queues nothing new, and a message queued but not
 * yet sent (crash) is sent by the next run.
 *
 * - Manager digest: inspections that became due or overdue since managers were last told
 *   (`inspections.notified_status`), for the manager's depot (all depots when they have none),
 *   plus the sections other areas register with {@link registerDigestSection} (severe
 *   ride reports). Each kind follows the user's preference.
 * - Mechanic note: an inspection assigned to a mechanic who has not been told
 *   (`inspections.assignee_notified_id`). Other areas that assign by hand call
 *   {@link queueAssignmentNotes} with the inspection id, then {@link sendPending}.
 */
import { createHash, randomBytes } from 'node:crypto';
import os from 'node:os';
import type { Sequelize, Transaction } from 'sequelize';
import type { Logger } from '../logger';
import type { Mailer } from './mailer';
import { noticeRepository } from './notice-repository';
import { mailRepository, type QueuedMail } from './repository';
import { assignmentMail, digestMail, type DigestEntry } from './templates';
import { readableDay } from '../lib/days';

export interface DigestRecipient {
  id: number;
  name: string;
  email: string;
  depotId: number | null;
  notifyInspectionDigest: boolean;
  notifyRideReports: boolean;
}

/** One section of the manager digest, provided by an area (inspections here; ride reports from the drivers' area). */
export interface DigestSectionProvider {
  id: string;
  heading: string;
  /** Which preference turns it off. */
  pref: 'notifyInspectionDigest' | 'notifyRideReports';
  /** New items, each with the depot it belongs to (null = every manager). */
  collect(ctx: { sequelize: Sequelize; publicUrl: string; asOf: string; transaction: Transaction }): Promise<(DigestEntry & { depotId: number | null })[]>;
  /** Marks the collected items as told, in the same transaction as the queued mail. */
  markNotified(ctx: { sequelize: Sequelize; transaction: Transaction }, keys: string[]): Promise<void>;
}

const inspectionSection: DigestSectionProvider = {
  id: 'inspections',
  heading: 'Inspections now due or overdue',
  pref: 'notifyInspectionDigest',
  async collect({ sequelize, publicUrl, asOf, transaction }) {
    const rows = await noticeRepository.untoldDueInspections(sequelize, transaction);
    const t = Date.parse(`${asOf}T00:00:00Z`);
    return rows.map((r) => {
      const days = Math.round((Date.parse(`${r.due_date}T00:00:00Z`) - t) / 86_400_000);
      const when = days < 0 ? `${-days} day${days === -1 ? '' : 's'} overdue` : days === 0 ? 'due today' : `due in ${days} day${days === 1 ? '' : 's'}`;
      return {
        key: `${r.id}:${r.status}`,
        depotId: r.depot_id,
        title: `${r.fleet_number} (${r.plate}), ${r.depot_name}: ${r.status.toUpperCase()}, ${when} (${readableDay(r.due_date)})`,
        lines: [r.reason],
        link: `${publicUrl}/vehicles/${r.vehicle_id}`,
      };
    });
  },
  async markNotified({ sequelize, transaction }, keys) {
    const byStatus = new Map<string, number[]>();
    for (const k of keys) {
      const [id, status] = k.split(':');
      byStatus.set(status, [...(byStatus.get(status) ?? []), Number(id)]);
    }
    for (const [status, ids] of byStatus) await noticeRepository.markStatusTold(sequelize, ids, status, transaction);
  },
};

const sections: DigestSectionProvider[] = [inspectionSection];

/**
 * Adds a section to the manager digest (severe ride reports); a second section of the same id is
 * not added. Returns the function that takes this section out again (only this one: a call for a
 * provider that was not added removes nothing).
 */
export function registerDigestSection(provider: DigestSectionProvider): () => void {
  if (sections.some((s) => s.id === provider.id)) return () => undefined;
  sections.push(provider);
  return () => {
    const i = sections.indexOf(provider);
    if (i >= 0) sections.splice(i, 1);
  };
}

const hash = (parts: string[]) => createHash('sha256').update(parts.join('|')).digest('hex').slice(0, 16);

export interface MailContext {
  sequelize: Sequelize;
  publicUrl: string;
  asOf: string;
  now: Date;
  runId: number | null;
}

/** Queues each manager's digest of new items and marks the items told. Returns messages queued. */
export async function queueDigests(ctx: MailContext): Promise<number> {
  return ctx.sequelize.transaction(async (transaction) => {
    const managers = await noticeRepository.digestRecipients(ctx.sequelize, transaction);
    const collected = [];
    for (const s of sections) collected.push({ s, items: await s.collect({ sequelize: ctx.sequelize, publicUrl: ctx.publicUrl, asOf: ctx.asOf, transaction }) });
    const mails: QueuedMail[] = [];
    for (const m of managers) {
      const prefs = { notifyInspectionDigest: !!m.notify_inspection_digest, notifyRideReports: !!m.notify_ride_reports };
      const parts = collected
        .filter(({ s }) => prefs[s.pref])
        .map(({ s, items }) => ({ heading: s.heading, id: s.id, entries: items.filter((i) => m.depot_id === null || i.depotId === null || i.depotId === m.depot_id) }))
        .filter((p) => p.entries.length);
      if (!parts.length) continue;
      const keys = parts.flatMap((p) => p.entries.map((e) => `${p.id}:${e.key}`));
      const body = digestMail({ name: m.name, asOf: ctx.asOf, sections: parts, homeUrl: `${ctx.publicUrl}/`, settingsUrl: `${ctx.publicUrl}/account` });
      mails.push({ dedupeKey: `digest:${m.id}:${ctx.asOf}:${hash(keys)}`, kind: 'digest', userId: m.id, toAddress: m.email, subject: body.subject, textBody: body.text, htmlBody: body.html, jobRunId: ctx.runId });
    }
    const queued = await mailRepository.queue(mails, ctx.now, transaction);
    for (const { s, items } of collected) await s.markNotified({ sequelize: ctx.sequelize, transaction }, items.map((i) => i.key));
    return queued;
  });
}

/** Queues a note to each assignee not yet told (all open inspections, or the given ones). */
export async function queueAssignmentNotes(ctx: MailContext, inspectionIds?: number[]): Promise<number> {
  return ctx.sequelize.transaction(async (transaction) => {
    const rows = await noticeRepository.untoldAssignments(ctx.sequelize, inspectionIds, transaction);
    // one note per mechanic per run, listing every inspection newly assigned to them
    const mails: QueuedMail[] = [];
    const byUser = new Map<number, typeof rows>();
    for (const r of rows) {
      if (!r.notify || !r.active) continue;
      const list = byUser.get(r.user_id);
      if (list) list.push(r);
      else byUser.set(r.user_id, [r]);
    }
    for (const [userId, items] of byUser) {
      const first = items[0];
      const body = assignmentMail({
        name: first.name,
        settingsUrl: `${ctx.publicUrl}/account`,
        listUrl: `${ctx.publicUrl}/workshop`,
        items: items.map((r) => ({ fleetNumber: r.fleet_number, plate: r.plate, depotName: r.depot_name, dueDate: r.due_date, status: r.status, reason: r.reason, inspectionUrl: `${ctx.publicUrl}/inspections/${r.id}`, vehicleUrl: `${ctx.publicUrl}/vehicles/${r.vehicle_id}` })),
      });
      const key = items.length === 1 ? `assignment:${first.id}:${userId}` : `assignments:${userId}:${hash(items.map((r) => String(r.id)))}`;
      mails.push({ dedupeKey: key, kind: 'assignment', userId, toAddress: first.email, subject: body.subject, textBody: body.text, htmlBody: body.html, jobRunId: ctx.runId });
    }
    await noticeRepository.markAssigneeTold(ctx.sequelize, rows.map((r) => Number(r.id)), transaction);
    return mailRepository.queue(mails, ctx.now, transaction);
  });
}

/** A name for one call of {@link sendPending}, unique across instances and calls: the holder of its claims. */
const claimantName = () => `${os.hostname()}:${process.pid}:${randomBytes(6).toString('hex')}`.slice(-120);

/**
 * Sends every queued (or earlier failed) message once; a failure is recorded and retried later.
 * Several app instances may call it at once on one database: each message is claimed before it
 * is sent, and only the call that won the claim sends it. A claim left by an instance that died
 * while sending goes stale after ten minutes (`MAIL_CLAIM_STALE_MS`) and is claimed again.
 * Claims are stamped by `wallClock` (the real clock by default), `now` stamps the message sent.
 */
export async function sendPending(
  mailer: Mailer,
  now: Date,
  log: Logger,
  opts: { signal?: AbortSignal; wallClock?: () => Date } = {},
): Promise<{ sent: number; failed: { item: string; message: string }[] }> {
  const wall = opts.wallClock ?? (() => new Date());
  const claimant = claimantName();
  const pending = await mailRepository.sendable(wall());
  let sent = 0;
  const failed: { item: string; message: string }[] = [];
  for (const m of pending) {
    if (opts.signal?.aborted) break;
    // another instance sent it, or is sending it, since it was listed
    if (!(await mailRepository.claim(m.id, claimant, wall()))) continue;
    try {
      const r = await mailer.send({ to: m.toAddress, subject: m.subject, text: m.textBody, html: m.htmlBody, key: m.dedupeKey });
      await mailRepository.markSent(m.id, r.messageId, now);
      sent++;
    } catch (err) {
      const message = (err as Error).message;
      log.warn(`mail ${m.dedupeKey} to ${m.toAddress} failed: ${message}`);
      await mailRepository.markFailed(m.id, message, claimant);
      failed.push({ item: `mail ${m.dedupeKey}`, message });
    }
  }
  return { sent, failed };
}
