/** Geometry of routes on the ground: lengths along a polyline and its split into segments. */

export type LonLat = [number, number];

/** Mean Earth radius [m] (IUGG R1, as used with the haversine formula). */
export const EARTH_RADIUS_M = 6_371_008.8;

const rad = (d: number) => (d * Math.PI) / 180;

/**
 * Great-circle distance between two points [m] by the haversine formula.
 * @example haversineM([0, 0], [0, 1]) // ≈ 111 195 m (one degree of latitude)
 */
export function haversineM(a: LonLat, b: LonLat): number {
  const dLat = rad(b[1] - a[1]);
  const dLon = rad(b[0] - a[0]);
  const h = Math.sin(dLat / 2) ** 2 + Math.cos(rad(a[1])) * Math.cos(rad(b[1])) * Math.sin(dLon / 2) ** 2;
  return 2 * EARTH_RADIUS_M * Math.asin(Math.min(1, Math.sqrt(h)));
}

/** Length of a polyline [m]. */
export function lineLengthM(coords: LonLat[]): number {
  let s = 0;
  for (let i = 1; i < coords.length; i++) s += haversineM(coords[i - 1], coords[i]);
  return s;
}

function lerp(a: LonLat, b: LonLat, t: number): LonLat {
  return [a[0] + (b[0] - a[0]) * t, a[1] + (b[1] - a[1]) * t];
}

export interface SegmentGeometry {
  seq: number;
  startM: number;
  endM: number;
  coords: LonLat[];
}

/**
 * Splits a polyline into consecutive segments of `segmentM` metres (the last one takes the
 * remainder; a remainder under a quarter of `segmentM` is merged into the one before it).
 */
export function splitLine(coords: LonLat[], segmentM: number): SegmentGeometry[] {
  if (coords.length < 2) throw new Error('a route needs at least two points');
  if (!(segmentM > 0)) throw new Error('segment length must be positive');
  const total = lineLengthM(coords);
  let n = Math.max(1, Math.floor(total / segmentM));
  if (total - n * segmentM >= segmentM / 4) n += 1;
  const cuts = Array.from({ length: n + 1 }, (_, i) => (i === n ? total : i * segmentM));

  const out: SegmentGeometry[] = [];
  let vi = 0; // index of the vertex starting the current edge
  let edgeStart = 0; // distance along the line at coords[vi]
  let edgeLen = haversineM(coords[0], coords[1]);
  const pointAt = (d: number): LonLat => {
    while (vi < coords.length - 2 && edgeStart + edgeLen < d) {
      edgeStart += edgeLen;
      vi += 1;
      edgeLen = haversineM(coords[vi], coords[vi + 1]);
    }
    const t = edgeLen > 0 ? Math.min(1, Math.max(0, (d - edgeStart) / edgeLen)) : 0;
    return lerp(coords[vi], coords[vi + 1], t);
  };
  for (let i = 0; i < n; i++) {
    const a = cuts[i];
    const b = cuts[i + 1];
    const pts: LonLat[] = [pointAt(a)];
    // interior vertices between a and b
    let j = vi + 1;
    let dist = edgeStart + edgeLen;
    while (j < coords.length - 1 && dist < b) {
      pts.push(coords[j]);
      dist += haversineM(coords[j], coords[j + 1]);
      j += 1;
    }
    pts.push(pointAt(b));
    out.push({ seq: i, startM: a, endM: b, coords: pts.map(([x, y]) => [round6(x), round6(y)] as LonLat) });
  }
  return out;
}

const round6 = (x: number) => Math.round(x * 1e6) / 1e6;
