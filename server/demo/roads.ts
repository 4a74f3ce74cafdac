/** The demo fleet's roads: routes from each depot, their segments' roughness and its history, and profile surveys. */
import { subDays } from 'date-fns';
import { RoadSurvey, RoughnessObservation, Route, RouteSegment, type Depot, type RoughnessSource } from '../db/models';
import { lineLengthM, splitLine, type LonLat } from '../roads/geometry';
import { classifyGd, gdForClass, synthesizeProfile, type IsoClass } from '../physics/iso8608';
import { gdFromIri, iriFromGd, iriSegments } from '../physics/iri';
import { formatProfileCsv, storeProfileFile } from '../roads/profile-store';
import { currentValue } from '../roads/current-roughness';
import { ROUGH_FROM_CLASS } from './history';
import { CLASSES, DEPOTS, ROUTES } from './fleet-data';
import { day, type SeedContext } from './seed-context';

export interface DemoRoute {
  route: Route;
  depotIdx: number;
  speedKmh: number;
  /** Share of its length on class C or rougher (the demo's removal law reads it). */
  roughShare: number;
}

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

/** Routes, their segments and roughness: stated classes, driver reports and synthesised profile surveys. */
export async function seedRoutes(ctx: SeedContext, depots: Depot[]) {
  const { opts, rand, today, dataDir } = ctx;
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
  return routeRows;
}
