/** Roads rules: creating routes, speeds, manual roughness, profile surveys. */
import type { Transaction } from 'sequelize';
import { AppError } from '../errors';
import { classifyGd, gdForClass } from '../physics/iso8608';
import { gdFromIri, iriFromGd, iriSegments } from '../physics/iri';
import { lineLengthM, splitLine, type LonLat } from './geometry';
import { LineInputError, parseCsvLine, parseGeoJsonLine } from './line-input';
import { ProfileFormatError, parseProfileCsv, removeProfileFile, storeProfileFile, type ParsedProfile } from './profile-store';
import { roadsRepository, type SegmentRow } from './repository';
import { CURRENT_RULE_TEXT } from './current-roughness';

export type LineInput = { format: 'coordinates'; coordinates: LonLat[] } | { format: 'geojson'; text: string } | { format: 'csv'; text: string };

export interface RouteInput {
  name: string;
  description?: string | null;
  depotId?: number | null;
  defaultSpeedKmh: number;
  segmentLengthM: number;
  line: LineInput;
  statedClass?: string | null;
}

const MAX_SEGMENTS_PER_ROUTE = 20_000;

function readLine(line: LineInput): LonLat[] {
  try {
    if (line.format === 'geojson') return parseGeoJsonLine(line.text);
    if (line.format === 'csv') return parseCsvLine(line.text);
    if (line.coordinates.length < 2) throw new LineInputError('A route needs at least two points.');
    return line.coordinates;
  } catch (e) {
    if (e instanceof LineInputError) throw AppError.badRequest(`The route line could not be read. ${e.message}`, { line: e.message });
    throw e;
  }
}

const round = (x: number, d = 3) => Math.round(x * 10 ** d) / 10 ** d;

/** IRI per route segment from a profile: the golden car over the whole profile, binned by segment. */
export function iriPerSegment(p: ParsedProfile, segments: { id: number; seq: number; startM: number; endM: number }[], segmentLengthM: number) {
  // Bins start on a segment boundary: skip the samples before the first boundary at or after the profile start.
  const first = segments.find((s) => s.startM >= p.startM - 1e-6);
  if (!first) return { results: [], skippedHeadM: 0 };
  const i0 = Math.ceil((first.startM - p.startM) / p.dxM - 1e-9);
  const elevations = p.elevationsM.subarray(i0);
  if ((elevations.length - 1) * p.dxM < 12) return { results: [], skippedHeadM: i0 * p.dxM };
  const bins = iriSegments(elevations, p.dxM, segmentLengthM, { startM: p.startM + i0 * p.dxM });
  const results: { segmentId: number; seq: number; startM: number; endM: number; iri: number; coveredM: number }[] = [];
  for (const s of segments) {
    const mine = bins.filter((b) => {
      const mid = (b.startM + b.endM) / 2;
      return mid >= s.startM && mid < s.endM;
    });
    const covered = mine.reduce((a, b) => a + (b.endM - b.startM), 0);
    if (covered < 0.5 * (s.endM - s.startM)) continue;
    const iri = mine.reduce((a, b) => a + b.iri * (b.endM - b.startM), 0) / covered;
    results.push({ segmentId: s.id, seq: s.seq, startM: s.startM, endM: s.endM, iri, coveredM: covered });
  }
  return { results, skippedHeadM: i0 * p.dxM };
}

export const roadsService = {
  currentRule: CURRENT_RULE_TEXT,

  /** A route with its segments, surveys and trips; `ownTripsOf` limits the trips to one driver's. */
  async routeDetail(id: number, ownTripsOf?: number) {
    const route = await roadsRepository.findRoute(id);
    if (!route) throw AppError.notFound('Route');
    const [segments, surveys, trips] = await Promise.all([roadsRepository.segmentsOf(id), roadsRepository.surveysOf(id), roadsRepository.tripsOn(id, ownTripsOf)]);
    return { route, segments, surveys, trips, currentRule: CURRENT_RULE_TEXT };
  },

  async prepareRoute(input: RouteInput) {
    const coords = readLine(input.line);
    const lengthM = lineLengthM(coords);
    if (lengthM < input.segmentLengthM / 2 || lengthM < 20) {
      throw AppError.badRequest('The route is too short.', { line: `is ${round(lengthM, 1)} m long; a route needs at least 20 m and half a segment (${input.segmentLengthM / 2} m)` });
    }
    const segs = splitLine(coords, input.segmentLengthM);
    if (segs.length > MAX_SEGMENTS_PER_ROUTE) {
      throw AppError.badRequest('The route would have too many segments.', { segmentLengthM: `gives ${segs.length} segments; at most ${MAX_SEGMENTS_PER_ROUTE} per route — choose longer segments` });
    }
    return { coords, lengthM, segs };
  },

  async checkRouteRefs(input: { name?: string; depotId?: number | null }, exceptId?: number) {
    if (input.depotId && !(await roadsRepository.depotExists(input.depotId))) throw AppError.badRequest('Some references are not valid.', { depotId: `no depot with id ${input.depotId}` });
    if (input.name && (await roadsRepository.routeNameTaken(input.name, exceptId))) throw AppError.conflict('A route with this name already exists.', { name: 'is already in use' });
  },

  async previewRoute(input: RouteInput) {
    await roadsService.checkRouteRefs(input);
    const { coords, lengthM, segs } = await roadsService.prepareRoute(input);
    return {
      lengthM,
      pointCount: coords.length,
      coordinates: coords,
      segments: segs.map((s) => ({ seq: s.seq, startM: s.startM, endM: s.endM, coords: s.coords })),
    };
  },

  async createRoute(input: RouteInput, userId: number, today: string) {
    await roadsService.checkRouteRefs(input);
    const { coords, lengthM, segs } = await roadsService.prepareRoute(input);
    const stated = input.statedClass ? { isoClass: input.statedClass, gdN0: gdForClass(input.statedClass), observedOn: today, recordedById: userId } : null;
    return roadsRepository.createRoute(
      { name: input.name, description: input.description ?? null, depotId: input.depotId ?? null, coordinates: coords, lengthM, defaultSpeedKmh: input.defaultSpeedKmh, segmentLengthM: input.segmentLengthM },
      segs,
      stated,
    );
  },

  async updateRoute(id: number, patch: Partial<{ name: string; description: string | null; depotId: number | null; defaultSpeedKmh: number }>) {
    if (!(await roadsRepository.findRoute(id))) throw AppError.notFound('Route');
    await roadsService.checkRouteRefs(patch, id);
    await roadsRepository.updateRoute(id, patch);
  },

  async setSpeeds(routeId: number, edits: { seq: number; speedKmh: number | null }[]) {
    const segs = await roadsRepository.segmentsOf(routeId);
    if (!segs.length && !(await roadsRepository.findRoute(routeId))) throw AppError.notFound('Route');
    const seqs = new Set(segs.map((s) => s.seq));
    const fields: Record<string, string> = {};
    edits.forEach((e, i) => {
      if (!seqs.has(e.seq)) fields[`segments.${i}.seq`] = `segment ${e.seq} is not on this route (0–${segs.length - 1})`;
    });
    if (Object.keys(fields).length) throw AppError.badRequest('Some segments are not on this route.', fields);
    await roadsRepository.setSegmentSpeeds(routeId, edits);
  },

  /** A class or IRI set by hand on a range of segments (source `stated`). */
  async setRoughness(routeId: number, body: { seqFrom: number; seqTo: number; isoClass?: string | null; iri?: number | null; observedOn: string; note?: string | null }, userId: number, today: string) {
    const segs = await roadsRepository.segmentsOf(routeId);
    if (!segs.length) throw AppError.notFound('Route');
    const fields: Record<string, string> = {};
    const last = segs[segs.length - 1].seq;
    if (body.seqFrom > last) fields.seqFrom = `must be a segment of this route (0–${last})`;
    if (body.seqTo > last) fields.seqTo = `must be a segment of this route (0–${last})`;
    if (body.seqTo < body.seqFrom) fields.seqTo = 'must not be before seqFrom';
    if (body.observedOn > today) fields.observedOn = `must not be in the future (today is ${today})`;
    if (Object.keys(fields).length) throw AppError.badRequest('Some values are not valid.', fields);
    const iri = body.iri ?? null;
    const gdN0 = iri !== null ? gdFromIri(iri) : gdForClass(body.isoClass!);
    const isoClass = iri !== null ? classifyGd(gdN0) : body.isoClass!;
    const targets = segs.filter((s) => s.seq >= body.seqFrom && s.seq <= body.seqTo);
    await roadsRepository.transaction((t) =>
      roadsRepository.addObservations(
        targets.map((s) => ({ segmentId: s.id, iri, gdN0, isoClass, source: 'stated' as const, observedOn: body.observedOn, recordedById: userId, note: body.note ?? 'Set by hand', surveyId: null })),
        t,
      ),
    );
    return { updated: targets.length, isoClass, iri, gdN0 };
  },

  /** Parses a profile upload and computes IRI per segment; throws a 400 naming the row. */
  async computeSurvey(routeId: number, text: string) {
    const route = await roadsRepository.findRoute(routeId);
    if (!route) throw AppError.notFound('Route');
    let p: ParsedProfile;
    try {
      p = parseProfileCsv(text);
    } catch (e) {
      if (e instanceof ProfileFormatError) {
        throw AppError.badRequest(`The profile file was not accepted. ${e.message}`, { [e.row !== null ? `row ${e.row}` : 'file']: e.message });
      }
      throw e;
    }
    if (p.startM >= route.lengthM) {
      throw AppError.badRequest('The profile starts after the end of the route.', { file: `starts at ${round(p.startM, 2)} m; the route is ${round(route.lengthM, 1)} m long` });
    }
    const segments = await roadsRepository.segmentsOf(routeId);
    const { results, skippedHeadM } = iriPerSegment(p, segments, route.segmentLengthM);
    if (!results.length) {
      throw AppError.badRequest('The profile is too short for this route.', {
        file: `covers ${round(p.endM - p.startM, 1)} m from ${round(p.startM, 1)} m; it must cover at least half of one ${route.segmentLengthM} m segment after the first segment boundary`,
      });
    }
    // a perfectly flat stretch (IRI 0) has no roughness class; it comes from an elevation column of
    // zeros or one in the wrong unit, never from a real road
    const flat = results.filter((r) => !(gdFromIri(r.iri) > 0));
    if (flat.length) {
      throw AppError.badRequest('The profile is perfectly flat on some segments, so it cannot be a road survey.', {
        file: `segment(s) ${flat.slice(0, 10).map((r) => r.seq).join(', ')}${flat.length > 10 ? ' …' : ''} have an IRI of 0 m/km (all elevations equal); check the elevation column and its unit`,
      });
    }
    const bySeg = new Map<number, SegmentRow>(segments.map((s) => [s.id, s]));
    return {
      profile: p,
      route,
      summary: {
        dxM: p.dxM,
        startM: p.startM,
        endM: p.endM,
        pointCount: p.elevationsM.length,
        skippedHeadM: round(skippedHeadM, 2),
        beyondRouteM: round(Math.max(0, p.endM - route.lengthM), 1),
        segmentCount: results.length,
        routeSegmentCount: segments.length,
      },
      segments: results.map((r) => {
        const gdN0 = gdFromIri(r.iri, p.dxM);
        const prev = bySeg.get(r.segmentId)!;
        return {
          segmentId: r.segmentId,
          seq: r.seq,
          startM: r.startM,
          endM: r.endM,
          iri: r.iri,
          gdN0,
          isoClass: classifyGd(gdN0),
          iriFromClassCheck: iriFromGd(gdN0, p.dxM),
          previous: { iri: prev.iri, isoClass: prev.isoClass, source: prev.roughnessSource, date: prev.roughnessDate },
        };
      }),
    };
  },

  async saveSurvey(
    routeId: number,
    upload: { text: string; buffer: Buffer; originalName: string },
    meta: { surveyedOn: string; note: string | null },
    ctx: { userId: number; dataDir: string; now: Date; today: string },
  ) {
    if (meta.surveyedOn > ctx.today) throw AppError.badRequest('Some values are not valid.', { surveyedOn: `must not be in the future (today is ${ctx.today})` });
    const computed = await roadsService.computeSurvey(routeId, upload.text);
    const filePath = storeProfileFile(ctx.dataDir, upload.buffer);
    try {
      const surveyId = await roadsRepository.transaction(async (t) => {
        const id = await roadsRepository.createSurvey(
          {
            routeId,
            filePath,
            originalName: upload.originalName.slice(0, 255) || 'profile.csv',
            dxM: computed.profile.dxM,
            startM: computed.profile.startM,
            endM: computed.profile.endM,
            pointCount: computed.profile.elevationsM.length,
            surveyedOn: meta.surveyedOn,
            note: meta.note,
            uploadedById: ctx.userId,
            uploadedAt: ctx.now,
          },
          t,
        );
        await roadsRepository.addObservations(
          computed.segments.map((s) => ({
            segmentId: s.segmentId,
            iri: round(s.iri, 4),
            gdN0: s.gdN0,
            isoClass: s.isoClass,
            source: 'survey' as const,
            observedOn: meta.surveyedOn,
            recordedById: ctx.userId,
            note: meta.note ?? `Profile survey ${upload.originalName.slice(0, 120)}`,
            surveyId: id,
          })),
          t,
        );
        return id;
      });
      return { surveyId, computed };
    } catch (e) {
      removeProfileFile(ctx.dataDir, filePath);
      throw e;
    }
  },

  /**
   * An accepted driver's report becomes a roughness observation (source
   * `driver_report`, weighted below a survey by the current-value rule). Runs in the caller's
   * transaction; returns the new observation's id.
   */
  async addDriverReportObservation(
    o: { segmentId: number; gdN0: number; isoClass: string; observedOn: string; recordedById: number; note: string },
    t: Transaction,
  ) {
    await roadsRepository.addObservations([{ segmentId: o.segmentId, iri: null, gdN0: o.gdN0, isoClass: o.isoClass, source: 'driver_report', observedOn: o.observedOn, recordedById: o.recordedById, note: o.note.slice(0, 240), surveyId: null }], t);
    return roadsRepository.lastObservationId(o.segmentId, t);
  },
};
