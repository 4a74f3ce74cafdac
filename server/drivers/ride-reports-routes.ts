/** Ride-report API: drivers file and read their own; managers read all and decide. */
import type { Router, RequestHandler } from 'express';
import multer from 'multer';
import { z } from 'zod';
import { allow, currentUser } from '../http/access';
import { idParam, isoDateTime, listQuery, paging, parse } from '../http/validate';
import { AppError } from '../errors';
import { RIDE_REPORT_STATUSES } from '../db/models';
import { FELT, FELT_KEYS, SEVERITIES } from './ride-scale';
import { MAX_PHOTO_BYTES, photoFile } from './photos';
import { rideReportsService, type RideContext } from './ride-reports-service';
import type { RideReportSort } from './ride-reports-repository';
import { MAX_SNAP_M } from './snap';

/** The photo in the multipart field `photo` (optional), in memory up to MAX_PHOTO_BYTES. */
const photoUpload: RequestHandler = (req, res, next) => {
  const mw = multer({ storage: multer.memoryStorage(), limits: { fileSize: MAX_PHOTO_BYTES, files: 1, fields: 20, fieldSize: 4000 } }).single('photo');
  mw(req, res, (err: unknown) => {
    if (!err) return next();
    const e = err as { code?: string };
    if (e.code === 'LIMIT_FILE_SIZE') return next(new AppError(413, 'too_large', `The photo is larger than ${MAX_PHOTO_BYTES / 1024 / 1024} MB.`, { photo: `must be at most ${MAX_PHOTO_BYTES / 1024 / 1024} MB` }));
    if (e.code === 'LIMIT_UNEXPECTED_FILE' || e.code === 'LIMIT_FILE_COUNT') return next(AppError.badRequest('Send at most one photo, in the form field "photo".', { photo: 'send one image in the field "photo"' }));
    next(AppError.badRequest('The report form could not be read. Send it as multipart/form-data.', { _: String(e.code ?? 'unreadable') }));
  });
};

const num = (what: string, min: number, max: number) => z.coerce.number({ message: `must be a number (${what})` }).refine(Number.isFinite, 'must be a number').pipe(z.number().min(min, `must be at least ${min}`).max(max, `must be at most ${max}`));

const position = z.object({ lat: num('degrees', -90, 90), lon: num('degrees', -180, 180) });

const createBody = position
  .extend({
    positionSource: z.enum(['gps', 'map'], { message: 'must be gps or map' }),
    accuracyM: z.preprocess((v) => (v === '' || v === undefined || v === null ? null : v), num('m', 0, 100000).nullable()).default(null),
    severity: z.coerce.number({ message: 'must be 1, 2 or 3' }).int('must be 1, 2 or 3').min(1, 'must be 1, 2 or 3').max(3, 'must be 1, 2 or 3'),
    felt: z
      .preprocess((v) => (typeof v === 'string' ? (v ? v.split(',') : []) : v ?? []), z.array(z.enum(FELT_KEYS, { message: `each must be one of ${FELT_KEYS.join(', ')}` })).max(FELT_KEYS.length))
      .default([]),
    note: z.preprocess((v) => (typeof v === 'string' && v.trim() === '' ? null : v), z.string().trim().max(1000, 'must be at most 1000 characters').nullable()).default(null),
    reportedAt: z.preprocess((v) => (v === '' || v === undefined ? null : v), isoDateTime.nullable()).default(null),
  })
  .strict();

const listQ = listQuery(['reportedAt', 'severity', 'status', 'snapDistanceM'], '-reportedAt', {
  status: z.enum(RIDE_REPORT_STATUSES, { message: `must be one of ${RIDE_REPORT_STATUSES.join(', ')}` }).optional(),
  driverId: z.coerce.number().int().positive().optional(),
  routeId: z.coerce.number().int().positive().optional(),
  segmentId: z.coerce.number().int().positive().optional(),
  minSeverity: z.coerce.number().int().min(1).max(3).optional(),
});

export function registerRideReportRoutes(api: Router, ctx: RideContext) {
  api.get('/ride-reports/scale', allow('driver', 'manager'), (_req, res) => {
    res.json({ severities: SEVERITIES, felt: FELT, maxSnapM: MAX_SNAP_M, estimateRule: rideReportsService.estimateRule });
  });

  api.post('/ride-reports/snap', allow('driver', 'manager'), async (req, res) => {
    // `nearest: true` answers with the nearest route however far it is (withinReach says whether a report could be filed there)
    const p = parse(position.extend({ nearest: z.boolean({ message: 'must be true or false' }).optional() }).strict(), req.body, 'position');
    res.json(await rideReportsService.snap(p.lat, p.lon, { nearest: p.nearest }));
  });

  api.post('/ride-reports', allow('driver'), photoUpload, async (req, res) => {
    const body = parse(createBody, req.body ?? {}, 'report');
    const created = await rideReportsService.create(currentUser(req), body, req.file?.buffer ?? null, ctx);
    res.status(201).json(created);
  });

  api.get('/ride-reports', allow('driver', 'manager'), async (req, res) => {
    const q = parse(listQ, req.query, 'query');
    res.json(await rideReportsService.list(currentUser(req), { ...paging<RideReportSort>(q), status: q.status, driverId: q.driverId, routeId: q.routeId, segmentId: q.segmentId, minSeverity: q.minSeverity }));
  });

  api.get('/ride-reports/by-segment', allow('manager'), async (req, res) => {
    const q = parse(z.object({ status: z.enum(RIDE_REPORT_STATUSES).default('new') }).strict(), req.query, 'query');
    const items = await rideReportsService.groups(q.status);
    res.json({ items, total: items.length });
  });

  api.get('/ride-reports/:id', allow('driver', 'manager'), async (req, res) => {
    const { id } = parse(idParam, req.params, 'address');
    const r = await rideReportsService.get(currentUser(req), id);
    res.json({ ...r, photoPath: undefined });
  });

  api.get('/ride-reports/:id/photo', allow('driver', 'manager'), async (req, res, next) => {
    const { id } = parse(idParam, req.params, 'address');
    const r = await rideReportsService.get(currentUser(req), id);
    if (!r.photoPath || !r.photoType) throw AppError.notFound('The photo of this report');
    res.setHeader('Content-Type', r.photoType);
    res.setHeader('Cache-Control', 'private, max-age=3600');
    res.setHeader('Content-Disposition', 'inline');
    res.sendFile(photoFile(ctx.dataDir, r.photoPath), { headers: { 'Content-Type': r.photoType } }, (err) => {
      if (err) next(AppError.notFound('The photo file'));
    });
  });

  api.post('/ride-reports/:id/accept', allow('manager'), async (req, res) => {
    const { id } = parse(idParam, req.params, 'address');
    const body = parse(z.object({ note: z.string().trim().max(200, 'must be at most 200 characters').nullable().optional(), confirm: z.literal(true, { message: 'must be true' }) }).strict(), req.body ?? {}, 'decision');
    res.json(await rideReportsService.accept(currentUser(req), id, body.note ?? null, ctx));
  });

  api.post('/ride-reports/:id/dismiss', allow('manager'), async (req, res) => {
    const { id } = parse(idParam, req.params, 'address');
    const body = parse(z.object({ reason: z.string({ message: 'is required' }).trim().min(3, 'say briefly why (at least 3 characters)').max(500, 'must be at most 500 characters') }).strict(), req.body ?? {}, 'decision');
    res.json(await rideReportsService.dismiss(currentUser(req), id, body.reason, ctx));
  });
}
