/**
 * The demo fleet's invented facts: its suspension specs (inside the typical ranges of
 * docs/methods.md "Typical parameters"), depots, routes and people's names.
 */
import type { RoughnessSource } from '../db/models';
import type { IsoClass } from '../physics/iso8608';

export interface SpecSeed {
  name: string;
  vehicleClass: string;
  description: string;
  axles: { label: string; sprungMassKg: number; unsprungMassKg: number; springRateNPerM: number; dampingNsPerM: number; tireRateNPerM: number; ratedDamperLifeKm: number }[];
  count: number;
  prefix: string;
  payloadKg: [number, number];
  /** Gross vehicle mass of its class [kg]: unladen + driver + payload stays within it. */
  grossKg: number;
  /** Age range at "today" [days since commissioning]. */
  ageDays: [number, number];
  /** Range of the vehicles' distances per working day [km]. */
  workingDayKm: [number, number];
}

/** Longest day's trip [h]: a morning shift (from 05:30–07:00) ends before the afternoon one (14:00–15:00) starts. */
export const MAX_TRIP_HOURS = 7;

/** Mass of a driver allowed for when capping the payload [kg] (assumption). */
export const DRIVER_KG = 75;

/** The largest payload that keeps a vehicle of a spec within its gross mass [kg]: gross − unladen − driver. */
export function maxPayloadKg(spec: Pick<SpecSeed, 'axles' | 'grossKg'>): number {
  const unladen = spec.axles.reduce((a, x) => a + 2 * (x.sprungMassKg + x.unsprungMassKg), 0);
  return spec.grossKg - unladen - DRIVER_KG;
}

export const SPECS: SpecSeed[] = [
  {
    name: 'Courier van 2.8 t',
    vehicleClass: 'light commercial',
    description: 'Short-wheelbase courier van, coil springs all round. Unladen corner masses.',
    axles: [
      { label: 'front', sprungMassKg: 430, unsprungMassKg: 46, springRateNPerM: 32000, dampingNsPerM: 2400, tireRateNPerM: 260000, ratedDamperLifeKm: 90000 },
      { label: 'rear', sprungMassKg: 360, unsprungMassKg: 55, springRateNPerM: 38000, dampingNsPerM: 2500, tireRateNPerM: 270000, ratedDamperLifeKm: 90000 },
    ],
    count: 18,
    prefix: 'CV',
    payloadKg: [80, 750],
    grossKg: 2800,
    ageDays: [400, 1500],
    workingDayKm: [80, 140],
  },
  {
    name: 'Long-body van 3.5 t',
    vehicleClass: 'light commercial',
    description: 'High-roof long-body van, coil front and leaf rear. Unladen corner masses.',
    axles: [
      { label: 'front', sprungMassKg: 600, unsprungMassKg: 58, springRateNPerM: 45000, dampingNsPerM: 3200, tireRateNPerM: 300000, ratedDamperLifeKm: 90000 },
      { label: 'rear', sprungMassKg: 520, unsprungMassKg: 76, springRateNPerM: 56000, dampingNsPerM: 3300, tireRateNPerM: 320000, ratedDamperLifeKm: 90000 },
    ],
    count: 16,
    prefix: 'LV',
    payloadKg: [150, 1250],
    grossKg: 3500,
    ageDays: [400, 1500],
    workingDayKm: [80, 140],
  },
  {
    name: 'Rigid truck 18 t',
    vehicleClass: 'heavy goods',
    description: 'Two-axle rigid box truck: steel leaf front, air rear. Wheel-station masses, unladen.',
    axles: [
      { label: 'front', sprungMassKg: 2400, unsprungMassKg: 450, springRateNPerM: 600000, dampingNsPerM: 28000, tireRateNPerM: 1600000, ratedDamperLifeKm: 150000 },
      { label: 'rear', sprungMassKg: 2100, unsprungMassKg: 650, springRateNPerM: 260000, dampingNsPerM: 20000, tireRateNPerM: 1800000, ratedDamperLifeKm: 150000 },
    ],
    count: 10,
    prefix: 'RT',
    payloadKg: [1500, 8000],
    grossKg: 18000,
    ageDays: [400, 1200],
    workingDayKm: [140, 220],
  },
];

export const DEPOTS = [
  { name: 'Brackenford North Yard', address: '4 Tanner Way, Brackenford', lat: 52.642, lon: -1.512 },
  { name: 'Millbrook Cross Depot', address: 'Unit 9, Weir Road, Millbrook', lat: 52.488, lon: -1.268 },
];

// No demo route is rougher than ISO 8608 class D (IRI up to about 25 m/km, a rough unpaved road):
// a parcel and freight fleet does not run on the IRI 35-70 m/km of classes E-F (docs/methods.md "Demo roads").
export const ROUTES: { name: string; depot: 0 | 1; lengthKm: number; speedKmh: number; heading: number; base: IsoClass; rough: IsoClass; source: RoughnessSource; description: string }[] = [
  { name: 'Tanner Way town loop', depot: 0, lengthKm: 14, speedKmh: 32, heading: 20, base: 'A', rough: 'B', source: 'stated', description: 'Town-centre drops on resurfaced streets.' },
  { name: 'Hollins Ridge farms', depot: 0, lengthKm: 38, speedKmh: 48, heading: 300, base: 'C', rough: 'D', source: 'survey', description: 'Farm deliveries over the ridge; long unsealed stretch past Hollins.' },
  { name: 'Quarry Lane aggregates', depot: 0, lengthKm: 22, speedKmh: 40, heading: 250, base: 'C', rough: 'D', source: 'survey', description: 'Truck run to the quarry; broken surface near the gate.' },
  { name: 'Northgate retail park', depot: 0, lengthKm: 18, speedKmh: 45, heading: 60, base: 'A', rough: 'B', source: 'stated', description: 'Retail park and ring road.' },
  { name: 'Eastwold villages', depot: 0, lengthKm: 42, speedKmh: 52, heading: 110, base: 'B', rough: 'D', source: 'stated', description: 'Village drops on B-roads.' },
  { name: 'Fenmarsh dyke road', depot: 0, lengthKm: 30, speedKmh: 55, heading: 170, base: 'C', rough: 'D', source: 'survey', description: 'Long straight dyke road with patched heave.' },
  { name: 'Millbrook high street', depot: 1, lengthKm: 12, speedKmh: 28, heading: 0, base: 'B', rough: 'C', source: 'stated', description: 'Town drops; cobbled section by the market.' },
  { name: 'Weir Road industrial', depot: 1, lengthKm: 16, speedKmh: 38, heading: 90, base: 'B', rough: 'C', source: 'stated', description: 'Industrial estate loop.' },
  { name: 'Coldharbour forestry track', depot: 1, lengthKm: 26, speedKmh: 35, heading: 200, base: 'C', rough: 'D', source: 'stated', description: 'Forestry contractor supplies; unsealed track.' },
  { name: 'Sedge Vale dairy run', depot: 1, lengthKm: 34, speedKmh: 50, heading: 140, base: 'B', rough: 'D', source: 'driver_report', description: 'Early dairy collections.' },
  { name: 'Ashby bypass express', depot: 1, lengthKm: 40, speedKmh: 72, heading: 320, base: 'A', rough: 'B', source: 'stated', description: 'Trunk road to the Ashby hub.' },
  { name: 'Kilnsey moor lanes', depot: 1, lengthKm: 36, speedKmh: 44, heading: 260, base: 'C', rough: 'D', source: 'survey', description: 'Moorland lanes with frost damage.' },
];

export const CLASSES: IsoClass[] = ['A', 'B', 'C', 'D', 'E', 'F', 'G', 'H'];

export const FIRST = ['Sam', 'Priya', 'Jonah', 'Lotte', 'Kwame', 'Aoife', 'Ravi', 'Marta', 'Olu', 'Freya', 'Dmitri', 'Hana', 'Callum', 'Ines', 'Tobias', 'Yara', 'Niall', 'Sade', 'Piotr', 'Mei', 'Ewan', 'Zainab', 'Hugo', 'Leah', 'Bram', 'Nadia', 'Ciaran', 'Ottilie', 'Femi', 'Greta'];
export const LAST = ['Whitlow', 'Nandakumar', 'Pryce', 'Vermeer', 'Asante', 'Kearney', 'Batra', 'Sokol', 'Adeyemi', 'Lund', 'Volkov', 'Sato', 'Dunmore', 'Larkin', 'Brandt', 'Haddad', 'Quill', 'Ojo', 'Nowak', 'Chen', 'Macrae', 'Bello', 'Ferrand', 'Ashworth', 'de Vries', 'Karimi', 'Boyle', 'Strand', 'Okoro', 'Holm'];
