/**
 * The demo fleet: Brackenford Parcel & Freight, a fictional regional carrier with two depots,
 * three suspension specs, 44 vehicles, 12 routes and 60 days of trips. Every number here is
 * invented for the demo (the suspension parameters sit inside the typical ranges of
 * shared physics.md §6); deterministic for a given "today".
 */
import { addDays, formatISO, startOfDay, subDays } from 'date-fns';
import type { CreationAttributes } from 'sequelize';
import type { Db } from './index';
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
} from './models';
import { hashPassword } from '../users/service';
import { lineLengthM, splitLine, type LonLat } from '../roads/geometry';
import { classifyGd, gdForClass, seededRandom, synthesizeProfile, type IsoClass } from '../physics/iso8608';
import { gdFromIri, iriFromGd, iriSegments } from '../physics/iri';
import { formatProfileCsv, storeProfileFile, SURVEY_DIR } from '../roads/profile-store';

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
    const routeRows: { route: Route; depotIdx: number; speedKmh: number }[] = [];
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
      routeRows.push({ route, depotIdx: r.depot, speedKmh: r.speedKmh });
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
      const created = await RouteSegment.bulkCreate(
        segRows.map((s) => ({ ...s, surveyId: s.roughnessSource === 'survey' ? surveyId : null })),
        { ...opts, returning: true },
      );
      const obs = created.map((seg, i) => ({
        segmentId: seg.id,
        iri: segRows[i].roughnessSource === 'survey' ? segRows[i].iri : null,
        gdN0: segRows[i].gdN0,
        isoClass: segRows[i].isoClass,
        source: segRows[i].roughnessSource,
        observedOn: segRows[i].roughnessDate,
        recordedById: null,
        surveyId: segRows[i].roughnessSource === 'survey' ? surveyId : null,
        note:
          segRows[i].roughnessSource === 'survey'
            ? 'Profile survey (demo)'
            : segRows[i].roughnessSource === 'driver_report'
              ? 'Accepted from drivers’ reports (demo)'
              : 'Class stated from the highway authority’s condition map (demo)',
      }));
      // older stated class under surveyed and reported segments, so history shows
      const older = created
        .filter((_, i) => segRows[i].roughnessSource !== 'stated')
        .map((seg) => ({
          segmentId: seg.id,
          iri: null,
          gdN0: gdForClass(r.base),
          isoClass: r.base,
          source: 'stated' as const,
          observedOn: statedDate,
          recordedById: null,
          note: 'Class stated from the highway authority’s condition map (demo)',
        }));
      await RoughnessObservation.bulkCreate([...older, ...obs], opts);
    }

    // Vehicles, dampers, trips
    let vehicleNo = 0;
    const vehicles: { v: Vehicle; spec: SpecSeed; depotIdx: number }[] = [];
    for (const { row, seed } of specs) {
      for (let i = 0; i < seed.count; i++) {
        const depotIdx = vehicleNo % 2;
        const commissioned = subDays(today, 400 + Math.floor(rand() * 1100));
        const ageDays = Math.round((today.getTime() - commissioned.getTime()) / 86_400_000);
        const kmPerDay = 45 + rand() * 55;
        const startOdo = Math.round((ageDays - 60) * kmPerDay);
        const v = await Vehicle.create(
          {
            fleetNumber: `${seed.prefix}-${String(101 + i)}`,
            plate: `BK${String(20 + (vehicleNo % 6))} ${String.fromCharCode(65 + (vehicleNo % 26))}${String.fromCharCode(66 + ((vehicleNo * 7) % 24))}${String.fromCharCode(67 + ((vehicleNo * 3) % 23))}`,
            specId: row.id,
            depotId: depots[depotIdx].id,
            driverId: vehicleNo < drivers.length ? drivers[vehicleNo].id : null,
            odometerKm: startOdo,
            status: vehicleNo === 7 ? 'workshop' : vehicleNo === 40 ? 'retired' : 'in_service',
            commissionedAt: day(commissioned),
          },
          opts,
        );
        vehicles.push({ v, spec: seed, depotIdx });
        vehicleNo++;
      }
    }

    const tripRows: CreationAttributes<Trip>[] = [];
    const kmByVehicle = new Map<number, number>();
    for (const [vi, { v, spec, depotIdx }] of vehicles.entries()) {
      if (v.status === 'retired') continue;
      const myRoutes = routeRows.filter((r) => r.depotIdx === depotIdx && (spec.prefix === 'RT' ? true : !r.route.name.includes('aggregates')));
      const favourite = myRoutes[vi % myRoutes.length];
      const afternoonDriver = v.driverId ? null : drivers[(vi - drivers.length) * 2 % drivers.length];
      let km = 0;
      for (let d = 60; d >= 1; d--) {
        const date = subDays(today, d);
        const dow = date.getUTCDay();
        if (dow === 0 || dow === 6) continue;
        if (v.status === 'workshop' && d < 4) continue;
        if (rand() < 0.08) continue; // days off, holidays
        const r = rand() < 0.7 ? favourite : myRoutes[Math.floor(rand() * myRoutes.length)];
        const speed = Math.round(r.speedKmh * (0.85 + rand() * 0.25) * 10) / 10;
        const distanceKm = Math.round((r.route.lengthM / 1000) * 10) / 10;
        const hours = distanceKm / speed;
        const startMin = afternoonDriver ? 13 * 60 + 30 + Math.floor(rand() * 60) : 6 * 60 + 30 + Math.floor(rand() * 90);
        const startedAt = new Date(date.getTime() + startMin * 60_000);
        const endedAt = new Date(startedAt.getTime() + hours * 3_600_000);
        const [pmin, pmax] = spec.payloadKg;
        tripRows.push({
          vehicleId: v.id,
          routeId: r.route.id,
          driverId: v.driverId ?? afternoonDriver?.id ?? null,
          startedAt,
          endedAt,
          distanceKm,
          meanSpeedKmh: speed,
          payloadKg: Math.round(pmin + rand() * (pmax - pmin)),
        });
        km += distanceKm;
      }
      kmByVehicle.set(v.id, km);
    }
    await Trip.bulkCreate(tripRows, opts);

    // Dampers with a little history: some corners were replaced, with the old unit's reason.
    const reasons = ['leaking', 'low adhesion on test lane', 'worn: fading', 'mount damage', 'leaking'];
    const mechanicId = (await User.findOne({ where: { email: 'mechanic@reboundry.test' }, ...opts }))!.id;
    // The odometer at a past moment: during the 60 days of trips on record, now less the trips
    // since; before them, at the vehicle's earlier daily distance back from the first day on record.
    const recordsStart = subDays(today, 60);
    const tripsOf = new Map<number, { at: number; km: number }[]>();
    for (const t of tripRows) {
      if (!tripsOf.has(t.vehicleId)) tripsOf.set(t.vehicleId, []);
      tripsOf.get(t.vehicleId)!.push({ at: (t.startedAt as Date).getTime(), km: t.distanceKm });
    }
    for (const [vi, { v, spec }] of vehicles.entries()) {
      const startOdo = v.odometerKm;
      const odoNow = startOdo + (kmByVehicle.get(v.id) ?? 0);
      await v.update({ odometerKm: Math.round(odoNow) }, opts);
      const daysBeforeRecords = Math.max(1, (recordsStart.getTime() - new Date(v.commissionedAt!).getTime()) / 86_400_000);
      const kmPerDay = startOdo / daysBeforeRecords;
      const odoAt = (when: Date) => {
        if (when >= recordsStart) return Math.round(odoNow - (tripsOf.get(v.id) ?? []).reduce((sum, t) => sum + (t.at >= when.getTime() ? t.km : 0), 0));
        return Math.max(0, Math.round(startOdo - (kmPerDay * (recordsStart.getTime() - when.getTime())) / 86_400_000));
      };
      const positions = spec.axles.map((a, axleIndex) => [
        { position: axleIndex === 0 ? 'FL' : 'RL', axleIndex },
        { position: axleIndex === 0 ? 'FR' : 'RR', axleIndex },
      ]).flat();
      const replaced = vi % 4 === 1; // a quarter of the fleet had one axle redone
      let work: WorkRecord | null = null;
      const replacedAxle = vi % 3 === 0 ? 0 : 1;
      const replacedOn = subDays(today, 30 + (vi * 37) % 300);
      const replacedOdo = odoAt(replacedOn);
      if (replaced) {
        const insp = await Inspection.create(
          {
            vehicleId: v.id,
            dueDate: day(subDays(replacedOn, 2)),
            status: 'done',
            reason: `Driver reported a knock from the ${replacedAxle === 0 ? 'front' : 'rear'} axle; booked for the test lane.`,
            trigger: 'manual',
            assigneeId: mechanicId,
            completedAt: replacedOn,
            odometerKm: replacedOdo,
            notes: `${replacedAxle === 0 ? 'Front' : 'Rear'} axle dampers below 40 % adhesion; replaced as a pair.`,
          },
          opts,
        );
        work = await WorkRecord.create(
          {
            vehicleId: v.id,
            inspectionId: insp.id,
            mechanicId,
            performedAt: replacedOn,
            odometerKm: replacedOdo,
            summary: `Replaced ${spec.axles[replacedAxle].label} dampers (pair).`,
            partsCost: spec.prefix === 'RT' ? 412 : 186,
            labourHours: spec.prefix === 'RT' ? 2.5 : 1.2,
          },
          opts,
        );
      }
      const commissioned = v.commissionedAt!;
      // The dampers not replaced in the records were fitted before the trips on record begin:
      // 3 000–9 000 km ago (a fleet on rough roads that renews dampers), never before commissioning. The
      // nightly job estimates what they used before the records (opening wear).
      const fittedKmAgo = 3000 + rand() * 6000;
      const fittedDaysAgo = Math.max(65, Math.round(fittedKmAgo / kmPerDay));
      const sinceCommissioned = Math.round((today.getTime() - new Date(commissioned).getTime()) / 86_400_000);
      const fitted =
        fittedDaysAgo >= sinceCommissioned
          ? { on: commissioned, odometerKm: 0, partNumber: (axle: number) => `${spec.prefix}-D${axle}-OE` }
          : { on: day(subDays(today, fittedDaysAgo)), odometerKm: odoAt(subDays(today, fittedDaysAgo)), partNumber: (axle: number) => `${spec.prefix}-D${axle}-AM1` };
      for (const p of positions) {
        if (replaced && p.axleIndex === replacedAxle) {
          await Damper.create(
            {
              vehicleId: v.id,
              position: p.position,
              axleIndex: p.axleIndex,
              partNumber: `${spec.prefix}-D${p.axleIndex}-OE`,
              installedAt: commissioned,
              installedOdometerKm: 0,
              removedAt: day(replacedOn),
              removedOdometerKm: replacedOdo,
              removalReason: reasons[vi % reasons.length],
              removedByWorkRecordId: work!.id,
            },
            opts,
          );
          await Damper.create(
            { vehicleId: v.id, position: p.position, axleIndex: p.axleIndex, partNumber: `${spec.prefix}-D${p.axleIndex}-AM2`, installedAt: day(replacedOn), installedOdometerKm: replacedOdo, removedByWorkRecordId: null },
            opts,
          );
        } else {
          await Damper.create(
            { vehicleId: v.id, position: p.position, axleIndex: p.axleIndex, partNumber: fitted.partNumber(p.axleIndex), installedAt: fitted.on, installedOdometerKm: fitted.odometerKm, removedByWorkRecordId: null },
            opts,
          );
        }
      }
      if (!replaced && v.status !== 'retired') {
        // an ordinary check some time in the last year, so the interval rule is spread out
        const ago = 25 + ((vi * 53) % 320);
        const doneOn = subDays(today, ago);
        await Inspection.create(
          {
            vehicleId: v.id,
            dueDate: day(subDays(doneOn, 1)),
            status: 'done',
            reason: 'Interval rule: 12 months since the last inspection.',
            trigger: 'interval_months',
            assigneeId: mechanicId,
            completedAt: doneOn,
            odometerKm: odoAt(doneOn),
            notes: 'All corners within limits on the test lane.',
          },
          opts,
        );
      }
      if (vi % 9 === 2) {
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
