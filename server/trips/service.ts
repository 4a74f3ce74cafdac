/**
 * Trips: manual entry and CSV import with a row-by-row report, all-or-nothing.
 *
 * Trip CSV layout (UTF-8, comma-separated, one trip per row, header row required, columns in
 * any order):
 *
 *     vehicle,route,driver_email,start,end,distance_km,mean_speed_kmh,payload_kg
 *     CV-101,Tanner Way town loop,driver@reboundry.test,2026-11-02T07:30:00Z,2026-11-02T08:05:00Z,14.1,31.5,420
 *
 * - vehicle: fleet number; route: route name (as in the app); driver_email: the driver's sign-in
 *   e-mail (may be empty);
 * - start, end: ISO 8601 date-times; without an offset they are read as UTC;
 * - distance_km [km], mean_speed_kmh [km/h] (moving average), payload_kg [kg] (optional column,
 *   may be empty).
 */
import { createHash } from 'node:crypto';
import type { Transaction } from 'sequelize';
import { AppError } from '../errors';
import { parseIsoDateTime } from '../http/validate';
import { CsvSyntaxError, readCsv, type CsvRow } from '../lib/csv';
import { tripsRepository, type TripInput } from './repository';

export const TRIP_COLUMNS = ['vehicle', 'route', 'driver_email', 'start', 'end', 'distance_km', 'mean_speed_kmh', 'payload_kg'] as const;
const REQUIRED = TRIP_COLUMNS.filter((c) => c !== 'payload_kg');
export const MAX_TRIP_ROWS = 10_000;
export const MAX_TRIP_BYTES = 5 * 1024 * 1024;
/** Highest believable mean speed of a fleet vehicle [km/h] (common practice: above any legal limit here). */
export const MAX_SPEED_KMH = 130;
const MAX_TRIP_HOURS = 24;

export interface ReportRow {
  row: number;
  ok: boolean;
  problems: string[];
  trip: {
    fleetNumber: string;
    routeName: string;
    driverEmail: string | null;
    startedAt: string | null;
    endedAt: string | null;
    distanceKm: number | null;
    meanSpeedKmh: number | null;
    payloadKg: number | null;
  };
}

interface Candidate {
  row: number;
  problems: string[];
  vehicleId: number | null;
  routeId: number | null;
  driverId: number | null;
  startedAt: Date | null;
  endedAt: Date | null;
  distanceKm: number | null;
  meanSpeedKmh: number | null;
  payloadKg: number | null;
  label: string;
}

const parseDateTime = parseIsoDateTime;

const NUM = /^[+-]?(\d+(\.\d*)?|\.\d+)$/;

const fmtH = (h: number) => `${Math.floor(h)} h ${Math.round((h % 1) * 60)} min`;

/** Checks the candidates against each other, the stored trips and plain physics; fills `problems`. */
async function checkCandidates(cands: Candidate[], now: Date) {
  for (const c of cands) {
    if (c.startedAt && c.endedAt) {
      const hours = (c.endedAt.getTime() - c.startedAt.getTime()) / 3_600_000;
      if (hours <= 0) c.problems.push('end must be after start');
      else if (hours > MAX_TRIP_HOURS) c.problems.push(`the trip lasts ${fmtH(hours)}; at most ${MAX_TRIP_HOURS} h`);
      if (c.startedAt > now) c.problems.push('start is in the future');
      if (hours > 0 && c.distanceKm !== null && c.distanceKm > 0) {
        const implied = c.distanceKm / hours;
        if (implied > MAX_SPEED_KMH) c.problems.push(`impossible speed: ${c.distanceKm} km in ${fmtH(hours)} is ${implied.toFixed(0)} km/h (over ${MAX_SPEED_KMH} km/h)`);
        else if (c.meanSpeedKmh !== null && c.meanSpeedKmh > 0 && c.meanSpeedKmh < implied * 0.95) {
          c.problems.push(`impossible speed: a mean speed of ${c.meanSpeedKmh} km/h cannot cover ${c.distanceKm} km in ${fmtH(hours)} (needs at least ${implied.toFixed(1)} km/h)`);
        }
      }
    }
  }
  await storedOverlaps(cands);
  // Overlaps within the file, compared only within one vehicle's or one driver's rows (a
  // 10 000-row file would otherwise take 50 million comparisons). Intervals are half-open:
  // a trip that ends as the next starts does not overlap it.
  const timed = timedOf(cands);
  const found = new Map<Candidate, { j: number; text: string }[]>();
  const note = (b: Candidate, j: number, text: string) => {
    if (!found.has(b)) found.set(b, []);
    found.get(b)!.push({ j, text });
  };
  // each overlapping pair (a earlier in the file than b), found by a sweep over the group sorted
  // by start: O(n log n) plus the overlaps, yielding to other requests between groups
  const pairs = async (key: (c: Candidate) => number | null, each: (a: Candidate, b: Candidate) => void) => {
    for (const group of groupBy(timed, key).values()) {
      const sorted = [...group].sort((x, y) => x.startedAt!.getTime() - y.startedAt!.getTime() || x.row - y.row);
      let active: Candidate[] = [];
      for (const c of sorted) {
        active = active.filter((a) => a.endedAt! > c.startedAt!);
        for (const a of active) {
          // a starts at or before c and ends after c starts: they overlap (c has positive length)
          if (a.row < c.row) each(a, c);
          else each(c, a);
        }
        active.push(c);
      }
      await new Promise((resolve) => setImmediate(resolve));
    }
  };
  await pairs((c) => c.vehicleId, (a, b) => note(b, a.row, `overlaps row ${a.row} (same vehicle)`));
  await pairs((c) => c.driverId, (a, b) => {
    if (a.vehicleId === null || a.vehicleId !== b.vehicleId) note(b, a.row, `overlaps row ${a.row} (same driver)`);
  });
  for (const [b, list] of found) for (const p of list.sort((x, y) => x.j - y.j)) b.problems.push(p.text);
}

const timedOf = (cands: Candidate[]) => cands.filter((c) => c.startedAt && c.endedAt && c.endedAt > c.startedAt);

/** Rows grouped by a non-null key, in file order. */
function groupBy(rows: Candidate[], key: (c: Candidate) => number | null) {
  const m = new Map<number, Candidate[]>();
  for (const c of rows) {
    const k = key(c);
    if (k === null) continue;
    if (!m.has(k)) m.set(k, []);
    m.get(k)!.push(c);
  }
  return m;
}

/**
 * Adds a problem to each candidate that overlaps a stored trip of the same vehicle or driver.
 * Run again inside the writing transaction (IMMEDIATE, so no other writer can add a trip between
 * this check and the insert): two concurrent submits of one trip cannot both be stored.
 */
async function storedOverlaps(cands: Candidate[], transaction?: Transaction) {
  const timed = timedOf(cands);
  if (!timed.length) return 0;
  let from = Infinity;
  let to = -Infinity;
  for (const c of timed) {
    from = Math.min(from, c.startedAt!.getTime());
    to = Math.max(to, c.endedAt!.getTime());
  }
  const vehicleIds = [...new Set(timed.map((c) => c.vehicleId).filter((x): x is number => x !== null))];
  const driverIds = [...new Set(timed.map((c) => c.driverId).filter((x): x is number => x !== null))];
  const stored = await tripsRepository.overlapping(vehicleIds, driverIds, new Date(from), new Date(to), transaction);
  const byVehicle = new Map<number, typeof stored>();
  const byDriver = new Map<number, typeof stored>();
  for (const t of stored) {
    if (!byVehicle.has(t.vehicleId)) byVehicle.set(t.vehicleId, []);
    byVehicle.get(t.vehicleId)!.push(t);
    if (t.driverId !== null) {
      if (!byDriver.has(t.driverId)) byDriver.set(t.driverId, []);
      byDriver.get(t.driverId)!.push(t);
    }
  }
  const fmt = (d: Date) => d.toISOString().slice(0, 16).replace('T', ' ');
  let n = 0;
  for (const c of timed) {
    const near = new Set([...(c.vehicleId !== null ? (byVehicle.get(c.vehicleId) ?? []) : []), ...(c.driverId !== null ? (byDriver.get(c.driverId) ?? []) : [])]);
    for (const t of [...near].sort((a, b) => a.id - b.id)) {
      if (t.startedAt < c.endedAt! && t.endedAt > c.startedAt!) {
        if (t.vehicleId === c.vehicleId) c.problems.push(`overlaps trip #${t.id} of the same vehicle (${fmt(t.startedAt)}–${fmt(t.endedAt)} UTC)`);
        else if (c.driverId !== null && t.driverId === c.driverId) c.problems.push(`overlaps trip #${t.id} of the same driver (${fmt(t.startedAt)}–${fmt(t.endedAt)} UTC)`);
        else continue;
        n++;
      }
    }
  }
  return n;
}

function toInput(c: Candidate): TripInput {
  return {
    vehicleId: c.vehicleId!,
    routeId: c.routeId!,
    driverId: c.driverId,
    startedAt: c.startedAt!,
    endedAt: c.endedAt!,
    distanceKm: c.distanceKm!,
    meanSpeedKmh: c.meanSpeedKmh!,
    payloadKg: c.payloadKg,
  };
}

export const tripsService = {
  /** Reads a trip CSV and checks every row; never writes. */
  async checkCsv(text: string, now: Date): Promise<{ rows: ReportRow[]; candidates: Candidate[] }> {
    let rowsIn: CsvRow[];
    try {
      rowsIn = readCsv(text);
    } catch (e) {
      if (e instanceof CsvSyntaxError) throw AppError.badRequest('The trip file is not valid CSV.', { [e.line !== null ? `row ${e.line}` : 'file']: e.message });
      throw e;
    }
    let header: string[] | null = null;
    let headerRow = 0;
    const cands: Candidate[] = [];
    const rows: ReportRow[] = [];
    const lk = await tripsRepository.lookups();
    const vehicles = new Map(lk.vehicles.map((v) => [v.fleetNumber.toLowerCase(), v]));
    const routes = new Map(lk.routes.map((r) => [r.name.toLowerCase(), r]));
    const users = new Map(lk.users.map((u) => [u.email.toLowerCase(), u]));
    for (let i = 0; i < rowsIn.length; i++) {
      // let other requests in every 500 rows of a large file
      if (i % 500 === 499) await new Promise((resolve) => setImmediate(resolve));
      const { line: lineNo, cells: cols } = rowsIn[i];
      if (!header) {
        header = cols.map((c) => c.toLowerCase());
        headerRow = lineNo;
        const missing = REQUIRED.filter((c) => !header!.includes(c));
        const unknown = header.filter((c) => !(TRIP_COLUMNS as readonly string[]).includes(c));
        if (missing.length || unknown.length) {
          throw AppError.badRequest(`The trip file's header is not right (row ${lineNo}).`, {
            [`row ${lineNo}`]: [missing.length ? `missing column(s): ${missing.join(', ')}` : '', unknown.length ? `unknown column(s): ${unknown.join(', ')}` : '', `expected: ${TRIP_COLUMNS.join(',')}`].filter(Boolean).join('; '),
          });
        }
        continue;
      }
      if (cands.length >= MAX_TRIP_ROWS) throw AppError.badRequest(`The file has more than ${MAX_TRIP_ROWS} trips.`, { [`row ${lineNo}`]: `more than ${MAX_TRIP_ROWS} trips in one file; split it` });
      const get = (name: string) => {
        const k = header!.indexOf(name);
        return k >= 0 ? (cols[k] ?? '') : '';
      };
      const problems: string[] = [];
      if (cols.length !== header.length) problems.push(`has ${cols.length} columns; the header has ${header.length}`);
      const fleetNumber = get('vehicle');
      const routeName = get('route');
      const email = get('driver_email');
      const v = vehicles.get(fleetNumber.toLowerCase());
      if (!fleetNumber) problems.push('vehicle is empty');
      else if (!v) problems.push(`unknown vehicle "${fleetNumber}"`);
      else if (v.status === 'retired') problems.push(`vehicle ${v.fleetNumber} is retired`);
      const r = routes.get(routeName.toLowerCase());
      if (!routeName) problems.push('route is empty');
      else if (!r) problems.push(`unknown route "${routeName}"`);
      let driverId: number | null = null;
      if (email) {
        const u = users.get(email.toLowerCase());
        if (!u || u.role !== 'driver') problems.push(`unknown driver "${email}"`);
        else if (!u.active) problems.push(`driver ${email} is deactivated`);
        else driverId = u.id;
      }
      const startedAt = parseDateTime(get('start'));
      if (!startedAt) problems.push(`start "${get('start')}" is not a real ISO 8601 date-time (e.g. 2026-11-02T07:30:00Z)`);
      const endedAt = parseDateTime(get('end'));
      if (!endedAt) problems.push(`end "${get('end')}" is not a real ISO 8601 date-time`);
      const numOf = (name: string, unit: string, min: number, max: number, optional = false): number | null => {
        const s = get(name);
        if (!s && optional) return null;
        if (!NUM.test(s)) {
          problems.push(`${name} "${s}" is not a number in ${unit}`);
          return null;
        }
        const x = Number(s);
        if (x < min || x > max) {
          problems.push(name === 'mean_speed_kmh' ? `impossible speed: mean_speed_kmh ${x} km/h is outside ${min}–${max} km/h` : `${name} ${x} ${unit} is outside ${min}–${max} ${unit}`);
          return null;
        }
        return x;
      };
      const distanceKm = numOf('distance_km', 'km', 0.1, 2000);
      const meanSpeedKmh = numOf('mean_speed_kmh', 'km/h', 1, MAX_SPEED_KMH);
      const payloadKg = numOf('payload_kg', 'kg', 0, 40_000, true);
      const cand: Candidate = {
        row: lineNo,
        problems,
        vehicleId: v && v.status !== 'retired' ? v.id : null,
        routeId: r?.id ?? null,
        driverId,
        startedAt,
        endedAt,
        distanceKm,
        meanSpeedKmh,
        payloadKg,
        label: fleetNumber,
      };
      cands.push(cand);
      rows.push({
        row: lineNo,
        ok: true,
        problems,
        trip: {
          fleetNumber: v?.fleetNumber ?? fleetNumber,
          routeName: r?.name ?? routeName,
          driverEmail: email || null,
          startedAt: startedAt?.toISOString() ?? null,
          endedAt: endedAt?.toISOString() ?? null,
          distanceKm,
          meanSpeedKmh,
          payloadKg,
        },
      });
    }
    if (!header) throw AppError.badRequest('The trip file is empty.', { file: `needs the header ${TRIP_COLUMNS.join(',')} and one row per trip` });
    if (!cands.length) throw AppError.badRequest('The trip file has no trips.', { file: `has a header (row ${headerRow}) but no rows` });
    await checkCandidates(cands, now);
    for (const r of rows) r.ok = r.problems.length === 0;
    return { rows, candidates: cands };
  },

  async importCsv(text: string, originalName: string, userId: number, now: Date) {
    const fileSha256 = createHash('sha256').update(text).digest('hex');
    const refuseRepeat = async (t?: Transaction) => {
      const earlier = await tripsRepository.importByHash(fileSha256, t);
      if (earlier) {
        throw AppError.conflict(`This file was already imported (import #${earlier.id} of ${earlier.importedAt.toISOString().slice(0, 10)}, ${earlier.rowCount} trips); nothing was imported again.`, {
          file: `is the same file as import #${earlier.id}`,
        });
      }
    };
    // first for a clear answer, then again inside the writing transaction for concurrent sends
    await refuseRepeat();
    const { rows, candidates } = await tripsService.checkCsv(text, now);
    const bad = rows.filter((r) => !r.ok);
    if (bad.length) {
      const fields: Record<string, string> = {};
      for (const r of bad.slice(0, 200)) fields[`row ${r.row}`] = r.problems.join('; ');
      throw new AppError(400, 'import_rejected', `${bad.length} of ${rows.length} rows have problems, so nothing was imported. Fix them and import the file again.`, fields);
    }
    const { importId, ids } = await tripsRepository.insert(
      candidates.map(toInput),
      { originalName: originalName.slice(0, 255) || 'trips.csv', importedById: userId, importedAt: now, fileSha256 },
      async (t) => {
        await refuseRepeat(t);
        if (await storedOverlaps(candidates, t)) {
          const fields: Record<string, string> = {};
          for (const c of candidates.filter((x) => x.problems.length).slice(0, 200)) fields[`row ${c.row}`] = c.problems.join('; ');
          throw new AppError(400, 'import_rejected', 'Trips were stored meanwhile that overlap rows of this file, so nothing was imported. Check the rows named and import again.', fields);
        }
      },
    );
    return { importId, imported: ids.length, rows };
  },

  async createOne(
    t: { vehicleId: number; routeId: number; driverId: number | null; startedAt: string; endedAt: string; distanceKm: number; meanSpeedKmh: number; payloadKg: number | null },
    now: Date,
  ) {
    const lk = await tripsRepository.lookups();
    const fields: Record<string, string> = {};
    const v = lk.vehicles.find((x) => x.id === t.vehicleId);
    if (!v) fields.vehicleId = `unknown vehicle id ${t.vehicleId}`;
    else if (v.status === 'retired') fields.vehicleId = `vehicle ${v.fleetNumber} is retired`;
    if (!lk.routes.some((x) => x.id === t.routeId)) fields.routeId = `unknown route id ${t.routeId}`;
    if (t.driverId !== null) {
      const u = lk.users.find((x) => x.id === t.driverId);
      if (!u || u.role !== 'driver') fields.driverId = `unknown driver id ${t.driverId}`;
      else if (!u.active) fields.driverId = `${u.name}'s account is deactivated`;
    }
    const startedAt = parseDateTime(t.startedAt);
    const endedAt = parseDateTime(t.endedAt);
    if (!startedAt) fields.startedAt = 'must be a real ISO 8601 date-time (e.g. 2026-11-02T07:30:00Z)';
    if (!endedAt) fields.endedAt = 'must be a real ISO 8601 date-time (e.g. 2026-11-02T07:30:00Z)';
    if (Object.keys(fields).length) throw AppError.badRequest('Some values are not valid.', fields);
    const cand: Candidate = { row: 1, problems: [], vehicleId: t.vehicleId, routeId: t.routeId, driverId: t.driverId, startedAt, endedAt, distanceKm: t.distanceKm, meanSpeedKmh: t.meanSpeedKmh, payloadKg: t.payloadKg, label: '' };
    await checkCandidates([cand], now);
    if (cand.problems.length) {
      const f: Record<string, string> = {};
      for (const p of cand.problems) {
        const key = p.includes('speed') ? 'meanSpeedKmh' : p.startsWith('end') || p.includes('lasts') ? 'endedAt' : p.includes('overlaps') || p.includes('start') ? 'startedAt' : '_';
        f[key] = f[key] ? `${f[key]}; ${p}` : p;
      }
      throw AppError.badRequest('The trip was not saved.', f);
    }
    const { ids } = await tripsRepository.insert([toInput(cand)], null, async (tx) => {
      if (await storedOverlaps([cand], tx)) throw AppError.badRequest('The trip was not saved.', { startedAt: cand.problems.join('; ') });
    });
    return ids[0];
  },
};
