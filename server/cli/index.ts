/**
 * Command-line interface of the physics engine (the only file in `server/physics/` that does
 * I/O). Prints one JSON object to stdout; errors go to stderr with a non-zero exit code
 * (2 for usage errors, 1 for invalid data).
 *
 * Usage: `npm run --silent cli -- <command> [args]`
 * - `iri <profile.csv> [--segment-m 100]`
 * - `rainflow <series.csv>`
 * - `duty --spec <file.json> (--class C | --gd <m³>) --speed-kmh <v> [--method closed-form|time] [--distance-km <d>] [--seed <n>]`
 * - `duty --spec <file.json> --profile <profile.csv> --speed-kmh <v>` (the nightly job's measured-segment path)
 * - `modes --spec <file.json>`
 * - `adhesion --spec <file.json> [--amplitude-mm a]`
 * - `damping-from-adhesion --spec <file.json> --adhesion <pct> [--amplitude-mm a]`
 * - `phase-shift --spec <file.json> [--amplitude-mm a]`
 * - `damping-from-phase --spec <file.json> --phase-deg <φ>`
 * - `exposure --trips <file.json>`
 * - `roughness (--iri <m/km> | --gd <m³>) [--dx-m <interval>]`
 *
 * @module
 */
import { readFileSync } from 'node:fs';
import { parseArgs } from 'node:util';
import { pathToFileURL } from 'node:url';
import { gdFromIri, iri, iriFromGd, iriSegments, IRI_CONVERSION_DX_M } from '../physics/iri';
import { rainflow } from '../physics/fatigue';
import { prepareDuty, dutyOnRoad, ROAD_BAND, type DutyResult } from '../physics/closed-form';
import { classifyGd, gdForClass, synthesizeProfile } from '../physics/iso8608';
import { simulateProfile } from '../physics/simulate';
import { modes } from '../physics/quarter-car';
import { adhesionPct, dampingFromAdhesion, DEFAULT_PLATE_AMPLITUDE_M } from '../physics/adhesion';
import { dampingFromPhase, phaseShift } from '../physics/phase-shift';
import { dailyA8, exposureStatus, EXPOSURE_ACTION_VALUE, EXPOSURE_LIMIT_VALUE, type ExposureTrip } from '../physics/exposure';
import { PhysicsInputError, validateCorner, validateSpeed, type CornerParams } from '../physics/types';
import { weibullCommand } from './weibull';
import { lifeCommand, lifeFitCommand } from './life';
import { DutyCache, springSnCurve, type SegmentInput } from '../wear/duty';

/** A usage error (wrong command or flags): exit code 2. */
export class CliUsageError extends Error {
  /**
   * @param message what is wrong with the command line
   */
  constructor(message: string) {
    super(message);
    this.name = 'CliUsageError';
  }
}

const USAGE = `usage: cli <command> [args]
  iri <profile.csv> [--segment-m 100]
  rainflow <series.csv>
  duty --spec <file.json> (--class C | --gd <m3>) --speed-kmh <v> [--method closed-form|time] [--distance-km <d>] [--seed <n>]
  duty --spec <file.json> --profile <profile.csv> --speed-kmh <v>   (distance_m,elevation_m; even spacing up to 0.3 m)
  modes --spec <file.json>
  adhesion --spec <file.json> [--amplitude-mm a, zero-to-peak, default 3]
  damping-from-adhesion --spec <file.json> --adhesion <pct> [--amplitude-mm a]
  phase-shift --spec <file.json> [--amplitude-mm a]   (minimum phase between the resonances)
  damping-from-phase --spec <file.json> --phase-deg <deg>
  exposure --trips <file.json>
  roughness (--iri <m/km> | --gd <m3>) [--dx-m <profile interval, default 0.05>]
  weibull <file.csv>   (columns life, failed: 1 removal, 0 still running)
  life --spec <file.json> --rated-km <km> (--class C | --gd <m3>) --speed-kmh <v> [--model <fit.json>]
  life-fit <dampers.csv> --spec <file.json> --rated-km <km>   (columns damper,km,gd,speed_kmh,failed)`;

function readText(path: string, what: string): string {
  try {
    return readFileSync(path, 'utf8');
  } catch (e) {
    throw new Error(`cannot read ${what} file "${path}": ${(e as Error).message}`);
  }
}

function readJson(path: string, what: string): unknown {
  const text = readText(path, what);
  try {
    return JSON.parse(text);
  } catch (e) {
    throw new PhysicsInputError(what, 'JSON', `file "${path}" is not valid JSON: ${(e as Error).message}`);
  }
}

function num(value: string | undefined, flag: string, unit: string): number {
  if (value === undefined) throw new CliUsageError(`missing --${flag} <${unit}>`);
  const v = Number(value);
  if (value.trim() === '' || !Number.isFinite(v)) throw new PhysicsInputError(flag, unit, `must be a number, got "${value}"`);
  return v;
}

/** Split CSV text into trimmed non-empty rows of cells (comma-separated). */
function csvRows(text: string): string[][] {
  return text
    .split(/\r?\n/)
    .map((l) => l.trim())
    .filter((l) => l.length > 0 && !l.startsWith('#'))
    .map((l) => l.split(',').map((c) => c.trim()));
}

/**
 * Parse an evenly spaced profile CSV (header with `distance_m` and `elevation_mm` or
 * `elevation_m`).
 */
function parseProfileCsv(text: string, path: string): { startM: number; dxM: number; elevationsM: Float64Array } {
  const rows = csvRows(text);
  if (rows.length < 3) throw new PhysicsInputError('profile', 'csv', `"${path}" needs a header and at least 2 rows`);
  const header = rows[0].map((h) => h.toLowerCase());
  const di = header.indexOf('distance_m');
  let ei = header.indexOf('elevation_mm');
  let scale = 0.001;
  if (ei < 0) {
    ei = header.indexOf('elevation_m');
    scale = 1;
  }
  if (di < 0 || ei < 0) {
    throw new PhysicsInputError('profile', 'csv', `"${path}" header must have distance_m and elevation_mm (or elevation_m), got "${rows[0].join(',')}"`);
  }
  const n = rows.length - 1;
  const d = new Float64Array(n);
  const z = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const r = rows[i + 1];
    d[i] = Number(r[di]);
    z[i] = Number(r[ei]) * scale;
    if (r[di] === undefined || r[ei] === undefined || !Number.isFinite(d[i]) || !Number.isFinite(z[i])) {
      throw new PhysicsInputError('profile', 'csv', `line ${i + 2} of "${path}" is not two numbers: "${r.join(',')}"`);
    }
  }
  const dx = (d[n - 1] - d[0]) / (n - 1);
  if (!(dx > 0)) throw new PhysicsInputError('distance_m', 'm', `must increase along "${path}"`);
  for (let i = 1; i < n; i++) {
    if (Math.abs(d[i] - d[i - 1] - dx) > 1e-4 + 1e-3 * dx) {
      throw new PhysicsInputError('distance_m', 'm', `must be evenly spaced (${dx} m); line ${i + 2} of "${path}" is at ${d[i]} after ${d[i - 1]}`);
    }
  }
  return { startM: d[0], dxM: dx, elevationsM: z };
}

/** Parse a series CSV: one number per line, or a header with a `value` column. */
function parseSeriesCsv(text: string, path: string): Float64Array {
  const rows = csvRows(text);
  if (rows.length === 0) throw new PhysicsInputError('series', 'csv', `"${path}" is empty`);
  let col = 0;
  let start = 0;
  if (!Number.isFinite(Number(rows[0][0])) || rows[0][0] === '') {
    col = rows[0].map((h) => h.toLowerCase()).indexOf('value');
    if (col < 0) throw new PhysicsInputError('series', 'csv', `"${path}" has a header without a "value" column: "${rows[0].join(',')}"`);
    start = 1;
  } else if (rows[0].length > 1) {
    throw new PhysicsInputError('series', 'csv', `"${path}": use one number per line, or a header with a "value" column`);
  }
  const out = new Float64Array(rows.length - start);
  for (let i = start; i < rows.length; i++) {
    const v = Number(rows[i][col]);
    if (rows[i][col] === undefined || rows[i][col] === '' || !Number.isFinite(v)) {
      throw new PhysicsInputError('series', 'csv', `line ${i + 1} of "${path}" is not a number: "${rows[i].join(',')}"`);
    }
    out[i - start] = v;
  }
  return out;
}

function readSpec(path: string | undefined): CornerParams {
  if (!path) throw new CliUsageError('missing --spec <file.json>');
  const raw = readJson(path, 'spec') as Record<string, unknown>;
  if (raw === null || typeof raw !== 'object' || Array.isArray(raw)) throw new PhysicsInputError('spec', 'JSON', 'must be an object');
  const c = {
    sprungMassKg: raw.sprungMassKg,
    unsprungMassKg: raw.unsprungMassKg,
    springRateNPerM: raw.springRateNPerM,
    dampingNsPerM: raw.dampingNsPerM,
    tireRateNPerM: raw.tireRateNPerM,
  } as CornerParams;
  return validateCorner(c);
}

type Flags = Record<string, string | boolean | undefined>;

function parse(args: string[], options: Record<string, { type: 'string' }>, positionals: number): { values: Flags; positionals: string[] } {
  let res;
  try {
    res = parseArgs({ args, options, allowPositionals: positionals > 0, strict: true });
  } catch (e) {
    throw new CliUsageError((e as Error).message);
  }
  if (res.positionals.length !== positionals) {
    throw new CliUsageError(`expected ${positionals} positional argument(s), got ${res.positionals.length}`);
  }
  return res as { values: Flags; positionals: string[] };
}

const str = (v: string | boolean | undefined): string | undefined => (typeof v === 'string' ? v : undefined);

/**
 * Duty of a corner over a measured profile by the nightly job's own measured-segment path
 * (server/wear/duty.ts `DutyCache.simulated`: road band, resampling, the quarter car with Wk in
 * the loop), the whole profile as one segment; the same keys as the closed-form `duty`.
 */
function profileDuty(c: CornerParams, p: { startM: number; dxM: number; elevationsM: Float64Array }, speedKmh: number): DutyResult {
  validateSpeed(speedKmh / 3.6);
  if (!(p.dxM <= 0.3 + 1e-9)) throw new PhysicsInputError('distance_m', 'm', `spacing ${p.dxM} m is coarser than the 0.3 m a survey may have`);
  const endM = p.startM + (p.elevationsM.length - 1) * p.dxM;
  const seg: SegmentInput = { id: 0, startM: p.startM, endM, speedKmh, gdN0: null, profile: { surveyId: 0, dxM: p.dxM, startM: p.startM, elevationsM: p.elevationsM } };
  const r = new DutyCache().simulated('cli', c, speedKmh, seg, springSnCurve(c));
  if (!r) throw new PhysicsInputError('profile', 'csv', 'is too short to simulate (fewer than 8 samples)');
  const v = speedKmh / 3.6;
  return {
    rmsBodyAccel: Math.sqrt(r.msBodyAccel),
    rmsWeightedAccel: Math.sqrt(r.msWeightedAccel),
    rmsSuspensionTravel: Math.sqrt(r.msTravel),
    rmsRelativeVelocity: Math.sqrt(r.msRelVel),
    rmsTireLoadRatio: Math.sqrt(r.msTireLoadRatio),
    damperPowerW: (r.energyJPerKm * v) / 1000,
    damperEnergyJPerKm: r.energyJPerKm,
  };
}

/**
 * Run one CLI command and return the JSON-serialisable result.
 *
 * @param argv arguments after the script name (command first)
 * @returns the result object printed as JSON
 * @throws CliUsageError on a bad command line, PhysicsInputError on bad data
 * @example
 * runCommand(['rainflow', 'series.csv']); // → { cycles: [{ range, mean, count }, …] }
 */
export function runCommand(argv: string[]): unknown {
  const [command, ...rest] = argv;
  switch (command) {
    case 'iri': {
      const { values, positionals } = parse(rest, { 'segment-m': { type: 'string' } }, 1);
      const segmentM = values['segment-m'] === undefined ? 100 : num(str(values['segment-m']), 'segment-m', 'm');
      const p = parseProfileCsv(readText(positionals[0], 'profile'), positionals[0]);
      return { iri: iri(p.elevationsM, p.dxM), segments: iriSegments(p.elevationsM, p.dxM, segmentM, { startM: p.startM }) };
    }
    case 'rainflow': {
      const { positionals } = parse(rest, {}, 1);
      return { cycles: rainflow(parseSeriesCsv(readText(positionals[0], 'series'), positionals[0])) };
    }
    case 'duty': {
      const { values } = parse(
        rest,
        {
          spec: { type: 'string' }, class: { type: 'string' }, gd: { type: 'string' }, 'speed-kmh': { type: 'string' },
          method: { type: 'string' }, 'distance-km': { type: 'string' }, seed: { type: 'string' }, profile: { type: 'string' },
        },
        0,
      );
      const c = readSpec(str(values.spec));
      const profilePath = str(values.profile);
      if (profilePath !== undefined) {
        if (values.class !== undefined || values.gd !== undefined || values.method !== undefined) throw new CliUsageError('--profile takes the road from the file: give no --class, --gd or --method');
        const kmh = num(str(values['speed-kmh']), 'speed-kmh', 'km/h');
        return profileDuty(c, parseProfileCsv(readText(profilePath, 'profile'), profilePath), kmh);
      }
      const cls = str(values.class);
      const gdArg = str(values.gd);
      if ((cls === undefined) === (gdArg === undefined)) throw new CliUsageError('give exactly one of --class <A–H> or --gd <m3>');
      const gd = cls !== undefined ? gdForClass(cls) : num(gdArg, 'gd', 'm³');
      const speedMps = num(str(values['speed-kmh']), 'speed-kmh', 'km/h') / 3.6;
      const method = str(values.method) ?? 'closed-form';
      if (method === 'closed-form') return dutyOnRoad(prepareDuty(c, speedMps), gd);
      if (method !== 'time') throw new CliUsageError(`--method must be closed-form or time, got "${method}"`);
      const distanceKm = values['distance-km'] === undefined ? 5 : num(str(values['distance-km']), 'distance-km', 'km');
      if (!(distanceKm >= 0.5 && distanceKm <= 1000)) throw new PhysicsInputError('distance-km', 'km', `must be within 0.5–1000, got ${distanceKm}`);
      const seed = values.seed === undefined ? 1 : num(str(values.seed), 'seed', 'integer');
      // 2 ms time step keeps the road interpolation loss below ~0.5 % at wheel hop
      const dxM = Math.min(0.05, Math.max(0.002, speedMps * 0.002));
      // the same road band as the closed form (closed-form.ts ROAD_BAND)
      const z = synthesizeProfile({ gdN0: gd, lengthM: distanceKm * 1000, dxM, seed, nMaxCyclesPerM: ROAD_BAND.maxCyclesPerM });
      const r = simulateProfile(c, z, dxM, speedMps, { weighted: true, warmupM: Math.min(200, distanceKm * 100) });
      const out: DutyResult = {
        rmsBodyAccel: r.rmsBodyAccel,
        rmsWeightedAccel: r.rmsWeightedAccel,
        rmsSuspensionTravel: r.rmsSuspensionTravel,
        rmsRelativeVelocity: r.rmsRelativeVelocity,
        rmsTireLoadRatio: r.rmsTireLoadRatio,
        damperPowerW: r.damperPowerW,
        damperEnergyJPerKm: r.damperEnergyJPerKm,
      };
      return out;
    }
    case 'modes': {
      const { values } = parse(rest, { spec: { type: 'string' } }, 0);
      return modes(readSpec(str(values.spec)));
    }
    case 'adhesion': {
      const { values } = parse(rest, { spec: { type: 'string' }, 'amplitude-mm': { type: 'string' } }, 0);
      const c = readSpec(str(values.spec));
      const amplitudeM = values['amplitude-mm'] === undefined ? undefined : num(str(values['amplitude-mm']), 'amplitude-mm', 'mm') / 1000;
      return adhesionPct(c, { amplitudeM });
    }
    case 'damping-from-adhesion': {
      const { values } = parse(rest, { spec: { type: 'string' }, adhesion: { type: 'string' }, 'amplitude-mm': { type: 'string' } }, 0);
      const c = readSpec(str(values.spec));
      const pct = num(str(values.adhesion), 'adhesion', '%');
      const amplitudeM = values['amplitude-mm'] === undefined ? undefined : num(str(values['amplitude-mm']), 'amplitude-mm', 'mm') / 1000;
      return dampingFromAdhesion(c, pct, { amplitudeM });
    }
    case 'phase-shift': {
      const { values } = parse(rest, { spec: { type: 'string' }, 'amplitude-mm': { type: 'string' } }, 0);
      const c = readSpec(str(values.spec));
      const amplitudeM = values['amplitude-mm'] === undefined ? DEFAULT_PLATE_AMPLITUDE_M : num(str(values['amplitude-mm']), 'amplitude-mm', 'mm') / 1000;
      // the linear model's phase does not depend on the amplitude; it must still be a plate the wheel stays on
      if (adhesionPct(c, { amplitudeM }).adhesionPct <= 0) {
        throw new PhysicsInputError('amplitude-mm', 'mm', `the wheel leaves the plate at ${amplitudeM * 1000} mm amplitude (0 % adhesion): no phase can be measured`);
      }
      const r = phaseShift(c);
      return { minPhaseDeg: r.minPhaseDeg, atHz: r.atHz };
    }
    case 'damping-from-phase': {
      const { values } = parse(rest, { spec: { type: 'string' }, 'phase-deg': { type: 'string' } }, 0);
      const c = readSpec(str(values.spec));
      return dampingFromPhase(c, num(str(values['phase-deg']), 'phase-deg', '°'));
    }
    case 'exposure': {
      const { values } = parse(rest, { trips: { type: 'string' } }, 0);
      const path = str(values.trips);
      if (!path) throw new CliUsageError('missing --trips <file.json>');
      const trips = readJson(path, 'trips');
      if (!Array.isArray(trips)) throw new PhysicsInputError('trips', 'JSON', 'must be a list of { "weightedAccel", "hours" }');
      const a8 = dailyA8(trips as ExposureTrip[]);
      return { a8, actionValue: EXPOSURE_ACTION_VALUE, limitValue: EXPOSURE_LIMIT_VALUE, status: exposureStatus(a8) };
    }
    case 'roughness': {
      const { values } = parse(rest, { iri: { type: 'string' }, gd: { type: 'string' }, 'dx-m': { type: 'string' } }, 0);
      const iriArg = str(values.iri);
      const gdArg = str(values.gd);
      if ((iriArg === undefined) === (gdArg === undefined)) throw new CliUsageError('give exactly one of --iri <m/km> or --gd <m3>');
      const dxM = values['dx-m'] === undefined ? IRI_CONVERSION_DX_M : num(str(values['dx-m']), 'dx-m', 'm');
      if (iriArg !== undefined) {
        const v = num(iriArg, 'iri', 'm/km');
        const gdN0 = gdFromIri(v, dxM);
        return { iri: v, gdN0, class: classifyGd(gdN0) };
      }
      const gdN0 = num(gdArg, 'gd', 'm³');
      if (!(gdN0 > 0)) throw new PhysicsInputError('gd', 'm³', `must be above 0, got ${gdN0}`);
      return { iri: iriFromGd(gdN0, dxM), gdN0, class: classifyGd(gdN0) };
    }
    case 'weibull': {
      const { positionals } = parse(rest, {}, 1);
      return weibullCommand(readText(positionals[0], 'life data'));
    }
    case 'life': {
      const { values } = parse(
        rest,
        { spec: { type: 'string' }, 'rated-km': { type: 'string' }, class: { type: 'string' }, gd: { type: 'string' }, 'speed-kmh': { type: 'string' }, model: { type: 'string' } },
        0,
      );
      const corner = readSpec(str(values.spec));
      const ratedKm = num(str(values['rated-km']), 'rated-km', 'km');
      if (!(ratedKm > 0)) throw new PhysicsInputError('rated-km', 'km', `must be above 0, got ${ratedKm}`);
      const cls = str(values.class);
      const gdArg = str(values.gd);
      if ((cls === undefined) === (gdArg === undefined)) throw new CliUsageError('give exactly one of --class <A–H> or --gd <m3>');
      const gdN0 = cls !== undefined ? gdForClass(cls) : num(gdArg, 'gd', 'm³');
      const speedKmh = num(str(values['speed-kmh']), 'speed-kmh', 'km/h');
      const modelPath = str(values.model);
      return lifeCommand({ corner, ratedKm, gdN0, speedKmh, model: modelPath === undefined ? undefined : readJson(modelPath, 'model') });
    }
    case 'life-fit': {
      const { values, positionals } = parse(rest, { spec: { type: 'string' }, 'rated-km': { type: 'string' } }, 1);
      const corner = readSpec(str(values.spec));
      const ratedKm = num(str(values['rated-km']), 'rated-km', 'km');
      if (!(ratedKm > 0)) throw new PhysicsInputError('rated-km', 'km', `must be above 0, got ${ratedKm}`);
      return lifeFitCommand(readText(positionals[0], 'dampers'), corner, ratedKm);
    }
    case undefined:
    case '--help':
    case 'help':
      throw new CliUsageError('no command given');
    default:
      throw new CliUsageError(`unknown command "${command}"`);
  }
}

/** Where {@link main} prints: the process's streams, or a test's capture. */
export interface CliOutput {
  stdout: { write(text: string): unknown };
  stderr: { write(text: string): unknown };
}

/**
 * Entry point: run the command in `argv`, print JSON to stdout or the error to stderr.
 * @param argv arguments after the script name
 * @param io the streams to print to (default: the process's own)
 * @returns process exit code (0 ok, 1 invalid data, 2 usage)
 * @example
 * main(['modes', '--spec', 'corner.json']); // → 0, prints {"bodyHz":…}
 */
export function main(argv: string[], io: CliOutput = process): number {
  try {
    const result = runCommand(argv);
    io.stdout.write(`${JSON.stringify(result)}\n`);
    return 0;
  } catch (e) {
    if (e instanceof CliUsageError) {
      io.stderr.write(`error: ${e.message}\n${USAGE}\n`);
      return 2;
    }
    io.stderr.write(`error: ${(e as Error).message}\n`);
    return 1;
  }
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  process.exitCode = main(process.argv.slice(2));
}
