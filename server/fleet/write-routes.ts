import type { Router } from 'express';
import { formatISO } from 'date-fns';
import { allow } from '../http/access';
import { idParam, parse } from '../http/validate';
import { fleetRepository } from './repository';
import { fleetWriteService } from './write-service';
import { HARD_LIMITS, MODE_LIMITS, PRESETS, TYPICAL, TYPICAL_SOURCE, VEHICLE_CLASSES } from './spec-checks';
import { specBody, specPreviewBody } from '../contracts/specs';
import { depotBody, vehicleBody, vehiclePatch } from '../contracts/fleet';

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
