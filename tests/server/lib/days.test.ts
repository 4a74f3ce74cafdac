// Day arithmetic and local days against the IANA time-zone rules (tz database, as shipped in
// Node's ICU). The transition times are those of the tz database: Australia/Sydney leaves
// daylight saving at 03:00 local on 2026-04-05 (UTC+11 → +10); Europe/Berlin at 03:00 local on
// 2026-10-25 (UTC+2 → +1); America/Sao_Paulo started it at local midnight on 2018-11-04, so that
// day began at 01:00 local (03:00 UTC).
import { describe, expect, it } from 'vitest';
import { daysBetween, localDay, plusDays, readableDay, sqlStamp, startOfLocalDay } from '../../../server/lib/days';

describe('calendar days', () => {
  it('adds days across month, year and leap-day ends', () => {
    expect(plusDays('2028-02-28', 1)).toBe('2028-02-29');
    expect(plusDays('2027-02-28', 1)).toBe('2027-03-01');
    expect(plusDays('2026-12-31', 1)).toBe('2027-01-01');
    expect(plusDays('2026-03-01', -1)).toBe('2026-02-28');
    expect(daysBetween('2026-01-01', '2027-01-01')).toBe(365);
    expect(daysBetween('2028-03-01', '2028-02-01')).toBe(-29);
  });

  it('the local day of an instant follows the zone', () => {
    const t = new Date('2026-06-30T23:30:00Z');
    expect(localDay(t, 'UTC')).toBe('2026-06-30');
    expect(localDay(t, 'Europe/London')).toBe('2026-07-01'); // BST, UTC+1
    expect(localDay(t, 'America/Chicago')).toBe('2026-06-30');
  });

  it('a local day starts at its first instant, also on days the clocks change', () => {
    expect(startOfLocalDay('2026-11-30', 'Europe/London').toISOString()).toBe('2026-11-30T00:00:00.000Z');
    expect(startOfLocalDay('2026-10-25', 'Europe/Berlin').toISOString()).toBe('2026-10-24T22:00:00.000Z');
    // midnight of the day daylight saving ends is still on UTC+11
    expect(startOfLocalDay('2026-04-05', 'Australia/Sydney').toISOString()).toBe('2026-04-04T13:00:00.000Z');
    expect(startOfLocalDay('2018-11-04', 'America/Sao_Paulo').toISOString()).toBe('2018-11-04T03:00:00.000Z');
  });

  it('writes instants in the text form Sequelize stores in SQLite', () => {
    expect(sqlStamp(new Date('2026-11-30T12:00:00Z'))).toBe('2026-11-30 12:00:00.000 +00:00');
  });

  it('writes a day as people read it, with no leading zero and the month in letters, first and last months included', () => {
    expect(readableDay('2026-01-05')).toBe('5 Jan 2026');
    expect(readableDay('2026-10-12')).toBe('12 Oct 2026');
    expect(readableDay('2027-12-31')).toBe('31 Dec 2027');
  });
});
