/**
 * The `life` and `life-fit` commands of the CLI (server/cli/index.ts calls them). See
 * docs/methods.md, "Damper life model".
 *
 * @module
 */
import { PhysicsInputError, type CornerParams } from '../physics/types';
import { roadSeverity } from '../wear/life-law';
import { fitLifeModel, lifeKmAt, meanLifeKmAt, modelFromJson, modelToJson, priorModel, type LifeModel, type LifeUnit } from '../reliability/life-model';
import { CsvSyntaxError, readCsv, type CsvRow } from '../lib/csv';

/**
 * Life [km] of a damper that spends its whole life on a `w = 2` road of `gdN0` at `speedKmh`:
 * median, mean, P10 and P90, under the prior or a fitted model.
 */
export function lifeCommand(i: { corner: CornerParams; ratedKm: number; gdN0: number; speedKmh: number; model?: unknown }) {
  const m: LifeModel = i.model === undefined ? priorModel() : modelFromJson(i.model);
  const s = roadSeverity(i.corner, i.gdN0, i.speedKmh);
  return {
    medianLifeKm: lifeKmAt(m, i.ratedKm, s, 0.5),
    meanLifeKm: meanLifeKmAt(m, i.ratedKm, s),
    p10LifeKm: lifeKmAt(m, i.ratedKm, s, 0.1),
    p90LifeKm: lifeKmAt(m, i.ratedKm, s, 0.9),
    severity: s,
    model: m.source,
  };
}

const COLUMNS = ['damper', 'km', 'gd', 'speed_kmh', 'failed'];

/**
 * Fits the life model to a CSV of dampers (`damper,km,gd,speed_kmh,failed`: one or more rows per
 * damper, each a distance [km] on road of that Gd(n0) [m³] at that speed [km/h]; `failed` 1 on
 * every row of a damper removed for wear, 0 otherwise).
 *
 * @throws PhysicsInputError naming the row and column of bad data
 */
export function lifeFitCommand(csvText: string, corner: CornerParams, ratedKm: number) {
  let rows: CsvRow[];
  try {
    rows = readCsv(csvText);
  } catch (e) {
    if (e instanceof CsvSyntaxError) throw new PhysicsInputError(e.line !== null ? `row ${e.line}` : 'dampers', 'CSV', e.message);
    throw e;
  }
  if (!rows.length) throw new PhysicsInputError('dampers', 'CSV', 'is empty');
  const head = rows[0].cells.map((h) => h.toLowerCase());
  const missing = COLUMNS.filter((c) => !head.includes(c));
  if (missing.length) throw new PhysicsInputError('dampers', 'CSV', `lacks the column(s) ${missing.join(', ')} (header: ${COLUMNS.join(',')})`);
  const at = Object.fromEntries(COLUMNS.map((c) => [c, head.indexOf(c)]));
  const units = new Map<string, LifeUnit>();
  const severityCache = new Map<string, number>();
  rows.slice(1).forEach(({ line: row, cells }) => {
    const n = (col: string, ok: (x: number) => boolean, what: string) => {
      const v = Number(cells[at[col]]);
      if (cells[at[col]] === undefined || cells[at[col]] === '' || !Number.isFinite(v) || !ok(v)) throw new PhysicsInputError(`row ${row}, ${col}`, 'CSV', `must be ${what}, got "${cells[at[col]] ?? ''}"`);
      return v;
    };
    const id = cells[at.damper];
    if (!id) throw new PhysicsInputError(`row ${row}, damper`, 'CSV', 'must name the damper');
    const km = n('km', (x) => x >= 0, 'a distance ≥ 0 km');
    const gd = n('gd', (x) => x > 0 && x < 1, 'a Gd(n0) above 0 and below 1 m³');
    const v = n('speed_kmh', (x) => x >= 5 && x <= 150, 'a speed within 5–150 km/h');
    const failed = n('failed', (x) => x === 0 || x === 1, '0 or 1') === 1;
    const key = `${gd}/${v}`;
    let s = severityCache.get(key);
    if (s === undefined) {
      s = roadSeverity(corner, gd, v);
      severityCache.set(key, s);
    }
    const u = units.get(id) ?? { rows: [], failed, ratedKm };
    if (u.failed !== failed) throw new PhysicsInputError(`row ${row}, failed`, 'CSV', `disagrees with earlier rows of damper "${id}" (one damper is either removed for wear or not)`);
    u.rows.push({ km, severity: s });
    units.set(id, u);
  });
  if (!units.size) throw new PhysicsInputError('dampers', 'CSV', 'has no rows after the header');
  const m = fitLifeModel([...units.values()]);
  return { ...modelToJson(m), medianLifeKmOnRatedRoad: lifeKmAt(m, ratedKm, 1, 0.5), ratedKm };
}
