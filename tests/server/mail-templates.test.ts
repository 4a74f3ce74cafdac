import { describe, expect, it } from 'vitest';
import { assignmentMail, digestMail, MAX_LISTED } from '../../server/mail/templates';

const item = (k: number) => ({
  fleetNumber: `CV-${String(100 + k)}`,
  plate: `BK${k}`,
  depotName: 'North',
  dueDate: `2026-12-${String(1 + (k % 28)).padStart(2, '0')}`,
  status: 'scheduled',
  reason: `reason ${k}`,
  inspectionUrl: `http://app.test/inspections/${500 + k}`,
  vehicleUrl: `http://app.test/vehicles/${k}`,
});

describe('e-mail bodies', () => {
  it('when a mechanic is assigned more inspections than a note lists, then the most urgent are listed and the rest counted with a link to all of them', () => {
    const n = MAX_LISTED + 15;
    const m = assignmentMail({ name: 'Tomasz', items: Array.from({ length: n }, (_, k) => item(k)), settingsUrl: 'http://app.test/account', listUrl: 'http://app.test/workshop' });
    expect(m.subject).toBe(`${n} inspections assigned to you, first due 2026-12-01`);
    expect(m.text.match(/^- CV-/gm)).toHaveLength(MAX_LISTED);
    expect(m.text).toContain(`…and 15 more, all in My inspections: http://app.test/workshop`);
    expect(m.html.match(/<li /g)).toHaveLength(MAX_LISTED);
    expect(m.html).toContain('href="http://app.test/workshop"');
    // the listed ones are the earliest due
    const listed = [...m.text.matchAll(/due (2026-12-\d\d)/g)].map((x) => x[1]);
    expect(listed.every((d) => d <= '2026-12-28')).toBe(true);
    expect([...listed].sort()).toEqual(listed);
  });

  it('when a note has few inspections, then all are listed and no "more" line appears', () => {
    const m = assignmentMail({ name: 'Ines', items: [item(1), item(2)], settingsUrl: 'http://app.test/account', listUrl: 'http://app.test/workshop' });
    expect(m.text.match(/^- CV-/gm)).toHaveLength(2);
    expect(m.text).not.toMatch(/more, all in/);
  });

  it('when a mechanic is assigned an inspection, then the note links to that inspection itself, not only to the vehicle', () => {
    const m = assignmentMail({ name: 'Ines', items: [item(3)], settingsUrl: 'http://app.test/account', listUrl: 'http://app.test/workshop' });
    expect(m.text).toContain('Open the inspection: http://app.test/inspections/503');
    expect(m.html).toContain('href="http://app.test/inspections/503"');
    expect(m.html.indexOf('inspections/503')).toBeLessThan(m.html.indexOf('vehicles/3'));
  });

  it('when a digest section is long, then it lists the first entries and counts the rest with a link to the app', () => {
    const entries = Array.from({ length: MAX_LISTED + 4 }, (_, k) => ({ key: `i${k}`, title: `CV-${k}`, lines: ['due today'], link: `http://app.test/vehicles/${k}` }));
    const m = digestMail({ name: 'Maren', asOf: '2026-12-01', sections: [{ heading: 'Inspections now due or overdue', entries }], homeUrl: 'http://app.test/', settingsUrl: 'http://app.test/account' });
    expect(m.subject).toBe(`Reboundry digest for 2026-12-01: ${MAX_LISTED + 4} new items`);
    expect(m.text).toContain(`== Inspections now due or overdue (${MAX_LISTED + 4}) ==`);
    expect(m.text.match(/^- CV-/gm)).toHaveLength(MAX_LISTED);
    expect(m.text).toContain('…and 4 more, all in the app: http://app.test/');
  });
});
