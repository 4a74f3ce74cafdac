import type { Router } from 'express';
import { formatISO } from 'date-fns';
import { z } from 'zod';
import { VEHICLE_STATUSES } from '../db/models';
import { allow } from '../http/access';
import { idParam, isoDay, noHiddenChars, parse } from '../http/validate';
import { fleetRepository } from './repository';
import { fleetWriteService } from './write-service';
import { HARD_LIMITS, MODE_LIMITS, PRESETS, TYPICAL, TYPICAL_SOURCE, VEHICLE_CLASSES } from './spec-checks';
import { specBody, specPreviewBody } from '../contracts/specs';

const lat = z.number({ message: 'must be a number in degrees' }).min(-90, 'must be between −90° and 90°').max(90, 'must be between −90° and 90°');
const lon = z.number({ message: 'must be a number in degrees' }).min(-180, 'must be between −180° and 180°').max(180, 'must be between −180° and 180°');
const depotBody = z.object({ name: z.string({ message: 'is required' }).trim().min(2, 'must be at least 2 characters').max(120).refine(...noHiddenChars), address: z.string().trim().max(240).nullish(), lat, lon }).strict();

const positiveId = z.number({ message: 'must be an id' }).int().positive('must be an id');
const odometer = z.number({ message: 'must be a number in km' }).min(0, 'must be 0 km or more').max(5_000_000, 'must be at most 5 000 000 km');
const fleetNumber = z.string({ message: 'is required' }).trim().min(1, 'is required').max(20, 'must be 20 characters or fewer').regex(/^[A-Za-z0-9-]+$/, 'may use letters, digits and -');
const plate = z.string({ message: 'is required' }).trim().min(2, 'must be at least 2 characters').max(20, 'must be 20 characters or fewer').refine(...noHiddenChars);
const isoDate = isoDay;

const vehicleBody = z
  .object({
    fleetNumber,
    plate,
    specId: positiveId,
    depotId: positiveId,
    driverId: positiveId.nullish(),
    odometerKm: odometer.default(0),
    commissionedAt: isoDate.nullish(),
  })
  .strict();
const vehiclePatch = z
  .object({
    fleetNumber,
    plate,
    specId: positiveId,
    depotId: positiveId,
    driverId: positiveId.nullable(),
    odometerKm: odometer,
    status: z.enum(VEHICLE_STATUSES, { message: `must be one of ${VEHICLE_STATUSES.join(', ')}` }),
  })
  .partial()
  .strict()
  .refine((v) => Object.keys(v).length > 0, { message: 'give at least one field to change', path: ['_'] });

export function registerFleetWriteRoutes(r: Router, now: () => Date) {
  r.get('/spec-presets', allow('manager', 'mechanic'), (_req, res) => {
    res.json({ presets: PRESETS, typical: TYPICAL, typicalSource: TYPICAL_SOURCE, hardLimits: HARD_LIMITS, modeLimits: MODE_LIMITS, vehicleClasses: VEHICLE_CLASSES });
  });

  r.post('/specs/preview', allow('manager', 'mechanic'), (req, res) => {
    const body = parse(specPreviewBody, req.body, 'spec');
    res.json(fleetWriteService.previewSpec(body));
  });

  r.post('/specs', allow('manager'), async (req, res) => {
    const body = parse(specBody, req.body, 'spec');
    const id = await fleetWriteService.createSpec(body);
    res.status(201).json({ spec: await fleetRepository.findSpec(id) });
  });

  r.put('/specs/:id', allow('manager'), async (req, res) => {
    const { id } = parse(idParam, req.params, 'address');
    const body = parse(specBody, req.body, 'spec');
    await fleetWriteService.updateSpec(id, body);
    res.json({ spec: await fleetRepository.findSpec(id) });
  });

  r.post('/depots', allow('manager'), async (req, res) => {
    const body = parse(depotBody, req.body, 'depot');
    const id = await fleetWriteService.createDepot(body);
    res.status(201).json({ depot: (await fleetRepository.listDepots()).find((d) => d.id === id) });
  });

  r.patch('/depots/:id', allow('manager'), async (req, res) => {
    const { id } = parse(idParam, req.params, 'address');
    const body = parse(
      depotBody.partial().refine((v) => Object.keys(v).length > 0, { message: 'give at least one field to change', path: ['_'] }),
      req.body,
      'depot',
    );
    await fleetWriteService.updateDepot(id, body);
    res.json({ depot: (await fleetRepository.listDepots()).find((d) => d.id === id) });
  });

  r.post('/vehicles', allow('manager'), async (req, res) => {
    const body = parse(vehicleBody, req.body, 'vehicle');
    const id = await fleetWriteService.createVehicle(body, formatISO(now(), { representation: 'date' }));
    res.status(201).json({ vehicle: await fleetRepository.findVehicle(id) });
  });

  r.patch('/vehicles/:id', allow('manager'), async (req, res) => {
    const { id } = parse(idParam, req.params, 'address');
    const body = parse(vehiclePatch, req.body, 'vehicle');
    await fleetWriteService.updateVehicle(id, body);
    res.json({ vehicle: await fleetRepository.findVehicle(id) });
  });
}
