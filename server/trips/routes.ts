import type { Router } from 'express';
import { z } from 'zod';
import { allow, currentUser } from '../http/access';
import { NO_PAGING, isoDay, listQuery, paging, parse, queryBool, sortOf } from '../http/validate';
import { sendCsv, type CsvColumn } from '../http/csv-export';
import { localDay } from '../lib/days';
import { requireFile, singleFile, textOf } from '../http/upload';
import { tripsRepository, type TripSort } from './repository';
import { MAX_TRIP_BYTES, TRIP_COLUMNS, tripsService } from './service';

const id = z.coerce.number({ message: 'must be a number' }).int().positive('must be a positive id');
const isoDate = isoDay;

const tripList = listQuery(['startedAt', 'distanceKm', 'meanSpeedKmh', 'fleetNumber', 'routeName'], '-startedAt', {
  vehicleId: id.optional(),
  routeId: id.optional(),
  driverId: id.optional(),
  from: isoDate.optional(),
  to: isoDate.optional(),
});

type TripItem = Awaited<ReturnType<typeof tripsRepository.list>>['items'][number];

/** The trips table's columns, in its order and words; the start as an ISO 8601 instant (UTC). */
const TRIP_CSV: CsvColumn<TripItem>[] = [
  { header: 'Started', value: (t) => t.startedAt },
  { header: 'Vehicle', value: (t) => t.fleetNumber },
  { header: 'Route', value: (t) => t.routeName },
  { header: 'Driver', value: (t) => t.driverName },
  { header: 'Distance', unit: 'km', value: (t) => t.distanceKm },
  { header: 'Mean speed', unit: 'km/h', value: (t) => t.meanSpeedKmh },
  { header: 'Payload', unit: 'kg', value: (t) => t.payloadKg },
];

const tripBody = z
  .object({
    vehicleId: z.number({ message: 'must be a vehicle id' }).int().positive('must be a vehicle id'),
    routeId: z.number({ message: 'must be a route id' }).int().positive('must be a route id'),
    driverId: z.number({ message: 'must be a driver id' }).int().positive().nullish(),
    startedAt: z.string({ message: 'must be an ISO 8601 date-time' }).min(10, 'must be an ISO 8601 date-time'),
    endedAt: z.string({ message: 'must be an ISO 8601 date-time' }).min(10, 'must be an ISO 8601 date-time'),
    distanceKm: z.number({ message: 'must be a number in km' }).min(0.1, 'must be at least 0.1 km').max(2000, 'must be at most 2000 km'),
    meanSpeedKmh: z.number({ message: 'must be a number in km/h' }).min(1, 'must be at least 1 km/h').max(130, 'impossible speed: must be at most 130 km/h'),
    payloadKg: z.number({ message: 'must be a number in kg' }).min(0, 'must be 0 kg or more').max(40_000, 'must be at most 40 000 kg').nullish(),
  })
  .strict();

const previewQuery = z.object({ preview: queryBool.optional() }).strict();

/** `timeZone` dates the CSV export's file name (default UTC). */
export function registerTripRoutes(r: Router, deps: { now: () => Date; timeZone?: string }) {
  r.get('/trips', allow('manager'), async (req, res) => {
    const q = parse(tripList, req.query, 'query');
    res.json(await tripsRepository.list({ ...q, ...paging<TripSort>(q) }));
  });

  r.get('/trips/export', allow('manager'), async (req, res) => {
    const q = parse(tripList.omit(NO_PAGING), req.query, 'query');
    const sort = sortOf<TripSort>(q);
    await sendCsv(res, {
      name: 'trips',
      day: localDay(deps.now(), deps.timeZone ?? 'UTC'),
      columns: TRIP_CSV,
      fetch: async (offset, pageSize) => (await tripsRepository.list({ ...q, sort, offset, pageSize })).items,
    });
  });

  r.post('/trips', allow('manager'), async (req, res) => {
    const b = parse(tripBody, req.body, 'trip');
    const tripId = await tripsService.createOne({ ...b, driverId: b.driverId ?? null, payloadKg: b.payloadKg ?? null }, deps.now());
    res.status(201).json({ id: tripId });
  });

  r.post('/trips/import', allow('manager'), singleFile(MAX_TRIP_BYTES), async (req, res) => {
    const { preview } = parse(previewQuery, req.query, 'query');
    const file = requireFile(req.file);
    const text = textOf(file);
    if (preview) {
      const { rows } = await tripsService.checkCsv(text, deps.now());
      const bad = rows.filter((x) => !x.ok).length;
      return res.json({ columns: TRIP_COLUMNS, total: rows.length, ok: rows.length - bad, bad, rows });
    }
    const out = await tripsService.importCsv(text, file.originalname, currentUser(req).id, deps.now());
    res.status(201).json({ importId: out.importId, imported: out.imported });
  });
}
