/**
 * The demo fleet: Brackenford Parcel & Freight, a fictional regional carrier with two depots,
 * three suspension specs, 44 vehicles, 12 routes and 60 days of trips. Every number here is
 * invented for the demo (the suspension parameters sit inside the typical ranges of
 * shared docs/methods.md "Typical parameters"); deterministic for a given "today".
 */
import { addDays, formatISO, startOfDay, subDays } from 'date-fns';
import type { CreationAttributes } from 'sequelize';
import type { Db } from '../db/index';
import path from 'node:path';
import fs from 'node:fs';
import {
  Damper,
  Depot,
  RoadSurvey,
  Inspection,
  RoughnessObservation,
  Route,
  RouteSegment,
  SpecAxle,
  SuspensionSpec,
  Trip,
  User,
  Vehicle,
  WorkRecord,
  type RoughnessSource,
} from '../db/models';
import { hashPassword } from '../users/service';
import { lineLengthM, splitLine, type LonLat } from '../roads/geometry';
import { classifyGd, gdForClass, seededRandom, synthesizeProfile, type IsoClass } from '../physics/iso8608';
import { gdFromIri, iriFromGd, iriSegments } from '../physics/iri';
import { formatProfileCsv, storeProfileFile, SURVEY_DIR } from '../roads/profile-store';
import { currentValue } from '../roads/current-roughness';
import { DEMO_LIFE_LAWS, ROUGH_FROM_CLASS, simulateAxleHistory, type DemoDamperSpan } from './history';

/** Sample interval of the demo survey profiles [m] (ASTM E1926's 250 mm). */
const DEMO_SURVEY_DX_M = 0.25;

/**
 * A demo survey profile for a route: each segment's stretch is synthesised with the ISO 8608
 * random-phase method at that segment's Gd(n0) (seeded per route and segment), joined by
 * adding up each stretch's increments so the profile has no steps at the joins. Elevations are
 * rounded to 1 µm, as the file stores them.
 */
function demoSurveyProfile(segs: { startM: number; endM: number; gdN0: number }[], seed: number): Float64Array {
  const dx = DEMO_SURVEY_DX_M;
  const totalM = segs[segs.length - 1].endM;
  const n = Math.floor(totalM / dx + 1e-9) + 1;
  const z = new Float64Array(n);
  let i = 1;
  for (const [k, seg] of segs.entries()) {
    const last = k === segs.length - 1 ? n - 1 : Math.min(n - 1, Math.ceil(seg.endM / dx - 1e-9));
    const count = last - i + 1;
    if (count <= 0) continue;
    const part = synthesizeProfile({ gdN0: seg.gdN0, lengthM: count * dx, dxM: dx, seed: seed * 10_000 + k });
    for (let j = 1; j <= count; j++, i++) z[i] = z[i - 1] + (part[j] - part[j - 1]);
  }
  for (let j = 0; j < n; j++) z[j] = Math.round(z[j] * 1e6) / 1e6;
  return z;
}

export const DEMO_PASSWORD = 'reboundry-demo';

const day = (d: Date) => formatISO(d, { representation: 'date' });

interface SpecSeed {
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
const MAX_TRIP_HOURS = 7;

/** Mass of a driver allowed for when capping the payload [kg] (assumption). */
const DRIVER_KG = 75;

/** The largest payload that keeps a vehicle of a spec within its gross mass [kg]: gross − unladen − driver. */
export function maxPayloadKg(spec: Pick<SpecSeed, 'axles' | 'grossKg'>): number {
  const unladen = spec.axles.reduce((a, x) => a + 2 * (x.sprungMassKg + x.unsprungMassKg), 0);
  return spec.grossKg - unladen - DRIVER_KG;
}

const SPECS: SpecSeed[] = [
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

const DEPOTS = [
  { name: 'Brackenford North Yard', address: '4 Tanner Way, Brackenford', lat: 52.642, lon: -1.512 },
  { name: 'Millbrook Cross Depot', address: 'Unit 9, Weir Road, Millbrook', lat: 52.488, lon: -1.268 },
];

// No demo route is rougher than ISO 8608 class D (IRI up to about 25 m/km, a rough unpaved road):
// a parcel and freight fleet does not run on the IRI 35-70 m/km of classes E-F (docs/methods.md "Demo roads").
const ROUTES: { name: string; depot: 0 | 1; lengthKm: number; speedKmh: number; heading: number; base: IsoClass; rough: IsoClass; source: RoughnessSource; description: string }[] = [
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

const CLASSES: IsoClass[] = ['A', 'B', 'C', 'D', 'E', 'F', 'G', 'H'];

const FIRST = ['Sam', 'Priya', 'Jonah', 'Lotte', 'Kwame', 'Aoife', 'Ravi', 'Marta', 'Olu', 'Freya', 'Dmitri', 'Hana', 'Callum', 'Ines', 'Tobias', 'Yara', 'Niall', 'Sade', 'Piotr', 'Mei', 'Ewan', 'Zainab', 'Hugo', 'Leah', 'Bram', 'Nadia', 'Ciaran', 'Ottilie', 'Femi', 'Greta'];
const LAST = ['Whitlow', 'Nandakumar', 'Pryce', 'Vermeer', 'Asante', 'Kearney', 'Batra', 'Sokol', 'Adeyemi', 'Lund', 'Volkov', 'Sato', 'Dunmore', 'Larkin', 'Brandt', 'Haddad', 'Quill', 'Ojo', 'Nowak', 'Chen', 'Macrae', 'Bello', 'Ferrand', 'Ashworth', 'de Vries', 'Karimi', 'Boyle', 'Strand', 'Okoro', 'Holm'];

/** Walks a gently curving polyline of `lengthKm` from a depot and back towards it (a loop). */
function routeLine(rand: () => number, start: LonLat, headingDeg: number, lengthKm: number): LonLat[] {
  const pts: LonLat[] = [start];
  const stepM = 250;
  const steps = Math.round((lengthKm * 1000) / stepM);
  let heading = (headingDeg * Math.PI) / 180;
  let [lon, lat] = start;
  const mPerDegLat = 111_195;
  for (let i = 1; i <= steps; i++) {
    // turn back over the second half so the route returns near the depot
    const back = i > steps / 2 ? Math.PI / (steps / 2) : 0;
    heading += (rand() - 0.5) * 0.35 + back;
    lat += (Math.cos(heading) * stepM) / mPerDegLat;
    lon += (Math.sin(heading) * stepM) / (mPerDegLat * Math.cos((lat * Math.PI) / 180));
    pts.push([Math.round(lon * 1e6) / 1e6, Math.round(lat * 1e6) / 1e6]);
  }
  return pts;
}

/**
 * Empties every table the migrations made (all but the migration log), for `seed --reset`, and
 * removes the files the app keeps under its data folder (surveys, photos, attachments).
 */
export async function clearAll(db: Db, dataDir: string = path.dirname(db.file)) {
  const [rows] = await db.sequelize.query(
    `SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' AND name <> 'schema_migrations'`,
  );
  await db.sequelize.transaction(async (transaction) => {
    // checked at commit, when every table is empty, so the order of the deletes does not matter
    await db.sequelize.query('PRAGMA defer_foreign_keys = ON', { transaction });
    for (const { name } of rows as { name: string }[]) await db.sequelize.query(`DELETE FROM "${name}"`, { transaction });
    await db.sequelize.query(`DELETE FROM sqlite_sequence`, { transaction }).catch(() => undefined);
  });
  // only the app's own folders: DATA_DIR may hold other things
  for (const dir of [SURVEY_DIR, 'attachments', 'ride-photos']) fs.rmSync(path.join(dataDir, dir), { recursive: true, force: true });
}

export async function isEmpty(): Promise<boolean> {
  return (await User.count()) === 0;
}

/**
 * Seeds the demo fleet into an empty, migrated database. `now` fixes "today". Survey profile
 * files go under `dataDir` (default: the database file's folder, i.e. DATA_DIR).
 */
export async function seedDemo(db: Db, now: Date = new Date(), dataDir: string = path.dirname(db.file)) {
  fs.mkdirSync(path.join(dataDir, SURVEY_DIR), { recursive: true });
  const rand = seededRandom(20261201);
  const today = startOfDay(now);
  const pw = await hashPassword(DEMO_PASSWORD);

  await db.sequelize.transaction(async (transaction) => {
    const opts = { transaction };
    const depots = await Depot.bulkCreate(DEPOTS, { ...opts, returning: true });

    await User.bulkCreate(
      [
        { name: 'Maren Okafor', email: 'manager@reboundry.test', role: 'manager', passwordHash: pw, depotId: null },
        { name: 'Tomasz Reyes', email: 'mechanic@reboundry.test', role: 'mechanic', passwordHash: pw, depotId: depots[0].id },
        { name: 'Ines Garland', email: 'mechanic.millbrook@reboundry.test', role: 'mechanic', passwordHash: pw, depotId: depots[1].id },
      ],
      opts,
    );
    const drivers = await User.bulkCreate(
      FIRST.map((f, i) => ({
        name: `${f} ${LAST[i]}`,
        email: i === 0 ? 'driver@reboundry.test' : `${f.toLowerCase()}.${LAST[i].toLowerCase().replace(/[^a-z]/g, '')}@reboundry.test`,
        role: 'driver' as const,
        passwordHash: pw,
        depotId: depots[i % 2].id,
      })),
      { ...opts, returning: true },
    );

    // Specs and axles
    const specs: { row: SuspensionSpec; seed: SpecSeed }[] = [];
    for (const s of SPECS) {
      const row = await SuspensionSpec.create({ name: s.name, vehicleClass: s.vehicleClass, description: s.description }, opts);
      await SpecAxle.bulkCreate(
        s.axles.map((a, axleIndex) => ({ ...a, axleIndex, specId: row.id })),
        opts,
      );
      specs.push({ row, seed: s });
    }

    // Routes, segments and roughness
    const routeRows: { route: Route; depotIdx: number; speedKmh: number; roughShare: number }[] = [];
    for (const r of ROUTES) {
      const depot = DEPOTS[r.depot];
      const line = routeLine(rand, [depot.lon, depot.lat], r.heading, r.lengthKm);
      const lengthM = lineLengthM(line);
      const route = await Route.create(
        {
          name: r.name,
          description: r.description,
          depotId: depots[r.depot].id,
          geometry: JSON.stringify({ type: 'LineString', coordinates: line }),
          lengthM,
          defaultSpeedKmh: r.speedKmh,
          segmentLengthM: 100,
        },
        opts,
      );
      const routeRow = { route, depotIdx: r.depot, speedKmh: r.speedKmh, roughShare: 0 };
      routeRows.push(routeRow);
      const segs = splitLine(line, 100);
      const baseIdx = CLASSES.indexOf(r.base);
      const roughIdx = CLASSES.indexOf(r.rough);
      // one rough stretch of 10–30 % of the route, somewhere past the first fifth
      const stretchStart = Math.floor(segs.length * (0.2 + rand() * 0.4));
      const stretchEnd = stretchStart + Math.floor(segs.length * (0.1 + rand() * 0.2));
      const surveyDate = day(subDays(today, 20 + Math.floor(rand() * 200)));
      const statedDate = day(subDays(today, 300 + Math.floor(rand() * 300)));
      const segRows = segs.map((s) => {
        const inStretch = s.seq >= stretchStart && s.seq < stretchEnd;
        const statedClass = CLASSES[inStretch ? roughIdx : baseIdx];
        const source: RoughnessSource = r.source === 'driver_report' && !inStretch ? 'stated' : r.source;
        // A survey measures IRI, a continuous value: spread around the class (log scale);
        // Gd(n0) and the class follow from it. A stated class carries the class's mean Gd(n0).
        const iri = source === 'survey' ? Math.round(iriFromGd(gdForClass(statedClass)) * Math.pow(2, (rand() - 0.5) * 0.8) * 100) / 100 : null;
        const gd = iri !== null ? gdFromIri(iri) : gdForClass(statedClass);
        const cls = iri !== null ? classifyGd(gd) : statedClass;
        return {
          routeId: route.id,
          seq: s.seq,
          startM: s.startM,
          endM: s.endM,
          geometry: JSON.stringify(s.coords),
          speedKmh: inStretch ? Math.max(20, r.speedKmh - 15) : null,
          gdN0: gd,
          iri,
          isoClass: cls,
          roughnessSource: source,
          roughnessDate: source === 'survey' ? surveyDate : source === 'driver_report' ? day(subDays(today, 12)) : statedDate,
        };
      });
      let surveyId: number | null = null;
      if (r.source === 'survey') {
        // A stored profile for the surveyed route; each segment's IRI is what the golden car
        // reads on it, and Gd(n0) and the class follow from that IRI.
        const profile = demoSurveyProfile(
          segRows.map((s) => ({ startM: s.startM, endM: s.endM, gdN0: s.gdN0 })),
          route.id,
        );
        const bins = iriSegments(profile, DEMO_SURVEY_DX_M, 100);
        for (const s of segRows) {
          const mine = bins.filter((b) => b.startM >= s.startM - 1e-6 && b.startM < s.endM - 1e-6);
          const w = mine.reduce((a, b) => a + (b.endM - b.startM), 0);
          const iriSeg = mine.reduce((a, b) => a + b.iri * (b.endM - b.startM), 0) / w;
          s.iri = Math.round(iriSeg * 1000) / 1000;
          s.gdN0 = gdFromIri(s.iri, DEMO_SURVEY_DX_M); // K of the interval the IRI was read at (docs/methods.md "IRI and Gd(n0)")
          s.isoClass = classifyGd(s.gdN0);
        }
        const file = storeProfileFile(
          dataDir,
          formatProfileCsv({ dxM: DEMO_SURVEY_DX_M, startM: 0, elevationsM: profile }, `Demo profile survey of ${r.name} (synthesised, ISO 8608 random-phase method)`),
          `demo-route-${route.id}.csv`,
        );
        const survey = await RoadSurvey.create(
          {
            routeId: route.id,
            filePath: file,
            originalName: `${r.name.toLowerCase().replace(/[^a-z0-9]+/g, '-')}-profile.csv`,
            dxM: DEMO_SURVEY_DX_M,
            startM: 0,
            endM: (profile.length - 1) * DEMO_SURVEY_DX_M,
            pointCount: profile.length,
            surveyedOn: surveyDate,
            note: 'Demo survey (synthesised profile)',
            uploadedById: null,
            uploadedAt: new Date(`${surveyDate}T15:00:00Z`),
          },
          opts,
        );
        surveyId = survey.id;
      }
      // each segment's observations: its own, and an older stated class under surveyed and
      // reported segments so history shows
      const history = segRows.map((s) => {
        const own = {
          iri: s.roughnessSource === 'survey' ? s.iri : null,
          gdN0: s.gdN0,
          isoClass: s.isoClass,
          source: s.roughnessSource,
          observedOn: s.roughnessDate,
          surveyId: s.roughnessSource === 'survey' ? surveyId : null,
          note:
            s.roughnessSource === 'survey'
              ? 'Profile survey (demo)'
              : s.roughnessSource === 'driver_report'
                ? 'Accepted from drivers’ reports (demo)'
                : 'Class stated from the highway authority’s condition map (demo)',
        };
        const older = { iri: null, gdN0: gdForClass(r.base), isoClass: r.base, source: 'stated' as const, observedOn: statedDate, surveyId: null, note: 'Class stated from the highway authority’s condition map (demo)' };
        return s.roughnessSource === 'stated' ? [own] : [older, own];
      });
      // the stored current value follows the current-value rule over them (drivers' reports
      // blended in at half a survey's weight), as the app keeps it
      for (const [i, s] of segRows.entries()) {
        const cur = currentValue(history[i].map((o, k) => ({ ...o, id: k + 1 })), classifyGd, iriFromGd)!;
        Object.assign(s, { gdN0: cur.gdN0, iri: cur.iri, isoClass: cur.isoClass, roughnessSource: cur.source, roughnessDate: cur.observedOn });
      }
      // share of the route's length on class C or rougher (the demo's removal law reads it)
      routeRow.roughShare = segRows.reduce((a, x) => a + (CLASSES.indexOf(x.isoClass as IsoClass) >= CLASSES.indexOf(ROUGH_FROM_CLASS) ? x.endM - x.startM : 0), 0) / lengthM;
      const created = await RouteSegment.bulkCreate(
        segRows.map((s) => ({ ...s, surveyId: s.roughnessSource === 'survey' ? surveyId : null })),
        { ...opts, returning: true },
      );
      await RoughnessObservation.bulkCreate(
        created.flatMap((seg, i) => history[i].map((o) => ({ ...o, segmentId: seg.id, recordedById: null }))),
        opts,
      );
    }

    // Vehicles. Each has a daily distance of its own (km per working day); its odometer before
    // the trips on record grew at the rate its trips on record show.
    let vehicleNo = 0;
    const vehicles: { v: Vehicle; spec: SpecSeed; depotIdx: number; workingDayKm: number }[] = [];
    for (const { row, seed } of specs) {
      for (let i = 0; i < seed.count; i++) {
        const depotIdx = vehicleNo % 2;
        const commissioned = subDays(today, seed.ageDays[0] + Math.floor(rand() * (seed.ageDays[1] - seed.ageDays[0])));
        const workingDayKm = seed.workingDayKm[0] + rand() * (seed.workingDayKm[1] - seed.workingDayKm[0]);
        const v = await Vehicle.create(
          {
            fleetNumber: `${seed.prefix}-${String(101 + i)}`,
            plate: `BK${String(20 + (vehicleNo % 6))} ${String.fromCharCode(65 + (vehicleNo % 26))}${String.fromCharCode(66 + ((vehicleNo * 7) % 24))}${String.fromCharCode(67 + ((vehicleNo * 3) % 23))}`,
            specId: row.id,
            depotId: depots[depotIdx].id,
            driverId: vehicleNo < drivers.length ? drivers[vehicleNo].id : null,
            odometerKm: 0, // set below, from the trips
            status: vehicleNo === 7 ? 'workshop' : vehicleNo === 40 ? 'retired' : 'in_service',
            commissionedAt: day(commissioned),
          },
          opts,
        );
        vehicles.push({ v, spec: seed, depotIdx, workingDayKm });
        vehicleNo++;
      }
    }

    // Trips: one a working day per vehicle, a day's work on one route — the loop driven as many
    // times as the vehicle's daily distance needs. Payload within the vehicle's gross mass.
    const tripRows: CreationAttributes<Trip>[] = [];
    const kmByVehicle = new Map<number, number>();
    const roughKmByVehicle = new Map<number, number>();
    for (const [vi, { v, spec, depotIdx, workingDayKm }] of vehicles.entries()) {
      if (v.status === 'retired') continue;
      const myRoutes = routeRows.filter((r) => r.depotIdx === depotIdx && (spec.prefix === 'RT' ? true : !r.route.name.includes('aggregates')));
      const favourite = myRoutes[vi % myRoutes.length];
      const afternoonDriver = v.driverId ? null : drivers[(vi - drivers.length) * 2 % drivers.length];
      const [pmin, pmax] = spec.payloadKg;
      const payloadCap = Math.min(pmax, maxPayloadKg(spec));
      let km = 0;
      let roughKm = 0;
      for (let d = 60; d >= 1; d--) {
        const date = subDays(today, d);
        const dow = date.getUTCDay();
        if (dow === 0 || dow === 6) continue;
        if (v.status === 'workshop' && d < 4) continue;
        if (rand() < 0.08) continue; // days off, holidays
        const r = rand() < 0.7 ? favourite : myRoutes[Math.floor(rand() * myRoutes.length)];
        const speed = Math.round(r.speedKmh * (0.85 + rand() * 0.25) * 10) / 10;
        const loopKm = r.route.lengthM / 1000;
        // at most MAX_TRIP_HOURS at the day's speed, so a driver's morning and afternoon shifts do not overlap
        const rounds = Math.max(1, Math.min(Math.floor((MAX_TRIP_HOURS * speed) / loopKm), Math.round((workingDayKm * (0.85 + rand() * 0.3)) / loopKm)));
        const distanceKm = Math.round(loopKm * rounds * 10) / 10;
        const hours = distanceKm / speed;
        const startMin = afternoonDriver ? 14 * 60 + Math.floor(rand() * 60) : 5 * 60 + 30 + Math.floor(rand() * 90);
        const startedAt = new Date(date.getTime() + startMin * 60_000);
        const endedAt = new Date(startedAt.getTime() + hours * 3_600_000);
        tripRows.push({
          vehicleId: v.id,
          routeId: r.route.id,
          driverId: v.driverId ?? afternoonDriver?.id ?? null,
          startedAt,
          endedAt,
          distanceKm,
          meanSpeedKmh: speed,
          payloadKg: Math.round(pmin + rand() * (payloadCap - pmin)),
        });
        km += distanceKm;
        roughKm += distanceKm * r.roughShare;
      }
      kmByVehicle.set(v.id, km);
      roughKmByVehicle.set(v.id, roughKm);
    }
    await Trip.bulkCreate(tripRows, opts);

    // Odometers and damper histories (docs/methods.md, "Demo fleet").
    const mechanicOf = [
      (await User.findOne({ where: { email: 'mechanic@reboundry.test' }, ...opts }))!.id,
      (await User.findOne({ where: { email: 'mechanic.millbrook@reboundry.test' }, ...opts }))!.id,
    ];
    const recordsStart = subDays(today, 60);
    const DAY_MS = 86_400_000;
    const tripsOf = new Map<number, { at: number; km: number }[]>();
    for (const t of tripRows) {
      if (!tripsOf.has(t.vehicleId)) tripsOf.set(t.vehicleId, []);
      tripsOf.get(t.vehicleId)!.push({ at: (t.startedAt as Date).getTime(), km: t.distanceKm });
    }
    for (const [vi, { v, spec, depotIdx, workingDayKm }] of vehicles.entries()) {
      const trips = (tripsOf.get(v.id) ?? []).sort((a, b) => a.at - b.at);
      const recordedKm = kmByVehicle.get(v.id) ?? 0;
      const commissioned = new Date(`${v.commissionedAt!}T00:00:00Z`).getTime();
      const retired = v.status === 'retired';
      // km per calendar day: the rate of its trips on record; a retired vehicle, its working-day
      // distance over the working days of the records (5 in 7, less 8 % days off)
      const kmPerDay = retired ? (workingDayKm * 5 * 0.92) / 7 : recordedKm / 60;
      const retiredOn = retired ? subDays(recordsStart, 45).getTime() : null;
      const lastDay = retiredOn ?? recordsStart.getTime();
      const startOdo = Math.round((kmPerDay * Math.max(0, lastDay - commissioned)) / DAY_MS);
      const odoNow = Math.round(startOdo + recordedKm);
      await v.update({ odometerKm: odoNow }, opts);
      /** Odometer at the start of a day: before the records at the steady rate, in them from the trips. */
      const odoAt = (when: number) => {
        if (when <= commissioned) return 0;
        if (when >= recordsStart.getTime() && !retired) return Math.round(odoNow - trips.reduce((sum, t) => sum + (t.at >= when ? t.km : 0), 0));
        return Math.min(startOdo, Math.round((kmPerDay * (when - commissioned)) / DAY_MS));
      };
      /** The first day starting at or past an odometer reading (removals are done that day). */
      const dayAtKm = (km: number): number => {
        if (km <= 0) return commissioned;
        if (km <= startOdo) return Math.min(commissioned + Math.ceil(km / kmPerDay) * DAY_MS, lastDay - DAY_MS);
        let odo = startOdo;
        for (const t of trips) {
          odo += t.km;
          if (odo >= km) return startOfDay(new Date(t.at + DAY_MS)).getTime();
        }
        return today.getTime();
      };
      // its route mix: the share of its km on class C or rougher (the retired vehicle, with no
      // trips on record, is given a quarter)
      const roughShare = retired ? 0.25 : recordedKm > 0 ? roughKmByVehicle.get(v.id)! / recordedKm : 0;
      const law = DEMO_LIFE_LAWS[spec.prefix];
      const mechanicId = mechanicOf[depotIdx];
      let doneInspectionAt = 0;
      for (const [axleIndex, axle] of spec.axles.entries()) {
        const positions: [string, string] = axleIndex === 0 ? ['FL', 'FR'] : ['RL', 'RR'];
        const { spans, visits } = simulateAxleHistory(rand, law, roughShare, odoNow, positions);
        // one work record (and, for wear, the inspection that found it) per workshop visit
        const records: number[] = [];
        for (const visit of visits) {
          const when = new Date(dayAtKm(visit.km) + 10 * 3_600_000);
          const odo = odoAt(startOfDay(when).getTime());
          const removed = spans.filter((x) => x.visit === records.length);
          const causeReason = removed.find((x) => x.position === visit.cause)?.reason ?? '';
          const where = `${axle.label} ${visit.cause ?? ''}`.trim();
          let inspectionId: number | null = null;
          if (visit.kind === 'wear') {
            const reason =
              causeReason === 'worn: low adhesion'
                ? `Interval check on the test lane (${where}).`
                : causeReason === 'leaking'
                  ? `Driver reported oil on the ${where} damper.`
                  : `Driver reported a knock from the ${axle.label} axle.`;
            const insp = await Inspection.create(
              { vehicleId: v.id, dueDate: day(subDays(when, 2)), status: 'done', reason, trigger: 'manual', assigneeId: mechanicId, completedAt: when, odometerKm: odo, notes: `${where} damper ${causeReason}; replaced${removed.length > 1 ? ' as a pair' : ''}.` },
              opts,
            );
            inspectionId = insp.id;
            doneInspectionAt = Math.max(doneInspectionAt, when.getTime());
          }
          const summary =
            visit.kind === 'other_work'
              ? `${axle.label[0].toUpperCase()}${axle.label.slice(1)} springs and bushes renewed; dampers renewed with them.`
              : `Replaced ${removed.length > 1 ? `${axle.label} dampers (pair)` : `${where} damper`}${visit.kind === 'accident' ? ' after accident damage' : ''}.`;
          const wr = await WorkRecord.create(
            { vehicleId: v.id, inspectionId, mechanicId, performedAt: when, odometerKm: odo, summary, partsCost: (spec.prefix === 'RT' ? 206 : 93) * removed.length, labourHours: (spec.prefix === 'RT' ? 1.3 : 0.6) * removed.length },
            opts,
          );
          records.push(wr.id);
        }
        // the dampers, in the order they were fitted on each corner
        let aftermarket = 0;
        const idOf = new Map<DemoDamperSpan, { id: number; partNumber: string | null }>();
        for (const x of spans) {
          const fittedOn = dayAtKm(x.fittedKm);
          const removedOn = x.removedKm !== null ? dayAtKm(x.removedKm) : retired ? retiredOn : null;
          const d = await Damper.create(
            {
              vehicleId: v.id,
              position: x.position,
              axleIndex,
              partNumber: x.fittedKm === 0 ? `${spec.prefix}-D${axleIndex}-OE` : `${spec.prefix}-D${axleIndex}-AM${++aftermarket}`,
              installedAt: day(new Date(fittedOn)),
              installedOdometerKm: x.fittedKm === 0 ? 0 : odoAt(fittedOn),
              removedAt: removedOn !== null ? day(new Date(removedOn)) : null,
              removedOdometerKm: removedOn !== null ? odoAt(removedOn) : null,
              removalReason: x.reason ?? (retired ? 'vehicle retired' : null),
              removedByWorkRecordId: x.visit !== null ? records[x.visit] : null,
            },
            opts,
          );
          idOf.set(x, { id: d.id, partNumber: d.partNumber ?? null });
        }
        const items = [];
        for (const x of spans) {
          if (x.visit === null) continue;
          const successor = spans.find((y) => y.position === x.position && y.fittedKm === x.removedKm);
          const next = successor ? idOf.get(successor)! : null;
          items.push([records[x.visit], x.position, axleIndex, 'damper', `${axle.label} damper`, next?.partNumber ?? null, spec.prefix === 'RT' ? 206 : 93, x.reason, idOf.get(x)!.id, next?.id ?? null]);
        }
        if (items.length) {
          const stamp = now.toISOString();
          await db.sequelize.query(
            `INSERT INTO work_record_items (work_record_id, position, axle_index, component, part_description, part_number, cost, removal_reason, removed_damper_id, installed_damper_id, created_at, updated_at)
             VALUES ${items.map(() => '(?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)').join(', ')}`,
            { replacements: items.flatMap((it) => [...it, stamp, stamp]), transaction },
          );
        }
      }
      if (!retired && today.getTime() - doneInspectionAt > 320 * DAY_MS) {
        // an ordinary check some time in the last year, so the interval rule is spread out
        const doneOn = subDays(today, 25 + ((vi * 53) % 320));
        await Inspection.create(
          {
            vehicleId: v.id,
            dueDate: day(subDays(doneOn, 1)),
            status: 'done',
            reason: 'Interval rule: 12 months since the last inspection.',
            trigger: 'interval_months',
            assigneeId: mechanicId,
            completedAt: doneOn,
            odometerKm: odoAt(startOfDay(doneOn).getTime()),
            notes: 'All corners within limits on the test lane.',
          },
          opts,
        );
      }
      if (vi % 9 === 2 && !retired) {
        await Inspection.create(
          {
            vehicleId: v.id,
            dueDate: day(addDays(today, 5 + (vi % 20))),
            status: 'scheduled',
            reason: "Booked by hand with the vehicle's annual service.",
            trigger: 'manual',
            assigneeId: null,
            completedAt: null,
            odometerKm: null,
            notes: null,
          },
          opts,
        );
      }
    }
  });
}
