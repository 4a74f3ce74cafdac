import type { Router } from 'express';
import fs from 'node:fs';
import { createHash } from 'node:crypto';
import { formatISO } from 'date-fns';
import { z } from 'zod';
import type { Config } from '../config';
import { ROUGHNESS_SOURCES } from '../db/models';
import { AppError } from '../errors';
import { allow, currentUser } from '../http/access';
import { NO_PAGING, idParam, isoDay, listQuery, noHiddenChars, paging, parse, queryBool, sortOf } from '../http/validate';
import { sendCsv, type CsvColumn } from '../http/csv-export';
import { requireFile, singleFile, textOf } from '../http/upload';
import { MAX_PROFILE_BYTES, surveyFilePath } from './profile-store';
import { roadsRepository, type SegmentSort } from './repository';
import { roadsService } from './service';
import { ROUGHNESS_SOURCE_WORDS, type RoughnessSource } from '../contracts/roads';

const CLASSES = ['A', 'B', 'C', 'D', 'E', 'F', 'G', 'H'] as const;
const isoClass = z.enum(CLASSES, { message: 'must be an ISO 8608 class A–H' });
const isoDate = isoDay;
const speed = z.number({ message: 'must be a number in km/h' }).min(5, 'must be at least 5 km/h').max(130, 'must be at most 130 km/h');
const positiveId = z.number({ message: 'must be an id' }).int().positive('must be an id');

const line = z.discriminatedUnion(
  'format',
  [
    z.object({
      format: z.literal('coordinates'),
      coordinates: z.array(z.tuple([z.number(), z.number()], { message: 'each point must be [lon, lat] in degrees' }), { message: 'must be a list of [lon, lat] points' }).min(2, 'needs at least two points').max(50_000),
    }),
    z.object({ format: z.literal('geojson'), text: z.string().min(1, 'is empty').max(20_000_000) }),
    z.object({ format: z.literal('csv'), text: z.string().min(1, 'is empty').max(20_000_000) }),
  ],
  { message: 'must say its format: coordinates, geojson or csv' },
);

const routeBody = z
  .object({
    name: z.string({ message: 'is required' }).trim().min(2, 'must be at least 2 characters').max(120, 'must be 120 characters or fewer').refine(...noHiddenChars),
    description: z.string().trim().max(2000).nullish(),
    depotId: positiveId.nullish(),
    defaultSpeedKmh: speed,
    segmentLengthM: z.number({ message: 'must be a number in m' }).min(10, 'must be at least 10 m').max(5000, 'must be at most 5000 m').default(100),
    statedClass: isoClass.nullish(),
    line,
  })
  .strict();

const routePatch = z
  .object({
    name: z.string().trim().min(2, 'must be at least 2 characters').max(120).refine(...noHiddenChars),
    description: z.string().trim().max(2000).nullable(),
    depotId: positiveId.nullable(),
    defaultSpeedKmh: speed,
  })
  .partial()
  .strict()
  .refine((v) => Object.keys(v).length > 0, { message: 'give at least one field to change', path: ['_'] });

const speedsBody = z
  .object({
    segments: z
      .array(z.object({ seq: z.number({ message: 'must be a segment number' }).int().min(0), speedKmh: speed.nullable() }).strict(), { message: 'must be a list of { seq, speedKmh }' })
      .min(1, 'needs at least one segment')
      .max(20_000),
  })
  .strict();

const roughnessBody = z
  .object({
    seqFrom: z.number({ message: 'must be a segment number' }).int().min(0, 'must be 0 or more'),
    seqTo: z.number({ message: 'must be a segment number' }).int().min(0, 'must be 0 or more'),
    isoClass: isoClass.nullish(),
    iri: z.number({ message: 'must be a number in m/km' }).min(0.3, 'must be at least 0.3 m/km').max(50, 'must be at most 50 m/km').nullish(),
    observedOn: isoDate,
    note: z.string().trim().max(240).nullish(),
  })
  .strict()
  .superRefine((v, ctx) => {
    if ((v.isoClass == null) === (v.iri == null)) ctx.addIssue({ code: 'custom', path: ['isoClass'], message: 'give either an ISO 8608 class or an IRI in m/km (one of the two)' });
  });

const surveyForm = z
  .object({
    surveyedOn: isoDate.optional(),
    note: z.string().trim().max(240, 'must be 240 characters or fewer').optional(),
  })
  .strict();
const previewQuery = z.object({ preview: queryBool.optional() }).strict();

const segmentList = listQuery(['seq', 'routeName', 'iri', 'isoClass', 'roughnessDate', 'speedKmh'], 'routeName', {
  routeId: z.coerce.number({ message: 'must be a number' }).int().positive().optional(),
  isoClass: isoClass.optional(),
  source: z.enum(ROUGHNESS_SOURCES, { message: `must be one of ${ROUGHNESS_SOURCES.join(', ')}` }).optional(),
});

const ALL = ['manager', 'mechanic', 'driver'] as const;

type SegmentItem = Awaited<ReturnType<typeof roadsRepository.listSegments>>['items'][number];


const km2 = (m: number) => (m / 1000).toFixed(2);

/** The segments table's columns, in its order and words (segments numbered from 1, as on screen). */
const SEGMENT_CSV: CsvColumn<SegmentItem>[] = [
  { header: 'Route', value: (s) => s.routeName },
  { header: 'Segment number', value: (s) => s.seq + 1 },
  { header: 'From – to', unit: 'km', value: (s) => `${km2(s.startM)}–${km2(s.endM)}` },
  { header: 'ISO 8608 class', value: (s) => s.isoClass },
  { header: 'IRI', unit: 'm/km', value: (s) => (s.iri === null ? null : Number(s.iri.toFixed(2))) },
  { header: 'Source', value: (s) => (s.roughnessSource ? (ROUGHNESS_SOURCE_WORDS[s.roughnessSource as RoughnessSource] ?? s.roughnessSource) : null) },
  { header: 'Observed', value: (s) => s.roughnessDate },
  { header: 'Speed', unit: 'km/h', value: (s) => s.speedKmh },
];

/** The map's base layer: `MAP_TILE_URL` and its attribution when set, else the app's own offline tiles. */
export function mapConfigOf(config: Pick<Config, 'mapTileUrl' | 'mapTileAttribution'>) {
  return {
    tileUrl: config.mapTileUrl ?? '/tiles/{z}/{x}/{y}.png',
    attribution: config.mapTileUrl ? config.mapTileAttribution : config.mapTileAttribution || 'Reboundry plain base layer (offline)',
    offline: !config.mapTileUrl,
  };
}

export function registerRoadRoutes(r: Router, deps: { config: Config; now: () => Date }) {
  const today = () => formatISO(deps.now(), { representation: 'date' });

  r.get('/map-config', allow(...ALL), (_req, res) => {
    res.json(mapConfigOf(deps.config));
  });

  // The map data (every segment's line, about 200 kB on the demo fleet) is built once per change
  // of segments, routes or depots and kept serialized; browsers may keep it and revalidate with
  // its ETag (a 304 has no body).
  let mapCache: { version: string; etag: string; body: string } | null = null;
  r.get('/map/segments', allow(...ALL), async (req, res) => {
    const version = await roadsRepository.mapVersion();
    if (!mapCache || mapCache.version !== version) {
      const body = JSON.stringify(await roadsRepository.mapData());
      mapCache = { version, body, etag: `"map-${createHash('sha256').update(body).digest('hex').slice(0, 24)}"` };
    }
    res.setHeader('Cache-Control', 'private, no-cache');
    res.setHeader('ETag', mapCache.etag);
    if (req.headers['if-none-match'] === mapCache.etag) return res.status(304).end();
    res.type('application/json').send(mapCache.body);
  });

  r.post('/routes', allow('manager'), async (req, res) => {
    const { preview } = parse(previewQuery, req.query, 'query');
    const body = parse(routeBody, req.body, 'route');
    if (preview) return res.json(await roadsService.previewRoute(body));
    const id = await roadsService.createRoute(body, currentUser(req).id, today());
    res.status(201).json(await roadsService.routeDetail(id));
  });

  r.get('/routes/:id', allow(...ALL), async (req, res) => {
    const { id } = parse(idParam, req.params, 'address');
    const user = currentUser(req);
    // a driver sees only their own trips on the route (names, vehicles and times of others are theirs)
    res.json(await roadsService.routeDetail(id, user.role === 'driver' ? user.id : undefined));
  });

  r.patch('/routes/:id', allow('manager'), async (req, res) => {
    const { id } = parse(idParam, req.params, 'address');
    const body = parse(routePatch, req.body, 'route');
    await roadsService.updateRoute(id, body);
    res.json(await roadsService.routeDetail(id));
  });

  r.put('/routes/:id/speeds', allow('manager'), async (req, res) => {
    const { id } = parse(idParam, req.params, 'address');
    const body = parse(speedsBody, req.body, 'speeds');
    await roadsService.setSpeeds(id, body.segments);
    res.json({ updated: body.segments.length });
  });

  r.post('/routes/:id/roughness', allow('manager'), async (req, res) => {
    const { id } = parse(idParam, req.params, 'address');
    const body = parse(roughnessBody, req.body, 'roughness');
    res.status(201).json(await roadsService.setRoughness(id, body, currentUser(req).id, today()));
  });

  r.post('/routes/:id/surveys', allow('manager'), singleFile(MAX_PROFILE_BYTES), async (req, res) => {
    const { id } = parse(idParam, req.params, 'address');
    const { preview } = parse(previewQuery, req.query, 'query');
    const form = parse(surveyForm, req.body ?? {}, 'form');
    const file = requireFile(req.file);
    const text = textOf(file);
    if (preview) {
      const c = await roadsService.computeSurvey(id, text);
      return res.json({ summary: c.summary, segments: c.segments, currentRule: roadsService.currentRule });
    }
    const { surveyId, computed } = await roadsService.saveSurvey(
      id,
      { text, buffer: file.buffer, originalName: file.originalname },
      { surveyedOn: form.surveyedOn ?? today(), note: form.note ?? null },
      { userId: currentUser(req).id, dataDir: deps.config.dataDir, now: deps.now(), today: today() },
    );
    res.status(201).json({ surveyId, summary: computed.summary, segments: computed.segments });
  });

  r.get('/surveys/:id/file', allow('manager'), async (req, res) => {
    const { id } = parse(idParam, req.params, 'address');
    const s = await roadsRepository.findSurvey(id);
    if (!s) throw AppError.notFound('Survey');
    const abs = surveyFilePath(deps.config.dataDir, s.filePath);
    if (!fs.existsSync(abs)) throw AppError.notFound('The survey file');
    res.setHeader('content-type', 'text/csv; charset=utf-8');
    res.setHeader('content-disposition', `attachment; filename="${s.originalName.replace(/[^\w.-]+/g, '_')}"`);
    fs.createReadStream(abs).pipe(res);
  });

  r.get('/segments', allow(...ALL), async (req, res) => {
    const q = parse(segmentList, req.query, 'query');
    res.json(await roadsRepository.listSegments({ ...q, ...paging<SegmentSort>(q) }));
  });

  // Before /segments/:id.
  r.get('/segments/export', allow(...ALL), async (req, res) => {
    const q = parse(segmentList.omit(NO_PAGING), req.query, 'query');
    const sort = sortOf<SegmentSort>(q);
    await sendCsv(res, {
      name: 'segments',
      day: today(),
      columns: SEGMENT_CSV,
      fetch: async (offset, pageSize) => (await roadsRepository.listSegments({ ...q, sort, offset, pageSize })).items,
    });
  });

  r.get('/segments/:id', allow(...ALL), async (req, res) => {
    const { id } = parse(idParam, req.params, 'address');
    const d = await roadsRepository.segmentDetail(id);
    if (!d) throw AppError.notFound('Segment');
    res.json({ ...d, currentRule: roadsService.currentRule });
  });
}
