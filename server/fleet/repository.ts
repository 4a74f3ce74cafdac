import { Op, fn, col, literal, type Order, type WhereOptions } from 'sequelize';
import { floorToSeat, type FloorToSeat } from '../physics/seat';
import type { VehicleListItem } from '../contracts/fleet';
import type { CornerParams } from '../contracts/specs';
import {
  Damper,
  Depot,
  Inspection,
  Route,
  SpecAxle,
  SuspensionSpec,
  Trip,
  User,
  Vehicle,
  type VehicleStatus,
} from '../db/models';
import { likeOp } from '../db/dialect';

export interface AxleRow {
  axleIndex: number;
  label: string;
  corner: CornerParams;
  ratedDamperLifeKm: number;
}

const seatOf = (s: { vehicleClass: string; seatFactor?: number | null; cabFactor?: number | null }) => {
  const seatFactor = s.seatFactor ?? null;
  const cabFactor = s.cabFactor ?? null;
  return { seatFactor, cabFactor, used: floorToSeat({ vehicleClass: s.vehicleClass, seatFactor, cabFactor }) };
};

export interface SpecRow {
  id: number;
  name: string;
  vehicleClass: string;
  description: string | null;
  /** Floor-to-seat factors for drivers' exposure (entered values, null = default / none) and what is used. */
  seat: { seatFactor: number | null; cabFactor: number | null; used: FloorToSeat };
  axles: AxleRow[];
  vehicleCount: number;
}

/** A vehicle as the list and the vehicle page answer it (server/contracts/fleet.ts). */
export type VehicleRow = VehicleListItem;

const axleRow = (a: SpecAxle): AxleRow => ({
  axleIndex: a.axleIndex,
  label: a.label,
  corner: {
    sprungMassKg: a.sprungMassKg,
    unsprungMassKg: a.unsprungMassKg,
    springRateNPerM: a.springRateNPerM,
    dampingNsPerM: a.dampingNsPerM,
    tireRateNPerM: a.tireRateNPerM,
  },
  ratedDamperLifeKm: a.ratedDamperLifeKm,
});

const vehicleInclude = [
  { model: SuspensionSpec, as: 'spec', attributes: ['id', 'name'] },
  { model: Depot, as: 'depot', attributes: ['id', 'name'] },
  { model: User, as: 'driver', attributes: ['id', 'name'] },
];

type VehicleWith = Vehicle & { spec?: SuspensionSpec; depot?: Depot; driver?: User | null };

const vehicleRow = (v: VehicleWith): VehicleRow => ({
  id: v.id,
  fleetNumber: v.fleetNumber,
  plate: v.plate,
  status: v.status,
  odometerKm: v.odometerKm,
  specId: v.specId,
  specName: v.spec?.name ?? '',
  depotId: v.depotId,
  depotName: v.depot?.name ?? '',
  driverId: v.driverId ?? null,
  driverName: v.driver?.name ?? null,
  commissionedAt: v.commissionedAt,
});

export type VehicleSort = 'fleetNumber' | 'plate' | 'odometerKm' | 'status' | 'depotName' | 'specName';

export const fleetRepository = {
  async listDepots() {
    const depots = await Depot.findAll({ order: [['name', 'ASC']] });
    const counts = (await Vehicle.findAll({
      attributes: ['depotId', [fn('COUNT', col('id')), 'n']],
      where: { status: { [Op.ne]: 'retired' } },
      group: ['depotId'],
      raw: true,
    })) as unknown as { depotId: number; n: number }[];
    const byDepot = new Map(counts.map((c) => [c.depotId, Number(c.n)]));
    return depots.map((d) => ({
      id: d.id,
      name: d.name,
      address: d.address,
      lat: d.lat,
      lon: d.lon,
      vehicleCount: byDepot.get(d.id) ?? 0,
    }));
  },

  async listSpecs(): Promise<SpecRow[]> {
    const specs = await SuspensionSpec.findAll({
      include: [{ model: SpecAxle, as: 'axles' }],
      order: [
        ['name', 'ASC'],
        [{ model: SpecAxle, as: 'axles' }, 'axleIndex', 'ASC'],
      ],
    });
    const counts = (await Vehicle.findAll({
      attributes: ['specId', [fn('COUNT', col('id')), 'n']],
      where: { status: { [Op.ne]: 'retired' } },
      group: ['specId'],
      raw: true,
    })) as unknown as { specId: number; n: number }[];
    const bySpec = new Map(counts.map((c) => [c.specId, Number(c.n)]));
    return specs.map((s) => ({
      id: s.id,
      name: s.name,
      vehicleClass: s.vehicleClass,
      description: s.description,
      seat: seatOf(s),
      axles: (s.axles ?? []).map(axleRow),
      vehicleCount: bySpec.get(s.id) ?? 0,
    }));
  },

  /** The spec of the driver's vehicle (the first by id when they have several), or null. */
  async driverSpecId(driverId: number): Promise<number | null> {
    return (await Vehicle.findOne({ where: { driverId }, attributes: ['specId'], order: [['id', 'ASC']] }))?.specId ?? null;
  },

  async firstSpecId(): Promise<number | null> {
    return (await SuspensionSpec.findOne({ attributes: ['id'], order: [['id', 'ASC']] }))?.id ?? null;
  },

  async findSpec(id: number): Promise<SpecRow | null> {
    const s = await SuspensionSpec.findByPk(id, {
      include: [{ model: SpecAxle, as: 'axles' }],
      order: [[{ model: SpecAxle, as: 'axles' }, 'axleIndex', 'ASC']],
    });
    if (!s) return null;
    const vehicleCount = await Vehicle.count({ where: { specId: id, status: { [Op.ne]: 'retired' } } });
    return { id: s.id, name: s.name, vehicleClass: s.vehicleClass, description: s.description, seat: seatOf(s), axles: (s.axles ?? []).map(axleRow), vehicleCount };
  },

  async listVehicles(q: {
    offset: number;
    pageSize: number;
    sort: { field: VehicleSort; dir: 'ASC' | 'DESC' };
    q?: string;
    depotId?: number;
    specId?: number;
    status?: VehicleStatus;
    driverId?: number;
  }) {
    const and: WhereOptions[] = [];
    if (q.q) {
      const like = likeOp(Vehicle.sequelize!);
      and.push({ [Op.or]: [{ fleetNumber: { [like]: `%${q.q}%` } }, { plate: { [like]: `%${q.q}%` } }] });
    }
    if (q.depotId) and.push({ depotId: q.depotId });
    if (q.specId) and.push({ specId: q.specId });
    if (q.status) and.push({ status: q.status });
    if (q.driverId !== undefined) and.push({ driverId: q.driverId });
    const order: Order =
      q.sort.field === 'depotName'
        ? [[{ model: Depot, as: 'depot' }, 'name', q.sort.dir]]
        : q.sort.field === 'specName'
          ? [[{ model: SuspensionSpec, as: 'spec' }, 'name', q.sort.dir]]
          : [[q.sort.field, q.sort.dir]];
    const { rows, count } = await Vehicle.findAndCountAll({
      where: and.length ? { [Op.and]: and } : {},
      include: vehicleInclude,
      order: [...(order as unknown[]), ['fleetNumber', 'ASC']] as Order,
      offset: q.offset,
      limit: q.pageSize,
      distinct: true,
    });
    return { items: rows.map((v) => vehicleRow(v as VehicleWith)), total: count };
  },

  async findVehicle(id: number) {
    const v = (await Vehicle.findByPk(id, { include: vehicleInclude })) as VehicleWith | null;
    return v ? vehicleRow(v) : null;
  },

  async vehicleDetail(id: number) {
    const vehicle = await fleetRepository.findVehicle(id);
    if (!vehicle) return null;
    const [spec, depot, dampers, trips, inspections] = await Promise.all([
      fleetRepository.findSpec(vehicle.specId),
      Depot.findByPk(vehicle.depotId),
      Damper.findAll({ where: { vehicleId: id }, order: [['removedAt', 'ASC'], ['axleIndex', 'ASC'], ['position', 'ASC'], ['installedAt', 'DESC']] }),
      Trip.findAll({
        where: { vehicleId: id },
        include: [
          { model: Route, as: 'route', attributes: ['id', 'name'] },
          { model: User, as: 'driver', attributes: ['id', 'name'] },
        ],
        order: [['startedAt', 'DESC']],
        limit: 20,
      }),
      Inspection.findAll({ where: { vehicleId: id }, order: [['dueDate', 'DESC']], limit: 20 }),
    ]);
    return {
      vehicle,
      spec,
      depot: depot ? { id: depot.id, name: depot.name, lat: depot.lat, lon: depot.lon } : null,
      driver: vehicle.driverId ? { id: vehicle.driverId, name: vehicle.driverName } : null,
      dampers: dampers.map((d) => ({
        id: d.id,
        position: d.position,
        axleIndex: d.axleIndex,
        partNumber: d.partNumber,
        installedAt: d.installedAt,
        installedOdometerKm: d.installedOdometerKm,
        removedAt: d.removedAt ?? null,
        removedOdometerKm: d.removedOdometerKm ?? null,
        removalReason: d.removalReason ?? null,
        lifeUsedFraction: d.lifeUsedFraction,
        dampingNsPerM: d.dampingNsPerM ?? null,
        wearUpdatedAt: d.wearUpdatedAt ? new Date(d.wearUpdatedAt).toISOString() : null,
        distanceKm: (d.removedOdometerKm ?? vehicle.odometerKm) - d.installedOdometerKm,
        openingKm: d.openingKm ?? null,
        openingBasis: d.openingBasis ?? null,
      })),
      recentTrips: trips.map((t) => {
        const tw = t as Trip & { route?: Route; driver?: User | null };
        return {
          id: t.id,
          routeId: t.routeId,
          routeName: tw.route?.name ?? '',
          startedAt: t.startedAt.toISOString(),
          endedAt: t.endedAt.toISOString(),
          distanceKm: t.distanceKm,
          meanSpeedKmh: t.meanSpeedKmh,
          payloadKg: t.payloadKg,
          driverName: tw.driver?.name ?? null,
        };
      }),
      inspections: inspections.map((i) => ({
        id: i.id,
        dueDate: i.dueDate,
        status: i.status,
        reason: i.reason,
        completedAt: i.completedAt ? i.completedAt.toISOString() : null,
      })),
    };
  },

  async listRoutes(q: { offset: number; pageSize: number; sort: { field: 'name' | 'lengthM'; dir: 'ASC' | 'DESC' }; q?: string }) {
    const where = q.q ? { name: { [likeOp(Route.sequelize!)]: `%${q.q}%` } } : {};
    const { rows, count } = await Route.findAndCountAll({
      where,
      attributes: {
        exclude: ['geometry'],
        include: [
          [literal('(SELECT COUNT(*) FROM route_segments s WHERE s.route_id = "Route"."id")'), 'segmentCount'],
          [literal('(SELECT MAX(s.iso_class) FROM route_segments s WHERE s.route_id = "Route"."id")'), 'worstClass'],
        ],
      },
      order: [[q.sort.field, q.sort.dir], ['id', 'ASC']],
      offset: q.offset,
      limit: q.pageSize,
    });
    return {
      items: rows.map((r) => ({
        id: r.id,
        name: r.name,
        description: r.description,
        lengthKm: r.lengthM / 1000,
        defaultSpeedKmh: r.defaultSpeedKmh,
        segmentCount: Number(r.get('segmentCount')),
        worstClass: (r.get('worstClass') as string | null) ?? null,
      })),
      total: count,
    };
  },
};
