/**
 * Longitudinal road profiles: the CSV layout, its parser (with row-numbered errors), and the
 * store of survey files under DATA_DIR.
 *
 * Profile CSV layout (one profile per file, UTF-8, comma-separated):
 *
 *     distance_m,elevation_m
 *     0.00,0.000000
 *     0.25,0.000412
 *     …
 *
 * - a header row `distance_m,elevation_m`, or `distance_m,elevation_mm` for millimetres (the same
 *   two headers the command line reads; lines starting with `#` and blank lines are skipped);
 * - distance along the route [m], increasing in one even step of at most 0.3 m;
 * - elevation [m] or [mm] as the header says (a relative height; only differences matter).
 *
 * Contract for the nightly job: {@link loadSurveyProfile} reads a stored survey's
 * profile back as `{ dxM, startM, elevationsM }`; a segment whose current roughness comes from a
 * survey has `route_segments.survey_id` set, and its part of the profile is
 * `[segment.startM, segment.endM]` (route distance, the same axis as `startM`).
 */
import fs from 'node:fs';
import path from 'node:path';
import crypto from 'node:crypto';
import { RoadSurvey } from '../db/models';

/** Largest sample interval accepted [m] (ASTM E1926 asks for ≤ 0.25 m; 0.3 m is our limit). */
export const MAX_PROFILE_DX_M = 0.3;
/** Shortest profile accepted [m]: the golden car needs 11 m to settle, and a segment to report. */
export const MIN_PROFILE_LENGTH_M = 20;
/** Most rows accepted in one file. */
export const MAX_PROFILE_POINTS = 2_000_000;
/** Largest upload [bytes]. */
export const MAX_PROFILE_BYTES = 40 * 1024 * 1024;
/** Folder under DATA_DIR holding survey files. */
export const SURVEY_DIR = 'surveys';

export interface ParsedProfile {
  dxM: number;
  startM: number;
  endM: number;
  elevationsM: Float64Array;
}

/** A problem with a profile file; `row` is the 1-based line number in the file. */
export class ProfileFormatError extends Error {
  constructor(
    message: string,
    public readonly row: number | null,
    public readonly field: 'file' | 'distance_m' | 'elevation_m' | 'header',
  ) {
    super(row !== null ? `Row ${row}: ${message}` : message);
    this.name = 'ProfileFormatError';
  }
}

const NUM = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

/** Parses a profile CSV (layout above). Throws {@link ProfileFormatError} naming the row. */
export function parseProfileCsv(text: string): ParsedProfile {
  if (text.includes('\u0000')) throw new ProfileFormatError('The file is not text (it contains binary data). Upload a CSV file.', null, 'file');
  const lines = text.split(/\r?\n/);
  let row = 0;
  let headerSeen = false;
  const dist: number[] = [];
  const elev: number[] = [];
  let dx = 0;
  let tol = 0;
  // the elevation column's name gives its unit: elevation_m [m] or elevation_mm [mm]
  let elevationCol = 'elevation_m';
  let toMetres = 1;
  for (const raw of lines) {
    row += 1;
    const line = raw.replace(/^\uFEFF/, '').trim();
    if (!line || line.startsWith('#')) continue;
    const cols = line.split(',').map((c) => c.trim());
    if (!headerSeen) {
      const h = cols.map((c) => c.toLowerCase().replace(/^"|"$/g, ''));
      if (h.length !== 2 || h[0] !== 'distance_m' || (h[1] !== 'elevation_m' && h[1] !== 'elevation_mm')) {
        throw new ProfileFormatError(`the header must be "distance_m,elevation_m" (or elevation_mm for millimetres), found "${line.slice(0, 80)}".`, row, 'header');
      }
      elevationCol = h[1];
      toMetres = h[1] === 'elevation_mm' ? 1e-3 : 1;
      headerSeen = true;
      continue;
    }
    if (cols.length !== 2) throw new ProfileFormatError(`expected 2 columns (distance_m, ${elevationCol}), found ${cols.length}.`, row, 'file');
    if (!NUM.test(cols[0])) throw new ProfileFormatError(`distance_m "${cols[0].slice(0, 30)}" is not a number.`, row, 'distance_m');
    if (!NUM.test(cols[1])) throw new ProfileFormatError(`${elevationCol} "${cols[1].slice(0, 30)}" is not a number.`, row, 'elevation_m');
    const d = Number(cols[0]);
    const z = Number(cols[1]) * toMetres;
    if (Math.abs(z) > 10_000) throw new ProfileFormatError(`${elevationCol} ${cols[1]} is outside ±10 000 m.`, row, 'elevation_m');
    if (d < 0) throw new ProfileFormatError(`distance_m ${d} m is negative.`, row, 'distance_m');
    const n = dist.length;
    if (n === 1) {
      dx = d - dist[0];
      if (!(dx > 0)) throw new ProfileFormatError(`distance_m must increase; ${d} m follows ${dist[0]} m.`, row, 'distance_m');
      if (dx > MAX_PROFILE_DX_M + 1e-9) {
        throw new ProfileFormatError(`the sample interval is ${round(dx)} m; it must be at most ${MAX_PROFILE_DX_M} m.`, row, 'distance_m');
      }
      tol = Math.max(1e-6, dx * 2e-3);
    } else if (n > 1) {
      const expected = dist[0] + n * dx;
      if (Math.abs(d - expected) > tol) {
        throw new ProfileFormatError(
          `distance_m ${d} m breaks the even spacing of ${round(dx)} m (expected ${round(expected)} m).`,
          row,
          'distance_m',
        );
      }
    }
    if (n >= MAX_PROFILE_POINTS) throw new ProfileFormatError(`the file has more than ${MAX_PROFILE_POINTS} rows.`, row, 'file');
    dist.push(d);
    elev.push(z);
  }
  if (!headerSeen) throw new ProfileFormatError('The file is empty: it needs the header "distance_m,elevation_m" and rows of numbers.', null, 'file');
  if (dist.length < 2) throw new ProfileFormatError('The file has fewer than two rows of data.', null, 'file');
  // Distances are stored rounded; the even grid is rebuilt from the first point and the mean step.
  const dxM = round((dist[dist.length - 1] - dist[0]) / (dist.length - 1), 9);
  const startM = dist[0];
  const endM = startM + (dist.length - 1) * dxM;
  if (endM - startM < MIN_PROFILE_LENGTH_M) {
    throw new ProfileFormatError(`The profile covers ${round(endM - startM)} m; it must cover at least ${MIN_PROFILE_LENGTH_M} m.`, null, 'file');
  }
  return { dxM, startM, endM, elevationsM: Float64Array.from(elev) };
}

const round = (x: number, digits = 4) => Math.round(x * 10 ** digits) / 10 ** digits;

/** Writes a profile in the CSV layout (distances to 0.1 mm, elevations to 1 µm). */
export function formatProfileCsv(p: { dxM: number; startM: number; elevationsM: ArrayLike<number> }, comment?: string): string {
  const out: string[] = [];
  if (comment) out.push(`# ${comment.replace(/\n/g, ' ')}`);
  out.push('distance_m,elevation_m');
  for (let i = 0; i < p.elevationsM.length; i++) out.push(`${(p.startM + i * p.dxM).toFixed(4)},${p.elevationsM[i].toFixed(6)}`);
  return out.join('\n') + '\n';
}

/** Saves a profile file under DATA_DIR/surveys with a random name; returns the relative path. */
export function storeProfileFile(dataDir: string, content: string | Buffer, name?: string): string {
  const dir = path.join(dataDir, SURVEY_DIR);
  fs.mkdirSync(dir, { recursive: true });
  const file = name ?? `${crypto.randomBytes(12).toString('hex')}.csv`;
  if (file.includes('/') || file.includes('\\') || file.startsWith('.')) throw new Error('bad survey file name');
  fs.writeFileSync(path.join(dir, file), content);
  return `${SURVEY_DIR}/${file}`;
}

/** Absolute path of a stored survey file, refusing anything outside DATA_DIR/surveys. */
export function surveyFilePath(dataDir: string, relPath: string): string {
  const root = path.resolve(dataDir, SURVEY_DIR);
  const abs = path.resolve(dataDir, relPath);
  if (!abs.startsWith(root + path.sep)) throw new Error(`survey file outside ${SURVEY_DIR}: ${relPath}`);
  return abs;
}

/** Removes a stored survey file (used when saving fails after the file was written). */
export function removeProfileFile(dataDir: string, relPath: string) {
  try {
    fs.rmSync(surveyFilePath(dataDir, relPath), { force: true });
  } catch {
    // nothing to clean up
  }
}

const cache = new Map<string, ParsedProfile>();
const CACHE_SIZE = 24;

/** Reads and parses a stored profile file (cached: stored files never change). */
export async function readProfileFile(dataDir: string, relPath: string): Promise<ParsedProfile> {
  const abs = surveyFilePath(dataDir, relPath);
  const hit = cache.get(abs);
  if (hit) {
    cache.delete(abs);
    cache.set(abs, hit);
    return hit;
  }
  const parsed = parseProfileCsv(await fs.promises.readFile(abs, 'utf8'));
  cache.set(abs, parsed);
  while (cache.size > CACHE_SIZE) cache.delete(cache.keys().next().value!);
  return parsed;
}

/**
 * The stored profile of a survey: sample interval [m], route distance of the first sample [m]
 * and the evenly spaced elevations [m]. The elevation of route distance `x` is
 * `elevationsM[round((x − startM) / dxM)]`. Throws if the survey or its file is missing.
 *
 * @example
 * const { dxM, startM, elevationsM } = await loadSurveyProfile(config.dataDir, segment.surveyId);
 * const from = Math.round((segment.startM - startM) / dxM);
 * const to = Math.round((segment.endM - startM) / dxM);
 * const part = elevationsM.subarray(Math.max(0, from), Math.min(elevationsM.length, to + 1));
 */
export async function loadSurveyProfile(dataDir: string, surveyId: number): Promise<{ dxM: number; startM: number; elevationsM: Float64Array }> {
  const survey = await RoadSurvey.findByPk(surveyId, { attributes: ['id', 'filePath'] });
  if (!survey) throw new Error(`road survey ${surveyId} not found`);
  const p = await readProfileFile(dataDir, survey.filePath);
  return { dxM: p.dxM, startM: p.startM, elevationsM: p.elevationsM };
}
