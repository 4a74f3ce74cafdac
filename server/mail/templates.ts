/**
 * E-mail bodies: plain text and HTML with links into the app. Our own words; every number
 * with its unit; the caution that predictions support, never replace, inspection.
 */
import { readableDay } from '../lib/days';

export const CAUTION_TEXT =
  'Wear predictions are estimates from a model of the vehicle and the road. They support, and never replace, inspection by a qualified mechanic, the vehicle and damper makers’ requirements and local regulations.';

export const esc = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

export interface DigestEntry {
  key: string;
  title: string;
  lines: string[];
  link: string;
}

export interface DigestSectionContent {
  heading: string;
  intro?: string;
  entries: DigestEntry[];
}

const wrap = (title: string, body: string) =>
  `<!doctype html><html><body style="font-family:system-ui,sans-serif;color:#1E2A32;background:#FAF8F3;margin:0;padding:24px">` +
  `<div style="max-width:680px;margin:0 auto;background:#fff;border:1px solid #d8d4ca;border-radius:8px;padding:24px">` +
  `<p style="margin:0 0 4px;font-weight:600;color:#D9622B">Reboundry</p><h1 style="font-size:20px;margin:0 0 16px">${esc(title)}</h1>${body}` +
  `<p style="margin-top:24px;font-size:13px;color:#5B6B73">${esc(CAUTION_TEXT)}</p></div></body></html>`;

/** Entries listed per digest section or assignment note; the rest are counted with a link into the app. */
export const MAX_LISTED = 30;

export function digestMail(input: { name: string; asOf: string; sections: DigestSectionContent[]; homeUrl: string; settingsUrl: string }) {
  const count = input.sections.reduce((s, x) => s + x.entries.length, 0);
  // the day as the app's screens write it (4 Dec 2026), not the ISO form the job keys it by
  const day = readableDay(input.asOf);
  const subject = `Reboundry digest for ${day}: ${count} new item${count === 1 ? '' : 's'}`;
  const text: string[] = [`Hello ${input.name},`, '', `New since your last digest (as of ${day}):`, ''];
  let html = `<p>Hello ${esc(input.name)},</p><p>New since your last digest (as of ${esc(day)}):</p>`;
  for (const s of input.sections) {
    text.push(`== ${s.heading} (${s.entries.length}) ==`);
    if (s.intro) text.push(s.intro);
    html += `<h2 style="font-size:16px;margin:20px 0 8px">${esc(s.heading)} (${s.entries.length})</h2>`;
    if (s.intro) html += `<p style="margin:0 0 8px">${esc(s.intro)}</p>`;
    html += '<ul style="padding-left:18px;margin:0">';
    for (const e of s.entries.slice(0, MAX_LISTED)) {
      text.push(`- ${e.title}`, ...e.lines.map((l) => `  ${l}`), `  ${e.link}`, '');
      html += `<li style="margin-bottom:10px"><a href="${esc(e.link)}" style="color:#1E2A32;font-weight:600">${esc(e.title)}</a>${e.lines.map((l) => `<br><span>${esc(l)}</span>`).join('')}</li>`;
    }
    html += '</ul>';
    const more = s.entries.length - MAX_LISTED;
    if (more > 0) {
      text.push(`…and ${more} more, all in the app: ${input.homeUrl}`, '');
      html += `<p style="margin:0 0 8px">…and ${more} more, all <a href="${esc(input.homeUrl)}" style="color:#D9622B">in the app</a>.</p>`;
    }
  }
  text.push(`Due inspections: ${input.homeUrl}`, '', CAUTION_TEXT, '', `Turn this e-mail off in your account settings: ${input.settingsUrl}`);
  html += `<p><a href="${esc(input.homeUrl)}" style="color:#D9622B">Open the due inspections</a></p><p style="font-size:13px;color:#5B6B73">Turn this e-mail off in your <a href="${esc(input.settingsUrl)}">account settings</a>.</p>`;
  return { subject, text: text.join('\n'), html: wrap(`Digest for ${day}`, html) };
}

export interface AssignedItem {
  fleetNumber: string;
  plate: string;
  depotName: string;
  dueDate: string;
  status: string;
  reason: string;
  /** The inspection itself in the app, where the mechanic records it. */
  inspectionUrl: string;
  vehicleUrl: string;
}

/** The app's words for an inspection's status (the same as on every page that shows one). */
const STATUS_WORDS: Record<string, string> = { scheduled: 'scheduled', due: 'due', overdue: 'overdue', done: 'done', cancelled: 'cancelled' };
const statusWord = (s: string) => STATUS_WORDS[s] ?? s;

/** A note to a mechanic listing the inspections newly assigned to them (one or several). */
export function assignmentMail(input: { name: string; items: AssignedItem[]; settingsUrl: string; listUrl: string }) {
  const all = [...input.items].sort((a, b) => (a.dueDate < b.dueDate ? -1 : a.dueDate > b.dueDate ? 1 : a.fleetNumber.localeCompare(b.fleetNumber)));
  const one = all.length === 1 ? all[0] : null;
  // the most urgent first; a long list ends with a link to the whole of it in the app
  const items = all.slice(0, MAX_LISTED);
  const more = all.length - items.length;
  const subject = one
    ? `Inspection of ${one.fleetNumber} assigned to you, due ${readableDay(one.dueDate)}`
    : `${all.length} inspections assigned to you, first due ${readableDay(all[0].dueDate)}`;
  const text = [
    `Hello ${input.name},`,
    '',
    one ? `The damper and spring inspection of ${one.fleetNumber} is assigned to you.` : `${all.length} damper and spring inspections are assigned to you${more > 0 ? `; the ${items.length} due first` : ''}:`,
    '',
    ...items.flatMap((i) => [`- ${i.fleetNumber} (${i.plate}, ${i.depotName}): due ${readableDay(i.dueDate)} (${statusWord(i.status)})`, `  Why: ${i.reason}`, `  Open the inspection: ${i.inspectionUrl}`, `  The vehicle: ${i.vehicleUrl}`, '']),
    ...(more > 0 ? [`…and ${more} more, all in My inspections: ${input.listUrl}`, ''] : []),
    CAUTION_TEXT,
    '',
    `Turn these notes off in your account settings: ${input.settingsUrl}`,
  ].join('\n');
  const html = wrap(
    one ? `Inspection of ${one.fleetNumber} assigned to you` : `${all.length} inspections assigned to you`,
    `<p>Hello ${esc(input.name)},</p><p>${one ? 'This damper and spring inspection is assigned to you:' : `${all.length} damper and spring inspections are assigned to you${more > 0 ? `; the ${items.length} due first` : ''}:`}</p><ul style="padding-left:18px">` +
      items
        .map(
          (i) =>
            `<li style="margin-bottom:10px"><a href="${esc(i.inspectionUrl)}" style="color:#1E2A32;font-weight:600">Inspection of ${esc(i.fleetNumber)}</a> (${esc(i.plate)}, ${esc(i.depotName)}): due ${esc(readableDay(i.dueDate))} (${esc(statusWord(i.status))})<br><span>Why: ${esc(i.reason)}</span><br><a href="${esc(i.vehicleUrl)}" style="color:#5B6B73">The vehicle</a></li>`,
        )
        .join('') +
      `</ul>${more > 0 ? `<p>…and ${more} more, all in <a href="${esc(input.listUrl)}" style="color:#D9622B">My inspections</a>.</p>` : ''}<p style="font-size:13px;color:#5B6B73">Turn these notes off in your <a href="${esc(input.settingsUrl)}">account settings</a>.</p>`,
  );
  return { subject, text, html };
}
