/** Rules for writing specs, vehicles and depots. */
import { AppError } from '../errors';
import { checkCorner, cornerPreview } from './spec-checks';
import { fleetWrites, type SpecInput, type VehicleInput } from './write-repository';
import type { VehicleStatus } from '../db/models';

function checkSpecAxles(s: { axles: SpecInput['axles'] }) {
  const fields: Record<string, string> = {};
  s.axles.forEach((a, i) => Object.assign(fields, checkCorner(a, `axles.${i}`)));
  if (Object.keys(fields).length) {
    throw AppError.badRequest('Some corner parameters do not make physical sense. Each message names the axle, the field and its unit.', fields);
  }
}

export const fleetWriteService = {
  previewSpec(s: { vehicleClass: string; axles: SpecInput['axles'] }) {
    checkSpecAxles(s);
    return { axles: s.axles.map((a) => ({ label: a.label, ...cornerPreview(a, s.vehicleClass) })) };
  },

  async createSpec(s: SpecInput) {
    checkSpecAxles(s);
    if (await fleetWrites.specNameTaken(s.name)) throw AppError.conflict('A spec with this name already exists.', { name: 'is already in use' });
    return fleetWrites.createSpec(s);
  },

  async updateSpec(id: number, s: SpecInput) {
    if (!(await fleetWrites.specExists(id))) throw AppError.notFound('Suspension spec');
    checkSpecAxles(s);
    if (await fleetWrites.specNameTaken(s.name, id)) throw AppError.conflict('A spec with this name already exists.', { name: 'is already in use' });
    const conflict = await fleetWrites.specVehicleAxleConflict(id, s.axles.length);
    if (conflict > 0) {
      throw AppError.conflict(`${conflict} fitted damper(s) on vehicles of this spec sit on an axle the edited spec no longer has. Keep the number of axles, or move those vehicles to another spec first.`, {
        axles: `must keep at least as many axles as the vehicles of this spec have`,
      });
    }
    await fleetWrites.updateSpec(id, s);
  },

  async createDepot(d: { name: string; address?: string | null; lat: number; lon: number }) {
    if (await fleetWrites.depotNameTaken(d.name)) throw AppError.conflict('A depot with this name already exists.', { name: 'is already in use' });
    return fleetWrites.createDepot(d);
  },

  async updateDepot(id: number, d: Partial<{ name: string; address: string | null; lat: number; lon: number }>) {
    if (!(await fleetWrites.depotExists(id))) throw AppError.notFound('Depot');
    if (d.name && (await fleetWrites.depotNameTaken(d.name, id))) throw AppError.conflict('A depot with this name already exists.', { name: 'is already in use' });
    await fleetWrites.updateDepot(id, d);
  },

  async checkVehicleRefs(v: Partial<VehicleInput>, exceptId?: number) {
    const fields: Record<string, string> = {};
    if (v.specId !== undefined && !(await fleetWrites.specExists(v.specId))) fields.specId = `no spec with id ${v.specId}`;
    if (v.depotId !== undefined && !(await fleetWrites.depotExists(v.depotId))) fields.depotId = `no depot with id ${v.depotId}`;
    if (v.driverId) {
      const u = await fleetWrites.findUser(v.driverId);
      if (!u) fields.driverId = `no person with id ${v.driverId}`;
      else if (u.role !== 'driver') fields.driverId = `${u.name} is not a driver`;
      else if (!u.active) fields.driverId = `${u.name}'s account is deactivated`;
      else {
        const other = await fleetWrites.vehicleOfDriver(v.driverId, exceptId);
        if (other) fields.driverId = `${u.name} already drives ${other.fleetNumber}; unassign them there first`;
      }
    }
    if (Object.keys(fields).length) throw AppError.badRequest('Some references are not valid.', fields);
    const taken: Record<string, string> = {};
    if (v.fleetNumber && (await fleetWrites.vehicleTaken('fleetNumber', v.fleetNumber, exceptId))) taken.fleetNumber = 'is already in use';
    if (v.plate && (await fleetWrites.vehicleTaken('plate', v.plate, exceptId))) taken.plate = 'is already in use';
    if (Object.keys(taken).length) throw AppError.conflict('Another vehicle already has this fleet number or plate.', taken);
  },

  async createVehicle(v: VehicleInput, today: string) {
    await fleetWriteService.checkVehicleRefs(v);
    return fleetWrites.createVehicle(v, today);
  },

  async updateVehicle(id: number, patch: Partial<VehicleInput> & { status?: VehicleStatus }) {
    const current = await fleetWrites.vehicleRaw(id);
    if (!current) throw AppError.notFound('Vehicle');
    if (patch.odometerKm !== undefined && patch.odometerKm < current.odometerKm) {
      throw AppError.badRequest('The odometer cannot go backwards.', {
        odometerKm: `${patch.odometerKm} km is less than the recorded ${current.odometerKm} km`,
      });
    }
    if (patch.specId !== undefined && patch.specId !== current.specId) {
      if (!(await fleetWrites.specExists(patch.specId))) throw AppError.badRequest('Some references are not valid.', { specId: `no spec with id ${patch.specId}` });
      const [a, b] = await Promise.all([fleetWrites.specAxleCount(current.specId), fleetWrites.specAxleCount(patch.specId)]);
      if (a !== b) throw AppError.badRequest('The new spec has a different number of axles.', { specId: `has ${b} axle(s); this vehicle has ${a}` });
    }
    const retiring = patch.status === 'retired';
    await fleetWriteService.checkVehicleRefs({ ...patch, driverId: retiring ? null : patch.driverId }, id);
    await fleetWrites.updateVehicle(id, retiring ? { ...patch, driverId: null } : patch);
  },
};
