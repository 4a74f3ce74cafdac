/** E-mail about ride reports: the driver's note when their report is decided, the digest section of severe reports. */
import { rideReportsRepository } from './ride-reports-repository';
import { esc, type DigestEntry } from '../mail/templates';
import { registerDigestSection, type DigestSectionProvider } from '../mail/service';
import { SEVERE_LEVEL, feltLabel, severityOf } from './ride-scale';

const page = (title: string, body: string) =>
  `<!doctype html><html><body style="font-family:system-ui,sans-serif;color:#1E2A32;background:#FAF8F3;margin:0;padding:24px">` +
  `<div style="max-width:640px;margin:0 auto;background:#fff;border:1px solid #d8d4ca;border-radius:8px;padding:24px">` +
  `<p style="margin:0 0 4px;font-weight:600;color:#D9622B">Reboundry</p><h1 style="font-size:20px;margin:0 0 16px">${esc(title)}</h1>${body}</div></body></html>`;

export function decisionMail(input: {
  name: string;
  reportId: number;
  reportedAt: string;
  routeName: string;
  seq: number;
  startM: number;
  endM: number;
  decision: 'accepted' | 'dismissed';
  reason: string | null;
  classBefore: string | null;
  classAfter: string | null;
  reportsUrl: string;
  settingsUrl: string;
}) {
  const where = `${input.routeName}, segment ${input.seq + 1} (${(input.startM / 1000).toFixed(1)}–${(input.endM / 1000).toFixed(1)} km)`;
  const day = input.reportedAt.slice(0, 10);
  const subject = input.decision === 'accepted' ? `Your ride report on ${input.routeName} was accepted` : `Your ride report on ${input.routeName} was looked at`;
  const outcome =
    input.decision === 'accepted'
      ? `Your report is now part of the road record. The segment's roughness class ${input.classBefore && input.classAfter && input.classBefore !== input.classAfter ? `went from ${input.classBefore} to ${input.classAfter}` : `is now ${input.classAfter ?? 'updated'}`}, which feeds the damper wear and speed advice for everyone driving it.`
      : `It was not added to the road record. Reason given: ${input.reason ?? '(none)'}`;
  const text = [
    `Hello ${input.name},`,
    '',
    `Thank you for your report of ${day} on ${where}.`,
    outcome,
    '',
    `Your reports: ${input.reportsUrl}`,
    '',
    `Turn these notes off in your account settings: ${input.settingsUrl}`,
  ].join('\n');
  const html = page(
    subject,
    `<p>Hello ${esc(input.name)},</p><p>Thank you for your report of ${esc(day)} on <strong>${esc(where)}</strong>.</p><p>${esc(outcome)}</p>` +
      `<p><a href="${esc(input.reportsUrl)}" style="color:#D9622B">See your reports</a></p>` +
      `<p style="font-size:13px;color:#5B6B73">Turn these notes off in your <a href="${esc(input.settingsUrl)}">account settings</a>.</p>`,
  );
  return { subject, text, html };
}

/** The digest section of severe reports not yet in a digest (status still new). */
export const severeReportsSection: DigestSectionProvider = {
  id: 'ride-reports',
  heading: 'Severe ride reports from drivers',
  pref: 'notifyRideReports',
  async collect({ sequelize, publicUrl, transaction }) {
    const rows = await rideReportsRepository.undigestedSevere(sequelize, SEVERE_LEVEL, transaction);
    return rows.map((r): DigestEntry & { depotId: number | null } => {
      const felt = (JSON.parse(r.felt) as string[]).map(feltLabel).join(', ');
      return {
        key: String(r.id),
        depotId: r.depot_id,
        title: `${r.route_name}, segment ${r.seq + 1} (${(r.start_m / 1000).toFixed(1)}–${(r.end_m / 1000).toFixed(1)} km): ${severityOf(r.severity).label.toLowerCase()}, reported by ${r.driver_name} on ${new Date(r.reported_at).toISOString().slice(0, 10)}`,
        lines: [felt ? `Felt: ${felt}` : 'Nothing ticked', ...(r.note ? [`Note: ${r.note}`] : [])],
        link: `${publicUrl}/ride-reports?report=${r.id}`,
      };
    });
  },
  async markNotified({ sequelize, transaction }, keys) {
    await rideReportsRepository.markDigested(sequelize, keys.map(Number), transaction);
  },
};

/** Registers the severe-reports section with the manager digest (idempotent); the app and the nightly job call it at start. */
export function registerRideReportDigest() {
  registerDigestSection(severeReportsSection);
}
