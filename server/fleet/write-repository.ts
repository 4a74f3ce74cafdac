/** Writes to specs, vehicles and depots (the only place these writes touch Sequelize). */
import { Op } from 'sequelize';
import type { AxleBody, SpecBody } from '../contracts/specs';
import { Damper, Depot, SpecAxle, SuspensionSpec, User, Vehicle, type VehicleStatus } from '../db/models';

/** A spec as written: the body the spec endpoints parse (server/contracts/specs.ts). */
export type AxleInput = AxleBody;
export type SpecInput = SpecBody;

export interface VehicleInput {
  fleetNumber: string;
  plate: string;
  specId: number;
  depotId: number;
  driverId?: number | null;
  odometerKm: number;
  status?: VehicleStatus;
  commissionedAt?: string | null;
}

export const fleetWrites = {
  async specNameTaken(name: string, exceptId?: number) {
    return (await SuspensionSpec.count({ where: { name, ...(exceptId ? { id: { [Op.ne]: exceptId } } : {}) } })) > 0;
  },
  async specExists(id: number) {
    return (await SuspensionSpec.count({ where: { id } })) > 0;
  },
  async specAxleCount(id: number) {
    return SpecAxle.count({ where: { specId: id } });
  },
  async specVehicleAxleConflict(specId: number, axleCount: number) {
    // vehicles of this spec whose fitted dampers sit on an axle the new spec no longer has
    return Damper.count({
      where: { axleIndex: { [Op.gte]: axleCount }, removedAt: null },
      include: [{ model: Vehicle, as: 'vehicle', where: { specId }, attributes: [] }],
    });
  },
  async createSpec(s: SpecInput) {
    return Vehicle.sequelize!.transaction(async (transaction) => {
      const row = await SuspensionSpec.create({ name: s.name, vehicleClass: s.vehicleClass, description: s.description ?? null, seatFactor: s.seatFactor ?? null, cabFactor: s.cabFactor ?? null }, { transaction });
      await SpecAxle.bulkCreate(
        s.axles.map((a, axleIndex) => ({ ...a, axleIndex, specId: row.id })),
        { transaction },
      );
      return row.id;
    });
  },
  async updateSpec(id: number, s: SpecInput) {
    await Vehicle.sequelize!.transaction(async (transaction) => {
      await SuspensionSpec.update({ name: s.name, vehicleClass: s.vehicleClass, description: s.description ?? null, seatFactor: s.seatFactor ?? null, cabFactor: s.cabFactor ?? null }, { where: { id }, transaction });
      await SpecAxle.destroy({ where: { specId: id }, transaction });
      await SpecAxle.bulkCreate(
        s.axles.map((a, axleIndex) => ({ ...a, axleIndex, specId: id })),
        { transaction },
      );
    });
  },

  async depotExists(id: number) {
    return (await Depot.count({ where: { id } })) > 0;
  },
  async depotNameTaken(name: string, exceptId?: number) {
    return (await Depot.count({ where: { name, ...(exceptId ? { id: { [Op.ne]: exceptId } } : {}) } })) > 0;
  },
  async createDepot(d: { name: string; address?: string | null; lat: number; lon: number }) {
    const row = await Depot.create({ name: d.name, address: d.address ?? null, lat: d.lat, lon: d.lon });
    return row.id;
  },
  async updateDepot(id: number, d: Partial<{ name: string; address: string | null; lat: number; lon: number }>) {
    await Depot.update(d, { where: { id } });
  },

  async findUser(id: number) {
    const u = await User.findByPk(id, { attributes: ['id', 'role', 'active', 'name'] });
    return u ? { id: u.id, role: u.role, active: u.active, name: u.name } : null;
  },
  async vehicleOfDriver(driverId: number, exceptVehicleId?: number) {
    const v = await Vehicle.findOne({
      where: { driverId, status: { [Op.ne]: 'retired' }, ...(exceptVehicleId ? { id: { [Op.ne]: exceptVehicleId } } : {}) },
      attributes: ['id', 'fleetNumber'],
    });
    return v ? { id: v.id, fleetNumber: v.fleetNumber } : null;
  },
  async vehicleTaken(field: 'fleetNumber' | 'plate', value: string, exceptId?: number) {
    return (await Vehicle.count({ where: { [field]: value, ...(exceptId ? { id: { [Op.ne]: exceptId } } : {}) } })) > 0;
  },
  async vehicleRaw(id: number) {
    const v = await Vehicle.findByPk(id);
    return v ? { id: v.id, specId: v.specId, odometerKm: v.odometerKm, status: v.status, driverId: v.driverId ?? null } : null;
  },
  /** Creates the vehicle and a new damper on every corner of its spec. */
  async createVehicle(v: VehicleInput, installedOn: string) {
    return Vehicle.sequelize!.transaction(async (transaction) => {
      const row = await Vehicle.create(
        {
          fleetNumber: v.fleetNumber,
          plate: v.plate,
          specId: v.specId,
          depotId: v.depotId,
          driverId: v.driverId ?? null,
          odometerKm: v.odometerKm,
          status: v.status ?? 'in_service',
          commissionedAt: v.commissionedAt ?? installedOn,
        },
        { transaction },
      );
      const axles = await SpecAxle.findAll({ where: { specId: v.specId }, order: [['axleIndex', 'ASC']], transaction });
      const sides = (i: number) => (i === 0 ? ['FL', 'FR'] : i === axles.length - 1 ? ['RL', 'RR'] : [`M${i}L`, `M${i}R`]);
      await Damper.bulkCreate(
        axles.flatMap((a) =>
          sides(a.axleIndex).map((position) => ({
            vehicleId: row.id,
            position,
            axleIndex: a.axleIndex,
            partNumber: null,
            installedAt: installedOn,
            installedOdometerKm: v.odometerKm,
            removedByWorkRecordId: null,
          })),
        ),
        { transaction },
      );
      return row.id;
    });
  },
  async updateVehicle(id: number, patch: Partial<VehicleInput>) {
    await Vehicle.update(patch, { where: { id } });
  },
};
