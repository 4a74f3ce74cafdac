import type { Router } from 'express';
import { z } from 'zod';
import { VEHICLE_STATUSES } from '../db/models';
import { AppError } from '../errors';
import { allow, currentUser } from '../http/access';
import { NO_PAGING, idParam, listQuery, paging, parse, sortOf } from '../http/validate';
import { sendCsv, type CsvColumn } from '../http/csv-export';
import { localDay } from '../lib/days';
import type { VehicleSort } from './repository';
import { fleetRepository } from './repository';
import { modes } from '../physics/quarter-car';
import type { CornerParams } from '../physics/types';
import { VEHICLE_STATUS_WORDS } from '../contracts/fleet';

const id = z.coerce.number({ message: 'must be a number' }).int().positive('must be a positive id');

const vehicleList = listQuery(['fleetNumber', 'plate', 'odometerKm', 'status', 'depotName', 'specName'], 'fleetNumber', {
  q: z.string().trim().max(60).optional(),
  depotId: id.optional(),
  specId: id.optional(),
  status: z.enum(VEHICLE_STATUSES, { message: `must be one of ${VEHICLE_STATUSES.join(', ')}` }).optional(),
});

const routeList = listQuery(['name', 'lengthM'], 'name', { q: z.string().trim().max(60).optional() });

type VehicleItem = Awaited<ReturnType<typeof fleetRepository.listVehicles>>['items'][number];
type RouteItem = Awaited<ReturnType<typeof fleetRepository.listRoutes>>['items'][number];


/** The vehicles table's columns, in its order and words. */
const VEHICLE_CSV: CsvColumn<VehicleItem>[] = [
  { header: 'Fleet number', value: (v) => v.fleetNumber },
  { header: 'Plate', value: (v) => v.plate },
  { header: 'Status', value: (v) => VEHICLE_STATUS_WORDS[v.status] ?? v.status },
  { header: 'Spec', value: (v) => v.specName },
  { header: 'Depot', value: (v) => v.depotName },
  { header: 'Driver', value: (v) => v.driverName },
  { header: 'Odometer', unit: 'km', value: (v) => Math.round(v.odometerKm) },
];

/** The routes table's columns, in its order and words. */
const ROUTE_CSV: CsvColumn<RouteItem>[] = [
  { header: 'Route', value: (r) => r.name },
  { header: 'Length', unit: 'km', value: (r) => Number(r.lengthKm.toFixed(2)) },
  { header: 'Usual speed', unit: 'km/h', value: (r) => r.defaultSpeedKmh },
  { header: 'Segments', value: (r) => r.segmentCount },
  { header: 'Roughest ISO 8608 class', value: (r) => r.worstClass },
];

/**
 * Each axle with its corner's modes from the two-mass model, the same figures the spec editor's
 * preview shows, so the list and the editor never disagree.
 */
function withModes<S extends { axles: { corner: CornerParams }[] }>(spec: S) {
  return { ...spec, axles: spec.axles.map((a) => ({ ...a, modes: modes(a.corner) })) };
}

/**
 * `inspectionThreshold`: the configured fraction of life at which inspection is due (for the wear
 * words on screen); `now` and `timeZone` date the CSV exports' file names.
 */
export function registerFleetRoutes(
  r: Router,
  opts: { inspectionThreshold: number; now?: () => Date; timeZone?: string } = { inspectionThreshold: 0.8 },
) {
  const today = () => localDay((opts.now ?? (() => new Date()))(), opts.timeZone ?? 'UTC');
  r.get('/depots', allow('manager', 'mechanic', 'driver'), async (_req, res) => {
    const items = await fleetRepository.listDepots();
    res.json({ items, total: items.length });
  });

  r.get('/specs', allow('manager', 'mechanic'), async (_req, res) => {
    const items = (await fleetRepository.listSpecs()).map(withModes);
    res.json({ items, total: items.length });
  });

  r.get('/specs/:id', allow('manager', 'mechanic'), async (req, res) => {
    const { id: specId } = parse(idParam, req.params, 'address');
    const spec = await fleetRepository.findSpec(specId);
    if (!spec) throw AppError.notFound('Suspension spec');
    res.json({ spec: withModes(spec) });
  });

  r.get('/vehicles', allow('manager', 'mechanic', 'driver'), async (req, res) => {
    const q = parse(vehicleList, req.query, 'query');
    const user = currentUser(req);
    const list = { ...q, ...paging<VehicleSort>(q) };
    res.json(await fleetRepository.listVehicles(user.role === 'driver' ? { ...list, driverId: user.id } : list));
  });

  // Before /vehicles/:id. The same roles and the same driver scope as the list.
  r.get('/vehicles/export', allow('manager', 'mechanic', 'driver'), async (req, res) => {
    const q = parse(vehicleList.omit(NO_PAGING), req.query, 'query');
    const user = currentUser(req);
    const list = { ...q, sort: sortOf<VehicleSort>(q), ...(user.role === 'driver' ? { driverId: user.id } : {}) };
    await sendCsv(res, {
      name: 'vehicles',
      day: today(),
      columns: VEHICLE_CSV,
      fetch: async (offset, pageSize) => (await fleetRepository.listVehicles({ ...list, offset, pageSize })).items,
    });
  });

  r.get('/vehicles/:id', allow('manager', 'mechanic', 'driver'), async (req, res) => {
    const { id: vehicleId } = parse(idParam, req.params, 'address');
    const detail = await fleetRepository.vehicleDetail(vehicleId);
    if (!detail) throw AppError.notFound('Vehicle');
    const user = currentUser(req);
    if (user.role === 'driver' && detail.vehicle.driverId !== user.id) {
      throw AppError.forbidden('Drivers can see only the vehicle assigned to them.');
    }
    res.json({ ...detail, spec: detail.spec ? withModes(detail.spec) : null, inspectionThreshold: opts.inspectionThreshold });
  });

  r.get('/routes', allow('manager', 'mechanic', 'driver'), async (req, res) => {
    const q = parse(routeList, req.query, 'query');
    res.json(await fleetRepository.listRoutes({ ...q, ...paging<'name' | 'lengthM'>(q) }));
  });

  // Before any /routes/:id (registered by the roads area).
  r.get('/routes/export', allow('manager', 'mechanic', 'driver'), async (req, res) => {
    const q = parse(routeList.omit(NO_PAGING), req.query, 'query');
    const sort = sortOf<'name' | 'lengthM'>(q);
    await sendCsv(res, {
      name: 'routes',
      day: today(),
      columns: ROUTE_CSV,
      fetch: async (offset, pageSize) => (await fleetRepository.listRoutes({ ...q, sort, offset, pageSize })).items,
    });
  });
}
