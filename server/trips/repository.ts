/** Trips data access. */
import { Op, type Order, type Transaction, type WhereOptions } from 'sequelize';
import { Route, Trip, TripImport, User, Vehicle } from '../db/models';

export type TripSort = 'startedAt' | 'distanceKm' | 'meanSpeedKmh' | 'fleetNumber' | 'routeName';

export interface TripInput {
  vehicleId: number;
  routeId: number;
  driverId: number | null;
  startedAt: Date;
  endedAt: Date;
  distanceKm: number;
  meanSpeedKmh: number;
  payloadKg: number | null;
}

/** Trips per INSERT statement when importing. */
const INSERT_SLICE = 250;

export const tripsRepository = {
  async lookups() {
    const [vehicles, routes, drivers] = await Promise.all([
      Vehicle.findAll({ attributes: ['id', 'fleetNumber', 'status'] }),
      Route.findAll({ attributes: ['id', 'name', 'lengthM'] }),
      User.findAll({ attributes: ['id', 'email', 'name', 'role', 'active'] }),
    ]);
    return {
      vehicles: vehicles.map((v) => ({ id: v.id, fleetNumber: v.fleetNumber, status: v.status })),
      routes: routes.map((r) => ({ id: r.id, name: r.name, lengthM: r.lengthM })),
      users: drivers.map((u) => ({ id: u.id, email: u.email, name: u.name, role: u.role, active: u.active })),
    };
  },

  /** Existing trips of these vehicles or drivers that overlap [from, to]. */
  async overlapping(vehicleIds: number[], driverIds: number[], from: Date, to: Date, transaction?: Transaction) {
    const or: WhereOptions[] = [];
    if (vehicleIds.length) or.push({ vehicleId: { [Op.in]: vehicleIds } });
    if (driverIds.length) or.push({ driverId: { [Op.in]: driverIds } });
    if (!or.length) return [];
    const rows = await Trip.findAll({
      where: { [Op.and]: [{ [Op.or]: or }, { startedAt: { [Op.lt]: to } }, { endedAt: { [Op.gt]: from } }] },
      attributes: ['id', 'vehicleId', 'driverId', 'startedAt', 'endedAt'],
      transaction,
    });
    return rows.map((t) => ({ id: t.id, vehicleId: t.vehicleId, driverId: t.driverId ?? null, startedAt: t.startedAt, endedAt: t.endedAt }));
  },

  async importByHash(fileSha256: string, transaction?: Transaction) {
    return TripImport.findOne({ where: { fileSha256 }, attributes: ['id', 'importedAt', 'rowCount'], transaction });
  },

  /**
   * Stores trips (and the import row) in one transaction; `check` runs first inside it and throws
   * to refuse. The transaction is IMMEDIATE (server/db/index.ts), so what `check` reads cannot
   * change before the insert.
   */
  async insert(
    trips: TripInput[],
    importMeta: { originalName: string; importedById: number; importedAt: Date; fileSha256: string } | null,
    check: (t: Transaction) => Promise<void> = async () => {},
  ) {
    return Trip.sequelize!.transaction(async (transaction: Transaction) => {
      await check(transaction);
      let importId: number | null = null;
      if (importMeta) importId = (await TripImport.create({ ...importMeta, rowCount: trips.length }, { transaction })).id;
      // in slices, so a 10 000-row file does not hold the event loop while Sequelize builds one
      // huge statement: other requests are served between slices
      const ids: number[] = [];
      for (let i = 0; i < trips.length; i += INSERT_SLICE) {
        const created = await Trip.bulkCreate(
          trips.slice(i, i + INSERT_SLICE).map((t) => ({ ...t, importId })),
          { transaction, returning: true },
        );
        ids.push(...created.map((t) => t.id));
        await new Promise((resolve) => setImmediate(resolve));
      }
      return { importId, ids };
    });
  },

  async list(q: {
    offset: number;
    pageSize: number;
    sort: { field: TripSort; dir: 'ASC' | 'DESC' };
    vehicleId?: number;
    routeId?: number;
    driverId?: number;
    from?: string;
    to?: string;
  }) {
    const and: WhereOptions[] = [];
    if (q.vehicleId) and.push({ vehicleId: q.vehicleId });
    if (q.routeId) and.push({ routeId: q.routeId });
    if (q.driverId) and.push({ driverId: q.driverId });
    if (q.from) and.push({ startedAt: { [Op.gte]: new Date(`${q.from}T00:00:00Z`) } });
    if (q.to) and.push({ startedAt: { [Op.lt]: new Date(new Date(`${q.to}T00:00:00Z`).getTime() + 86_400_000) } });
    const order: Order =
      q.sort.field === 'fleetNumber'
        ? [[{ model: Vehicle, as: 'vehicle' }, 'fleetNumber', q.sort.dir]]
        : q.sort.field === 'routeName'
          ? [[{ model: Route, as: 'route' }, 'name', q.sort.dir]]
          : [[q.sort.field, q.sort.dir]];
    const { rows, count } = await Trip.findAndCountAll({
      where: and.length ? { [Op.and]: and } : {},
      include: [
        { model: Vehicle, as: 'vehicle', attributes: ['id', 'fleetNumber'] },
        { model: Route, as: 'route', attributes: ['id', 'name'] },
        { model: User, as: 'driver', attributes: ['id', 'name'] },
      ],
      order: [...(order as unknown[]), ['id', 'DESC']] as Order,
      offset: q.offset,
      limit: q.pageSize,
    });
    return {
      items: rows.map((t) => {
        const tw = t as Trip & { vehicle?: Vehicle; route?: Route; driver?: User | null };
        return {
          id: t.id,
          vehicleId: t.vehicleId,
          fleetNumber: tw.vehicle?.fleetNumber ?? '',
          routeId: t.routeId,
          routeName: tw.route?.name ?? '',
          driverId: t.driverId ?? null,
          driverName: tw.driver?.name ?? null,
          startedAt: t.startedAt.toISOString(),
          endedAt: t.endedAt.toISOString(),
          distanceKm: t.distanceKm,
          meanSpeedKmh: t.meanSpeedKmh,
          payloadKg: t.payloadKg,
          processed: t.processedAt !== null,
        };
      }),
      total: count,
    };
  },

  /** Payloads [kg] of the most recent trips of a spec's vehicles that carried one, newest first. */
  async recentPayloadsKg(specId: number, limit: number): Promise<number[]> {
    const rows = await Trip.findAll({
      attributes: ['payloadKg'],
      where: { payloadKg: { [Op.gt]: 0 } },
      include: [{ model: Vehicle, as: 'vehicle', attributes: [], where: { specId }, required: true }],
      order: [['startedAt', 'DESC']],
      limit,
      raw: true,
    });
    return rows.map((r) => Number(r.payloadKg));
  },
};
