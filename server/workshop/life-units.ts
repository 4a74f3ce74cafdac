/**
 * What a spec's life model is fitted from: each damper of the spec with its life and its road
 * mix (distance per severity: its own recorded duty where it covers the damper's life, its
 * vehicle corner's mix for the rest; server/workshop/life.ts states the rules), for the whole
 * spec at once or a range of its vehicles at a time. See docs/methods.md, "Damper life model".
 */
import { type ExposureRow, type LifeUnit } from '../reliability/life-model';
import { lifeRepository, type VehicleRange } from './life-repository';
import { idRanges } from '../db/raw';
import { CENSORED_REASONS } from '../contracts/workshop';

/** One damper's life record with its road mix, as the fit and the back-test see it. */
export interface DamperLife {
  id: number;
  vehicleId: number;
  axleIndex: number;
  ratedKm: number;
  installedAt: string;
  removedAt: string | null;
  lifeKm: number;
  failed: boolean;
  reason: string | null;
  /** Distance per severity over its whole life (recorded, then the vehicle's mix for the rest). */
  rows: ExposureRow[];
  recordedKm: number;
}

/**
 * Every damper of a spec with its life and road mix (see module doc). `read.bandRows` is added
 * the severity totals read (the rows a refit reads besides the dampers).
 */
export async function damperLives(specId: number, read?: { bandRows: number }, range?: VehicleRange): Promise<DamperLife[]> {
  const [dampers, own, unfitted] = await Promise.all([
    lifeRepository.specDampers(specId, range),
    lifeRepository.damperSeverityBands(specId, range),
    lifeRepository.unfittedCornerSeverityBands(specId, range),
  ]);
  if (read) read.bandRows += own.length + unfitted.length;
  const ownOf = new Map<number, ExposureRow[]>();
  for (const r of own) {
    if (!(r.km > 0)) continue;
    if (!ownOf.has(r.damper_id)) ownOf.set(r.damper_id, []);
    ownOf.get(r.damper_id)!.push({ km: r.km, severity: Math.exp(r.lns / r.km) });
  }
  // each corner's mix: its dampers' bands and the duty driven with none fitted, summed per band
  const cornerOf = new Map(dampers.map((d) => [d.id, `${d.vehicle_id}/${d.position}`]));
  const bands = new Map<string, Map<number, { km: number; lns: number }>>();
  const addBand = (corner: string, band: number, km: number, lns: number) => {
    let m = bands.get(corner);
    if (!m) bands.set(corner, (m = new Map()));
    const b = m.get(band);
    if (b) {
      b.km += km;
      b.lns += lns;
    } else m.set(band, { km, lns });
  };
  for (const r of own) {
    const corner = cornerOf.get(r.damper_id);
    if (corner) addBand(corner, r.band, r.km, r.lns);
  }
  for (const r of unfitted) addBand(`${r.vehicle_id}/${r.position}`, r.band, r.km, r.lns);
  const mixOf = new Map<string, ExposureRow[]>();
  for (const [corner, m] of bands) {
    const list: ExposureRow[] = [];
    for (const [, b] of [...m].sort((x, y) => x[0] - y[0])) if (b.km > 0) list.push({ km: b.km, severity: Math.exp(b.lns / b.km) });
    if (list.length) mixOf.set(corner, list);
  }
  return dampers.map((d) => {
    const lifeKm = Math.max(0, d.end_km - d.installed_odometer_km);
    const rows = (ownOf.get(d.id) ?? []).slice();
    const recordedKm = rows.reduce((s, r) => s + r.km, 0);
    const rest = lifeKm - recordedKm;
    if (rest > 0) {
      const m = mixOf.get(`${d.vehicle_id}/${d.position}`);
      const total = m?.reduce((s, r) => s + r.km, 0) ?? 0;
      if (m && total > 0) for (const r of m) rows.push({ km: (rest * r.km) / total, severity: r.severity });
      else rows.push({ km: rest, severity: 1 });
    }
    const failed = d.removed_at !== null && !CENSORED_REASONS.includes(d.removal_reason ?? '');
    return { id: d.id, vehicleId: d.vehicle_id, axleIndex: d.axle_index, ratedKm: d.rated, installedAt: d.installed_at, removedAt: d.removed_at, lifeKm, failed, reason: d.removal_reason, rows, recordedKm };
  });
}

/** A damper as a unit of the fit. */
export const toUnit = (d: DamperLife): LifeUnit => ({ rows: d.rows, failed: d.failed, ratedKm: d.ratedKm });

/** Vehicles whose dampers the refit reads at once: what it holds besides the fit's own units. */
export const REFIT_VEHICLES_PER_READ = 2000;

/**
 * The fit's units of a spec (dampers with a life, in damper order), read in ranges of
 * {@link REFIT_VEHICLES_PER_READ} vehicles: a damper's road mix needs only its own vehicle's
 * records, so the ranges give the units {@link damperLives} gives, while the dampers' rows as
 * read and the per-corner sums are held for one range at a time, not for the whole spec.
 */
export async function specLifeUnits(specId: number, read?: { bandRows: number }, vehiclesPerRead = REFIT_VEHICLES_PER_READ): Promise<LifeUnit[]> {
  const vehicles = await lifeRepository.specVehicleIds(specId);
  const units: { id: number; unit: LifeUnit }[] = [];
  for (const range of idRanges(vehicles, vehiclesPerRead)) {
    for (const d of await damperLives(specId, read, range)) if (d.lifeKm > 0) units.push({ id: d.id, unit: toUnit(d) });
  }
  // damper order, as one read of the whole spec gives them (the fit's sums add in this order)
  units.sort((a, b) => a.id - b.id);
  return units.map((u) => u.unit);
}

