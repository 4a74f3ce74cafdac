/**
 * Snapping a reported position to the nearest route segment: the shortest distance from the
 * point to each segment's polyline, in a local equirectangular projection around the point
 * (x = R·Δλ·cos φ0, y = R·Δφ; error well under 0.1 % within a few kilometres — plenty for a
 * 150 m snapping radius).
 */
import { EARTH_RADIUS_M, type LonLat } from '../roads/geometry';

/** Reports farther than this from every segment are refused [m]. */
export const MAX_SNAP_M = 150;

export interface SnapCandidate {
  id: number;
  coords: LonLat[];
}

export interface SnapResult {
  segmentId: number;
  /** Nearest point on the segment [lon, lat]. */
  point: LonLat;
  /** Distance from the reported point to it [m]. */
  distanceM: number;
}

/**
 * The segment nearest to `p` and the nearest point on it.
 * @param p reported position [lon, lat] (degrees)
 * @param candidates segments with their polylines
 * @returns the nearest, or null when there are no segments
 * @example snapToSegments([0, 0.0009], [{ id: 1, coords: [[-0.01, 0], [0.01, 0]] }]) // → { segmentId: 1, point: [0, 0], distanceM: ≈ 100.1 }
 */
export function snapToSegments(p: LonLat, candidates: readonly SnapCandidate[]): SnapResult | null {
  const k = (Math.PI / 180) * EARTH_RADIUS_M;
  const cos0 = Math.cos((p[1] * Math.PI) / 180);
  const toXY = (q: LonLat): [number, number] => [(q[0] - p[0]) * k * cos0, (q[1] - p[1]) * k];
  let best: SnapResult | null = null;
  let bestD2 = Infinity;
  // A cheap bounding-box filter in degrees before the exact check (1° of latitude ≈ 111 km).
  const padLat = 0.05;
  const padLon = 0.05 / Math.max(0.1, cos0);
  for (const c of candidates) {
    const pts = c.coords;
    if (pts.length === 0) continue;
    let minLon = Infinity, maxLon = -Infinity, minLat = Infinity, maxLat = -Infinity;
    for (const q of pts) {
      if (q[0] < minLon) minLon = q[0];
      if (q[0] > maxLon) maxLon = q[0];
      if (q[1] < minLat) minLat = q[1];
      if (q[1] > maxLat) maxLat = q[1];
    }
    if (best && (p[0] < minLon - padLon || p[0] > maxLon + padLon || p[1] < minLat - padLat || p[1] > maxLat + padLat)) continue;
    for (let i = 0; i < Math.max(1, pts.length - 1); i++) {
      const a = toXY(pts[i]);
      const b = toXY(pts[Math.min(i + 1, pts.length - 1)]);
      const dx = b[0] - a[0];
      const dy = b[1] - a[1];
      const len2 = dx * dx + dy * dy;
      // projection of the origin (the reported point) onto AB, clamped to the edge
      const t = len2 > 0 ? Math.max(0, Math.min(1, -(a[0] * dx + a[1] * dy) / len2)) : 0;
      const x = a[0] + t * dx;
      const y = a[1] + t * dy;
      const d2 = x * x + y * y;
      if (d2 < bestD2) {
        bestD2 = d2;
        best = { segmentId: c.id, point: [p[0] + x / (k * cos0), p[1] + y / k], distanceM: Math.sqrt(d2) };
      }
    }
  }
  return best;
}
