import { describe, expect, it } from 'vitest';
import { assignmentMail, CAUTION_TEXT, digestMail, esc, MAX_LISTED } from '../../server/mail/templates';

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

/** The links every assignment note carries: the mechanic's settings and their list of inspections. */
const noteLinks = { settingsUrl: 'http://app.test/account', listUrl: 'http://app.test/workshop' };

/** How every assignment note ends: in its plain text, and as a reader sees its HTML. */
const NOTE_END_TEXT = ['', CAUTION_TEXT, '', 'Turn these notes off in your account settings: http://app.test/account'];
const NOTE_END_SEEN = ['Turn these notes off in your account settings.', CAUTION_TEXT];

/** Maren's digest of 1 Dec 2026 with these sections. */
const digestOf = (sections: Parameters<typeof digestMail>[0]['sections']) =>
  digestMail({ name: 'Maren', asOf: '2026-12-01', sections, homeUrl: 'http://app.test/', settingsUrl: 'http://app.test/account' });

/** A digest section of `n` vehicles due, each entry with these lines. */
const dueSection = (n: number, lines: string[] = []) => ({
  heading: 'Inspections now due or overdue',
  entries: Array.from({ length: n }, (_, k) => ({ key: `i${k}`, title: `CV-${k}`, lines, link: `http://app.test/vehicles/${k}` })),
});

/** What a reader of an HTML body sees: tags dropped, entities decoded, a line per paragraph, heading, list item or line break. */
const seen = (html: string) =>
  html
    .replace(/<br>|<\/(p|h1|h2|li)>/g, '\n')
    .replace(/<[^>]+>/g, '')
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>')
    .replace(/&quot;/g, '"')
    .replace(/&amp;/g, '&')
    .split('\n')
    .map((l) => l.trim())
    .filter(Boolean);

/** Each link of an HTML body as [address, words], the address decoded. */
const links = (html: string) => [...html.matchAll(/<a href="([^"]*)"[^>]*>(.*?)<\/a>/g)].map((m) => [m[1].replace(/&quot;/g, '"').replace(/&amp;/g, '&'), m[2]]);

/** Whether every element opened in an HTML body is closed, in order (line breaks have no end tag). */
const wellFormed = (html: string) => {
  const open: string[] = [];
  for (const [, close, name] of html.matchAll(/<(\/?)([a-z0-9]+)[^>]*>/gi)) {
    if (name === 'br') continue;
    if (!close) open.push(name);
    else if (open.pop() !== name) return false;
  }
  return open.length === 0 && html.startsWith('<!doctype html>');
};

describe('e-mail bodies', () => {
  it('when a mechanic is assigned more inspections than a note lists, then the most urgent are listed and the rest counted with a link to all of them', () => {
    const n = MAX_LISTED + 15;
    const m = assignmentMail({ name: 'Tomasz', items: Array.from({ length: n }, (_, k) => item(k)), ...noteLinks });
    expect(m.subject).toBe(`${n} inspections assigned to you, first due 1 Dec 2026`);
    expect(m.text.match(/^- CV-/gm)).toHaveLength(MAX_LISTED);
    expect(m.text).toContain(`…and 15 more, all in My inspections: http://app.test/workshop`);
    expect(m.html.match(/<li /g)).toHaveLength(MAX_LISTED);
    expect(m.html).toContain('href="http://app.test/workshop"');
    // the listed ones are the earliest due
    const listed = [...m.text.matchAll(/due (\d+) Dec 2026/g)].map((x) => Number(x[1]));
    expect(listed).toHaveLength(MAX_LISTED);
    expect(listed.every((d) => d <= 28)).toBe(true);
    expect([...listed].sort((a, b) => a - b)).toEqual(listed);
  });

  it('when a note has few inspections, then all are listed and no "more" line appears', () => {
    const m = assignmentMail({ name: 'Ines', items: [item(1), item(2)], ...noteLinks });
    expect(m.text.match(/^- CV-/gm)).toHaveLength(2);
    expect(m.text).not.toMatch(/more, all in/);
  });

  it('when a mechanic is assigned an inspection, then the note links to that inspection itself, not only to the vehicle', () => {
    const m = assignmentMail({ name: 'Ines', items: [item(3)], ...noteLinks });
    expect(m.text).toContain('Open the inspection: http://app.test/inspections/503');
    expect(m.html).toContain('href="http://app.test/inspections/503"');
    expect(m.html.indexOf('inspections/503')).toBeLessThan(m.html.indexOf('vehicles/3'));
  });

  it('when a digest section is long, then it lists the first entries and counts the rest with a link to the app', () => {
    const m = digestOf([dueSection(MAX_LISTED + 4, ['due today'])]);
    expect(m.subject).toBe(`Reboundry digest for 1 Dec 2026: ${MAX_LISTED + 4} new items`);
    expect(m.text).toContain(`== Inspections now due or overdue (${MAX_LISTED + 4}) ==`);
    expect(m.text.match(/^- CV-/gm)).toHaveLength(MAX_LISTED);
    expect(m.text).toContain('…and 4 more, all in the app: http://app.test/');
  });
});

describe('the manager\'s digest', () => {
  const sections = [
    { heading: 'Inspections now due or overdue', intro: 'Booked by the scheduling rules.', entries: [{ key: 'i1', title: 'CV-101 (BK1): due 2026-12-01', lines: ['The FL damper reached 80 % of its expected life.', 'Depot North'], link: 'http://app.test/inspections/501' }] },
    {
      heading: 'Rough rides',
      entries: [
        { key: 'r7', title: 'Driver 7', lines: ['2 severe events'], link: 'http://app.test/drivers/7' },
        { key: 'r8', title: 'Driver 8', lines: [], link: 'http://app.test/drivers/8' },
      ],
    },
  ];
  const mail = () => digestOf(sections);

  it('when a digest has a few entries, then the plain text lists each section with its count and intro, each entry with its lines and link, the caution and how to turn it off', () => {
    const m = mail();
    expect(m.subject).toBe('Reboundry digest for 1 Dec 2026: 3 new items');
    expect(m.text).toBe(
      [
        'Hello Maren,',
        '',
        'New since your last digest (as of 1 Dec 2026):',
        '',
        '== Inspections now due or overdue (1) ==',
        'Booked by the scheduling rules.',
        '- CV-101 (BK1): due 2026-12-01',
        '  The FL damper reached 80 % of its expected life.',
        '  Depot North',
        '  http://app.test/inspections/501',
        '',
        '== Rough rides (2) ==',
        '- Driver 7',
        '  2 severe events',
        '  http://app.test/drivers/7',
        '',
        '- Driver 8',
        '  http://app.test/drivers/8',
        '',
        'Due inspections: http://app.test/',
        '',
        CAUTION_TEXT,
        '',
        'Turn this e-mail off in your account settings: http://app.test/account',
      ].join('\n'),
    );
  });

  it('when a digest has a few entries, then the HTML shows the same, each entry\'s title a link to it, and ends with the caution', () => {
    const m = mail();
    expect(wellFormed(m.html)).toBe(true);
    expect(seen(m.html)).toEqual([
      'Reboundry',
      'Digest for 1 Dec 2026',
      'Hello Maren,',
      'New since your last digest (as of 1 Dec 2026):',
      'Inspections now due or overdue (1)',
      'Booked by the scheduling rules.',
      'CV-101 (BK1): due 2026-12-01',
      'The FL damper reached 80 % of its expected life.',
      'Depot North',
      'Rough rides (2)',
      'Driver 7',
      '2 severe events',
      'Driver 8',
      'Open the due inspections',
      'Turn this e-mail off in your account settings.',
      CAUTION_TEXT,
    ]);
    expect(links(m.html)).toEqual([
      ['http://app.test/inspections/501', 'CV-101 (BK1): due 2026-12-01'],
      ['http://app.test/drivers/7', 'Driver 7'],
      ['http://app.test/drivers/8', 'Driver 8'],
      ['http://app.test/', 'Open the due inspections'],
      ['http://app.test/account', 'account settings'],
    ]);
  });

  it('when a digest has one entry, then the subject says "1 new item"', () => {
    const m = digestOf([{ ...sections[0] }]);
    expect(m.subject).toBe('Reboundry digest for 1 Dec 2026: 1 new item');
  });

  it('when a section has exactly as many entries as are listed, then all are listed and no "more" line appears', () => {
    const m = digestOf([dueSection(MAX_LISTED)]);
    expect(m.text.match(/^- CV-/gm)).toHaveLength(MAX_LISTED);
    expect(m.text).not.toContain('more, all in');
    expect(m.html).not.toContain('more, all');
  });

  it('when a section is long, then the HTML counts the rest with a link to the app, and the text leaves a blank line after the count', () => {
    const m = digestOf([dueSection(MAX_LISTED + 4)]);
    expect(m.text).toContain('…and 4 more, all in the app: http://app.test/\n\nDue inspections: http://app.test/');
    expect(wellFormed(m.html)).toBe(true);
    expect(seen(m.html)).toContain('…and 4 more, all in the app.');
    expect(links(m.html)).toContainEqual(['http://app.test/', 'in the app']);
    expect(m.html.match(/<li /g)).toHaveLength(MAX_LISTED);
  });

  it('when names, titles, lines or links hold &, <, > or quotes, then the HTML shows them as written and they cannot break its markup', () => {
    const m = digestMail({
      name: 'Maren & <Co>',
      asOf: '2026-12-01',
      sections: [{ heading: 'Depot "North" & <South>', intro: 'Fish & <chips>', entries: [{ key: 'x', title: 'CV-1 <front>', lines: ['a "quoted" note & more'], link: 'http://app.test/vehicles/1?a=1&b="2"' }] }],
      homeUrl: 'http://app.test/?x=1&y=2',
      settingsUrl: 'http://app.test/account',
    });
    expect(wellFormed(m.html)).toBe(true);
    expect(seen(m.html)).toEqual(
      expect.arrayContaining(['Hello Maren & <Co>,', 'Depot "North" & <South> (1)', 'Fish & <chips>', 'CV-1 <front>', 'a "quoted" note & more']),
    );
    expect(links(m.html)[0]).toEqual(['http://app.test/vehicles/1?a=1&b="2"', 'CV-1 &lt;front&gt;']);
    // the plain text is not HTML: written as is
    expect(m.text).toContain('Hello Maren & <Co>,');
    expect(esc('R&D <b>"x"</b>')).toBe('R&amp;D &lt;b&gt;&quot;x&quot;&lt;/b&gt;');
  });
});

describe('the mechanic\'s assignment note', () => {
  it('when one inspection is assigned, then the note names its vehicle in the subject and says why it is due, with links to the inspection and the vehicle', () => {
    const m = assignmentMail({ name: 'Ines', items: [item(3)], ...noteLinks });
    expect(m.subject).toBe('Inspection of CV-103 assigned to you, due 4 Dec 2026');
    expect(m.text).toBe(
      [
        'Hello Ines,',
        '',
        'The damper and spring inspection of CV-103 is assigned to you.',
        '',
        '- CV-103 (BK3, North): due 4 Dec 2026 (scheduled)',
        '  Why: reason 3',
        '  Open the inspection: http://app.test/inspections/503',
        '  The vehicle: http://app.test/vehicles/3',
        ...NOTE_END_TEXT,
      ].join('\n'),
    );
    expect(wellFormed(m.html)).toBe(true);
    expect(seen(m.html)).toEqual([
      'Reboundry',
      'Inspection of CV-103 assigned to you',
      'Hello Ines,',
      'This damper and spring inspection is assigned to you:',
      'Inspection of CV-103 (BK3, North): due 4 Dec 2026 (scheduled)',
      'Why: reason 3',
      'The vehicle',
      ...NOTE_END_SEEN,
    ]);
    expect(links(m.html)).toEqual([
      ['http://app.test/inspections/503', 'Inspection of CV-103'],
      ['http://app.test/vehicles/3', 'The vehicle'],
      ['http://app.test/account', 'account settings'],
    ]);
  });

  it('when a few inspections are assigned, then the note counts them, lists each and has no "more" line', () => {
    const m = assignmentMail({ name: 'Ines', items: [item(2), { ...item(1), status: 'overdue' }], ...noteLinks });
    expect(m.subject).toBe('2 inspections assigned to you, first due 2 Dec 2026');
    expect(m.text).toBe(
      [
        'Hello Ines,',
        '',
        '2 damper and spring inspections are assigned to you:',
        '',
        '- CV-101 (BK1, North): due 2 Dec 2026 (overdue)',
        '  Why: reason 1',
        '  Open the inspection: http://app.test/inspections/501',
        '  The vehicle: http://app.test/vehicles/1',
        '',
        '- CV-102 (BK2, North): due 3 Dec 2026 (scheduled)',
        '  Why: reason 2',
        '  Open the inspection: http://app.test/inspections/502',
        '  The vehicle: http://app.test/vehicles/2',
        ...NOTE_END_TEXT,
      ].join('\n'),
    );
    expect(wellFormed(m.html)).toBe(true);
    expect(seen(m.html)).toEqual([
      'Reboundry',
      '2 inspections assigned to you',
      'Hello Ines,',
      '2 damper and spring inspections are assigned to you:',
      'Inspection of CV-101 (BK1, North): due 2 Dec 2026 (overdue)',
      'Why: reason 1',
      'The vehicle',
      'Inspection of CV-102 (BK2, North): due 3 Dec 2026 (scheduled)',
      'Why: reason 2',
      'The vehicle',
      ...NOTE_END_SEEN,
    ]);
  });

  it('when more inspections are assigned than a note lists, then the count says how many of them are listed, in the text and the HTML', () => {
    const m = assignmentMail({ name: 'Tomasz', items: Array.from({ length: MAX_LISTED + 15 }, (_, k) => item(k)), ...noteLinks });
    expect(m.text).toContain(`\n${MAX_LISTED + 15} damper and spring inspections are assigned to you; the ${MAX_LISTED} due first:\n`);
    expect(m.text).toContain('…and 15 more, all in My inspections: http://app.test/workshop\n\n' + CAUTION_TEXT);
    expect(wellFormed(m.html)).toBe(true);
    const html = seen(m.html);
    expect(html).toContain(`${MAX_LISTED + 15} damper and spring inspections are assigned to you; the ${MAX_LISTED} due first:`);
    expect(html).toContain('…and 15 more, all in My inspections.');
    expect(links(m.html)).toContainEqual(['http://app.test/workshop', 'My inspections']);
  });

  it('when exactly as many inspections are assigned as a note lists, then all are listed with no "due first" and no "more"', () => {
    const m = assignmentMail({ name: 'Tomasz', items: Array.from({ length: MAX_LISTED }, (_, k) => item(k)), ...noteLinks });
    expect(m.text).toContain(`\n${MAX_LISTED} damper and spring inspections are assigned to you:\n`);
    expect(m.text).not.toMatch(/due first|more, all in/);
    expect(seen(m.html)).toContain(`${MAX_LISTED} damper and spring inspections are assigned to you:`);
    expect(m.html).not.toMatch(/due first|more, all in/);
  });

  it('when inspections are due the same day, then they are listed by fleet number; earlier due dates come first', () => {
    const at = (fleetNumber: string, dueDate: string) => ({ ...item(1), fleetNumber, dueDate });
    const items = [at('CV-200', '2026-12-05'), at('CV-100', '2026-12-09'), at('CV-300', '2026-12-05'), at('CV-150', '2026-12-05'), at('CV-050', '2026-12-09')];
    const order = ['CV-150 5 Dec 2026', 'CV-200 5 Dec 2026', 'CV-300 5 Dec 2026', 'CV-050 9 Dec 2026', 'CV-100 9 Dec 2026'];
    for (const given of [items, [...items].reverse()]) {
      const m = assignmentMail({ name: 'Ines', items: given, ...noteLinks });
      expect([...m.text.matchAll(/^- (CV-\d+) \(.*\): due (\d+ \w+ \d{4})/gm)].map((x) => `${x[1]} ${x[2]}`)).toEqual(order);
      expect(m.subject).toBe('5 inspections assigned to you, first due 5 Dec 2026');
    }
  });

  it('when an inspection\'s status has no word of its own in the app, then the note shows it as stored', () => {
    const m = assignmentMail({ name: 'Ines', items: [{ ...item(3), status: 'in_review' }], ...noteLinks });
    expect(m.text).toContain('due 4 Dec 2026 (in_review)');
    expect(seen(m.html)).toContain('Inspection of CV-103 (BK3, North): due 4 Dec 2026 (in_review)');
  });
});
