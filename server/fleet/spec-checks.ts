/**
 * Physical-sense checks of suspension spec corners, typical ranges per vehicle class, and the
 * presets. Typical values: docs/methods.md "Typical parameters" (Gillespie 1992, Wong, Cebon 1999 — textbook ranges,
 * from memory; the Hindawi ISRN 2015 article 974020 car example). Hard limits are wide on
 * purpose (common practice): a value outside them is not a road vehicle's corner.
 */
import { modes, frequencyResponse, type CornerModes } from '../physics/quarter-car';
import type { CornerParams } from '../physics/types';
import type { AxleBody, VehicleClass } from '../contracts/specs';

export type CornerField = keyof CornerParams | 'ratedDamperLifeKm';

export interface FieldLimit {
  unit: string;
  min: number;
  max: number;
}

/** Hard limits per field: outside them a value is refused. */
export const HARD_LIMITS: Record<CornerField, FieldLimit> = {
  sprungMassKg: { unit: 'kg', min: 50, max: 10_000 },
  unsprungMassKg: { unit: 'kg', min: 5, max: 2_000 },
  springRateNPerM: { unit: 'N/m', min: 2_000, max: 5_000_000 },
  dampingNsPerM: { unit: 'N·s/m', min: 100, max: 300_000 },
  tireRateNPerM: { unit: 'N/m', min: 50_000, max: 10_000_000 },
  ratedDamperLifeKm: { unit: 'km', min: 5_000, max: 2_000_000 },
};

/** Limits on the derived modes (common practice): outside them the numbers do not make a suspension. */
export const MODE_LIMITS = {
  bodyHz: { min: 0.5, max: 5 },
  wheelHz: { min: 3, max: 30 },
  bodyDampingRatio: { min: 0.05, max: 1.5 },
};

export { VEHICLE_CLASSES } from '../contracts/specs';
export type { VehicleClass } from '../contracts/specs';

type Range = [number, number];
export interface TypicalRanges {
  sprungMassKg: Range;
  unsprungMassKg: Range;
  springRateNPerM: Range;
  dampingNsPerM: Range | null;
  tireRateNPerM: Range;
  bodyHz: Range;
  wheelHz: Range;
  bodyDampingRatio: Range;
}

/** Typical per-corner ranges by class (docs/methods.md "Typical parameters", textbook ranges from memory). */
export const TYPICAL: Record<VehicleClass, TypicalRanges> = {
  'passenger car': {
    sprungMassKg: [250, 450],
    unsprungMassKg: [25, 50],
    springRateNPerM: [15_000, 35_000],
    dampingNsPerM: [1_000, 3_000],
    tireRateNPerM: [150_000, 250_000],
    bodyHz: [1.0, 1.5],
    wheelHz: [10, 15],
    bodyDampingRatio: [0.2, 0.4],
  },
  'light commercial': {
    sprungMassKg: [400, 900],
    unsprungMassKg: [50, 80],
    springRateNPerM: [30_000, 80_000],
    dampingNsPerM: null,
    tireRateNPerM: [250_000, 350_000],
    bodyHz: [1.0, 1.5],
    wheelHz: [10, 15],
    bodyDampingRatio: [0.2, 0.4],
  },
  'heavy goods': {
    sprungMassKg: [2_000, 4_500],
    unsprungMassKg: [400, 700],
    springRateNPerM: [150_000, 1_500_000],
    dampingNsPerM: null,
    tireRateNPerM: [1_500_000, 2_000_000],
    bodyHz: [1.0, 4.0],
    wheelHz: [7, 15],
    bodyDampingRatio: [0.2, 0.4],
  },
};

// Shown to users: typical textbook values (Gillespie 1992, Wong, Cebon 1999; quoted from memory, docs/methods.md "Typical parameters").
export const TYPICAL_SOURCE = 'typical textbook values for the vehicle class (Gillespie 1992; Wong; Cebon 1999)';

/** A preset's axle: the same fields as an axle in a spec body (server/contracts/specs.ts). */
export type PresetAxle = AxleBody;
export interface Preset {
  key: string;
  name: string;
  vehicleClass: VehicleClass;
  source: string;
  axles: PresetAxle[];
}

/** Presets: mid-range values of the typical ranges above, and one published car example. */
export const PRESETS: Preset[] = [
  {
    key: 'car-published',
    name: 'Passenger car (published example)',
    vehicleClass: 'passenger car',
    source: 'Hindawi ISRN 2015, article 974020, Table 2 (front/rear ks, cs, kt, mu; sprung mass per corner chosen inside the typical textbook values)',
    axles: [
      { label: 'front', sprungMassKg: 350, unsprungMassKg: 40, springRateNPerM: 19_960, dampingNsPerM: 1_290, tireRateNPerM: 175_500, ratedDamperLifeKm: 90_000 },
      { label: 'rear', sprungMassKg: 300, unsprungMassKg: 35.5, springRateNPerM: 17_500, dampingNsPerM: 1_690, tireRateNPerM: 175_500, ratedDamperLifeKm: 90_000 },
    ],
  },
  {
    key: 'van',
    name: 'Light commercial van',
    vehicleClass: 'light commercial',
    source: 'middle of the typical textbook values for light commercial vehicles; damping chosen for a body damping ratio near 0.3',
    axles: [
      { label: 'front', sprungMassKg: 550, unsprungMassKg: 60, springRateNPerM: 42_000, dampingNsPerM: 2_900, tireRateNPerM: 290_000, ratedDamperLifeKm: 90_000 },
      { label: 'rear', sprungMassKg: 500, unsprungMassKg: 72, springRateNPerM: 47_000, dampingNsPerM: 3_000, tireRateNPerM: 310_000, ratedDamperLifeKm: 90_000 },
    ],
  },
  {
    key: 'truck-steel',
    name: 'Rigid truck, steel springs',
    vehicleClass: 'heavy goods',
    source: 'typical textbook values for a heavy-truck wheel station on steel springs; damping chosen for a body damping ratio near 0.25 (computed with the two-mass modes)',
    axles: [
      { label: 'front', sprungMassKg: 2_500, unsprungMassKg: 450, springRateNPerM: 600_000, dampingNsPerM: 32_000, tireRateNPerM: 1_700_000, ratedDamperLifeKm: 150_000 },
      { label: 'rear', sprungMassKg: 3_500, unsprungMassKg: 650, springRateNPerM: 900_000, dampingNsPerM: 55_000, tireRateNPerM: 1_900_000, ratedDamperLifeKm: 150_000 },
    ],
  },
  {
    key: 'truck-air',
    name: 'Rigid truck, air rear',
    vehicleClass: 'heavy goods',
    source: 'typical textbook values for a heavy-truck wheel station, air springs 0.15–0.5 MN/m, body 1–2 Hz; Directive 96/53/EC Annex II air-equivalent (≤ 2.0 Hz, damping > 20 %)',
    axles: [
      { label: 'front', sprungMassKg: 2_400, unsprungMassKg: 450, springRateNPerM: 600_000, dampingNsPerM: 31_000, tireRateNPerM: 1_600_000, ratedDamperLifeKm: 150_000 },
      { label: 'rear', sprungMassKg: 3_200, unsprungMassKg: 650, springRateNPerM: 300_000, dampingNsPerM: 17_000, tireRateNPerM: 1_800_000, ratedDamperLifeKm: 150_000 },
    ],
  },
];

const fmt = (x: number) => (Math.abs(x) >= 1000 ? Math.round(x).toLocaleString('en-GB') : String(Math.round(x * 1000) / 1000));

/**
 * Hard checks of one axle's corner: each field within its limits, unsprung < sprung,
 * tyre stiffer than spring, and sensible modes. Returns `{ 'axles.i.field': message }`.
 */
export function checkCorner(a: CornerParams & { ratedDamperLifeKm: number }, prefix: string): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [field, lim] of Object.entries(HARD_LIMITS) as [CornerField, FieldLimit][]) {
    const v = a[field];
    if (!(typeof v === 'number' && Number.isFinite(v))) out[`${prefix}.${field}`] = `must be a number in ${lim.unit}`;
    else if (v < lim.min || v > lim.max) out[`${prefix}.${field}`] = `${fmt(v)} ${lim.unit} is outside ${fmt(lim.min)}–${fmt(lim.max)} ${lim.unit}`;
  }
  if (Object.keys(out).length) return out;
  if (a.unsprungMassKg >= a.sprungMassKg / 2) {
    out[`${prefix}.unsprungMassKg`] = `${fmt(a.unsprungMassKg)} kg must be well under the sprung mass (${fmt(a.sprungMassKg)} kg): at most half of it`;
  }
  if (a.tireRateNPerM <= a.springRateNPerM) {
    out[`${prefix}.tireRateNPerM`] = `${fmt(a.tireRateNPerM)} N/m must be stiffer than the spring (${fmt(a.springRateNPerM)} N/m)`;
  }
  if (Object.keys(out).length) return out;
  const m = modes(a);
  if (m.bodyHz < MODE_LIMITS.bodyHz.min || m.bodyHz > MODE_LIMITS.bodyHz.max) {
    out[`${prefix}.springRateNPerM`] = `gives a body bounce of ${m.bodyHz.toFixed(2)} Hz; a road vehicle has ${MODE_LIMITS.bodyHz.min}–${MODE_LIMITS.bodyHz.max} Hz (check the spring rate in N/m and the sprung mass in kg)`;
  }
  if (m.wheelHz < MODE_LIMITS.wheelHz.min || m.wheelHz > MODE_LIMITS.wheelHz.max) {
    out[`${prefix}.unsprungMassKg`] = `gives a wheel hop of ${m.wheelHz.toFixed(1)} Hz; a road vehicle has ${MODE_LIMITS.wheelHz.min}–${MODE_LIMITS.wheelHz.max} Hz (check the unsprung mass in kg and the tyre rate in N/m)`;
  }
  if (m.bodyDampingRatio < MODE_LIMITS.bodyDampingRatio.min || m.bodyDampingRatio > MODE_LIMITS.bodyDampingRatio.max) {
    out[`${prefix}.dampingNsPerM`] = `gives a body damping ratio of ${m.bodyDampingRatio.toFixed(2)}; a road vehicle has ${MODE_LIMITS.bodyDampingRatio.min}–${MODE_LIMITS.bodyDampingRatio.max} (check the damping in N·s/m)`;
  }
  return out;
}

/** Soft hints: values outside the class's typical range (not errors). */
export function typicalHints(a: CornerParams, m: CornerModes, vehicleClass: string): string[] {
  const t = TYPICAL[vehicleClass as VehicleClass];
  if (!t) return [];
  const hints: string[] = [];
  const check = (label: string, v: number, r: Range | null, unit: string, digits = 0) => {
    if (r && (v < r[0] || v > r[1])) hints.push(`${label} ${v.toFixed(digits)} ${unit} is outside the typical ${r[0]}–${r[1]} ${unit} for a ${vehicleClass}`);
  };
  check('Sprung mass', a.sprungMassKg, t.sprungMassKg, 'kg');
  check('Unsprung mass', a.unsprungMassKg, t.unsprungMassKg, 'kg');
  check('Spring rate', a.springRateNPerM, t.springRateNPerM, 'N/m');
  check('Damping', a.dampingNsPerM, t.dampingNsPerM, 'N·s/m');
  check('Tyre rate', a.tireRateNPerM, t.tireRateNPerM, 'N/m');
  check('Body bounce', m.bodyHz, t.bodyHz, 'Hz', 2);
  check('Wheel hop', m.wheelHz, t.wheelHz, 'Hz', 1);
  check('Body damping ratio', m.bodyDampingRatio, t.bodyDampingRatio, '', 2);
  return hints;
}

/** Log-spaced frequencies 0.3–30 Hz for the response plot. */
export function plotFrequencies(n = 90): number[] {
  const lo = Math.log10(0.3);
  const hi = Math.log10(30);
  return Array.from({ length: n }, (_, i) => Math.round(10 ** (lo + ((hi - lo) * i) / (n - 1)) * 1000) / 1000);
}

/** Modes, hints and frequency response of one corner (assumed checked). */
export function cornerPreview(a: CornerParams, vehicleClass: string) {
  const m = modes(a);
  const fr = frequencyResponse(a, plotFrequencies());
  return {
    modes: m,
    hints: typicalHints(a, m, vehicleClass),
    response: fr.freqsHz.map((f, i) => ({ fHz: f, bodyAccel: fr.bodyAccel[i], tireLoadN: fr.tireLoad[i] })),
  };
}
