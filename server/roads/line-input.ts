/**
 * Reading a route's line from what a manager uploads:
 *
 * - GeoJSON: a `LineString`, a `Feature` whose geometry is one, or a `FeatureCollection` with
 *   exactly one LineString feature; coordinates `[lon, lat]` in degrees (WGS 84).
 * - CSV of points: a header naming `lat` and `lon` columns (also `latitude`, `longitude`,
 *   `lng`), in either order, then one point per row in driving order; other columns are ignored.
 */
import type { LonLat } from './geometry';
import { CsvSyntaxError, readCsv, type CsvRow } from '../lib/csv';

export class LineInputError extends Error {
  constructor(message: string, public readonly row: number | null = null) {
    super(row !== null ? `Row ${row}: ${message}` : message);
    this.name = 'LineInputError';
  }
}

const MAX_POINTS = 50_000;

function checkPoint(lon: unknown, lat: unknown, where: string, row: number | null): LonLat {
  if (typeof lon !== 'number' || typeof lat !== 'number' || !Number.isFinite(lon) || !Number.isFinite(lat)) {
    throw new LineInputError(`${where} must be two numbers [lon, lat] in degrees.`, row);
  }
  if (lat < -90 || lat > 90) throw new LineInputError(`${where}: latitude ${lat}° is outside −90…90°.`, row);
  if (lon < -180 || lon > 180) throw new LineInputError(`${where}: longitude ${lon}° is outside −180…180°.`, row);
  return [lon, lat];
}

function finish(points: LonLat[]): LonLat[] {
  // consecutive duplicates add nothing
  const out = points.filter((p, i) => i === 0 || p[0] !== points[i - 1][0] || p[1] !== points[i - 1][1]);
  if (out.length < 2) throw new LineInputError('A route needs at least two distinct points.');
  if (out.length > MAX_POINTS) throw new LineInputError(`A route may have at most ${MAX_POINTS} points; this one has ${out.length}.`);
  return out;
}

export function parseGeoJsonLine(text: string): LonLat[] {
  let doc: unknown;
  try {
    doc = JSON.parse(text);
  } catch {
    throw new LineInputError('The file is not valid JSON (GeoJSON).');
  }
  let geom = doc as { type?: string; coordinates?: unknown; geometry?: unknown; features?: unknown };
  if (geom?.type === 'FeatureCollection') {
    const lines = (Array.isArray(geom.features) ? geom.features : []).filter((f: { geometry?: { type?: string } }) => f?.geometry?.type === 'LineString');
    if (lines.length !== 1) throw new LineInputError(`The FeatureCollection must hold exactly one LineString feature; it holds ${lines.length}.`);
    geom = (lines[0] as { geometry: typeof geom }).geometry;
  } else if (geom?.type === 'Feature') {
    geom = geom.geometry as typeof geom;
  }
  if (geom?.type !== 'LineString') throw new LineInputError(`Expected a GeoJSON LineString, found ${geom?.type ? `a ${geom.type}` : 'no geometry type'}.`);
  if (!Array.isArray(geom.coordinates)) throw new LineInputError('The LineString has no coordinates list.');
  return finish((geom.coordinates as unknown[]).map((c, i) => (Array.isArray(c) ? checkPoint(c[0], c[1], `coordinates[${i}]`, null) : checkPoint(null, null, `coordinates[${i}]`, null))));
}

export function parseCsvLine(text: string): LonLat[] {
  let rows: CsvRow[];
  try {
    rows = readCsv(text, { delimiters: [',', ';', '\t'] });
  } catch (e) {
    if (e instanceof CsvSyntaxError) throw new LineInputError(`The file is not valid CSV: ${e.message}.`, e.line);
    throw e;
  }
  let latCol = -1;
  let lonCol = -1;
  const pts: LonLat[] = [];
  for (const { line: row, cells: cols } of rows) {
    if (latCol < 0) {
      const h = cols.map((c) => c.toLowerCase());
      latCol = h.findIndex((c) => c === 'lat' || c === 'latitude');
      lonCol = h.findIndex((c) => c === 'lon' || c === 'lng' || c === 'long' || c === 'longitude');
      if (latCol < 0 || lonCol < 0) throw new LineInputError('The header must name a "lat" and a "lon" column.', row);
      continue;
    }
    const lat = Number(cols[latCol]);
    const lon = Number(cols[lonCol]);
    if (cols[latCol] === undefined || cols[latCol] === '' || !Number.isFinite(lat)) throw new LineInputError(`lat "${cols[latCol] ?? ''}" is not a number.`, row);
    if (cols[lonCol] === undefined || cols[lonCol] === '' || !Number.isFinite(lon)) throw new LineInputError(`lon "${cols[lonCol] ?? ''}" is not a number.`, row);
    pts.push(checkPoint(lon, lat, 'the point', row));
  }
  if (latCol < 0) throw new LineInputError('The file is empty.');
  return finish(pts);
}
