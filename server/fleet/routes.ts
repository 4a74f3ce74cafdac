import type { Router } from 'express';
import { z } from 'zod';
import { VEHICLE_STATUSES } from '../db/models';
import { AppError } from '../errors';
import { allow, currentUser } from '../http/access';
import { idParam, listQuery, paging, parse } from '../http/validate';
import type { VehicleSort } from './repository';
import { fleetRepository } from './repository';
import { modes } from '../physics/quarter-car';
import type { CornerParams } from '../physics/types';

const id = z.coerce.number({ message: 'must be a number' }).int().positive('must be a positive id');

const vehicleList = listQuery(['fleetNumber', 'plate', 'odometerKm', 'status', 'depotName', 'specName'], 'fleetNumber', {
  q: z.string().trim().max(60).optional(),
  depotId: id.optional(),
  specId: id.optional(),
  status: z.enum(VEHICLE_STATUSES, { message: `must be one of ${VEHICLE_STATUSES.join(', ')}` }).optional(),
});

const routeList = listQuery(['name', 'lengthM'], 'name', { q: z.string().trim().max(60).optional() });

/**
 * Each axle with its corner's modes from the two-mass model, the same figures the spec editor's
 * preview shows, so the list and the editor never disagree.
 */
function withModes<S extends { axles: { corner: CornerParams }[] }>(spec: S) {
  return { ...spec, axles: spec.axles.map((a) => ({ ...a, modes: modes(a.corner) })) };
}

/** `inspectionThreshold`: the configured fraction of life at which inspection is due (for the wear words on screen). */
export function registerFleetRoutes(r: Router, opts: { inspectionThreshold: number } = { inspectionThreshold: 0.8 }) {
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
}
