/** Ride reports data access. Returns plain objects. */
import { Op, QueryTypes, type Order, type Sequelize, type Transaction, type WhereOptions } from 'sequelize';
import { RideReport, type RideReportStatus } from '../db/models';
import { Route, RouteSegment, User, Vehicle } from '../db/models';
import { sqlFor } from '../db/dialect';
import type { LonLat } from '../roads/geometry';
import type { RideReportFiled, RideReportView } from '../contracts/drivers';

export type RideReportSort = 'reportedAt' | 'severity' | 'status' | 'snapDistanceM';

type Joined = RideReport & { driver?: User | null; decidedBy?: User | null; vehicle?: Vehicle | null; route?: Route | null; segment?: RouteSegment | null };

const row = (r: Joined): RideReportView => ({
  id: r.id,
  driverId: r.driverId,
  driverName: r.driver?.name ?? null,
  vehicleId: r.vehicleId ?? null,
  fleetNumber: r.vehicle?.fleetNumber ?? null,
  routeId: r.routeId,
  routeName: r.route?.name ?? '',
  segmentId: r.segmentId,
  segmentSeq: r.segment?.seq ?? null,
  segmentStartM: r.segment?.startM ?? null,
  segmentEndM: r.segment?.endM ?? null,
  segmentClass: r.segment?.isoClass ?? null,
  segmentGdN0: r.segment?.gdN0 ?? null,
  segmentIri: r.segment?.iri ?? null,
  segmentSource: r.segment?.roughnessSource ?? null,
  lat: r.lat,
  lon: r.lon,
  positionSource: r.positionSource,
  accuracyM: r.accuracyM,
  snappedLat: r.snappedLat,
  snappedLon: r.snappedLon,
  snapDistanceM: r.snapDistanceM,
  severity: r.severity,
  felt: JSON.parse(r.felt) as string[],
  note: r.note,
  hasPhoto: !!r.photoPath,
  photoType: r.photoType,
  photoBytes: r.photoBytes,
  reportedAt: r.reportedAt.toISOString(),
  status: r.status,
  decidedByName: r.decidedBy?.name ?? null,
  decidedAt: r.decidedAt ? r.decidedAt.toISOString() : null,
  dismissReason: r.dismissReason,
  classBefore: r.classBefore,
  estimatedClass: r.estimatedClass,
  estimatedGdN0: r.estimatedGdN0,
  classAfter: r.classAfter ?? null,
  gdN0After: r.gdN0After ?? null,
  observationId: r.observationId ?? null,
});

const include = [
  { model: User, as: 'driver', attributes: ['id', 'name'] },
  { model: User, as: 'decidedBy', attributes: ['id', 'name'] },
  { model: Vehicle, as: 'vehicle', attributes: ['id', 'fleetNumber'] },
  { model: Route, as: 'route', attributes: ['id', 'name'] },
  { model: RouteSegment, as: 'segment', attributes: ['id', 'seq', 'startM', 'endM', 'isoClass', 'gdN0', 'iri', 'roughnessSource'] },
];

/** A report as it is stored: what the driver filed, where its photo is kept and when it came. */
export interface NewRideReport extends RideReportFiled {
  photoPath: string | null;
  reportedAt: Date;
}

export const rideReportsRepository = {
  /** Every segment's polyline, for snapping. */
  async segmentLines(): Promise<{ id: number; routeId: number; coords: LonLat[] }[]> {
    const rows = (await RouteSegment.findAll({ attributes: ['id', 'routeId', 'geometry'], raw: true })) as unknown as { id: number; routeId: number; geometry: string }[];
    return rows.map((r) => ({ id: r.id, routeId: r.routeId, coords: JSON.parse(r.geometry) as LonLat[] }));
  },

  async segmentInfo(id: number, t?: Transaction) {
    const s = await RouteSegment.findByPk(id, { include: [{ model: Route, as: 'route', attributes: ['id', 'name', 'depotId'] }], transaction: t });
    if (!s) return null;
    const route = (s as RouteSegment & { route?: Route }).route;
    return { id: s.id, routeId: s.routeId, routeName: route?.name ?? '', depotId: route?.depotId ?? null, seq: s.seq, startM: s.startM, endM: s.endM, isoClass: s.isoClass ?? null, gdN0: s.gdN0 ?? null, iri: s.iri ?? null, roughnessSource: s.roughnessSource ?? null, roughnessDate: s.roughnessDate ?? null };
  },

  async vehicleOfDriver(driverId: number) {
    const v = await Vehicle.findOne({ where: { driverId }, attributes: ['id'], order: [['id', 'ASC']] });
    return v?.id ?? null;
  },

  async create(r: NewRideReport) {
    const created = await RideReport.create({ ...r, felt: JSON.stringify(r.felt), status: 'new', decidedById: null, decidedAt: null, dismissReason: null, classBefore: null, estimatedClass: null, estimatedGdN0: null, observationId: null, digestNotifiedAt: null });
    return created.id;
  },

  async find(id: number, t?: Transaction) {
    const r = await RideReport.findByPk(id, { include, transaction: t });
    return r ? { ...row(r as Joined), photoPath: r.photoPath } : null;
  },

  async list(q: { offset: number; pageSize: number; sort: { field: RideReportSort; dir: 'ASC' | 'DESC' }; driverId?: number; status?: RideReportStatus; routeId?: number; segmentId?: number; minSeverity?: number }) {
    const and: WhereOptions[] = [];
    if (q.driverId) and.push({ driverId: q.driverId });
    if (q.status) and.push({ status: q.status });
    if (q.routeId) and.push({ routeId: q.routeId });
    if (q.segmentId) and.push({ segmentId: q.segmentId });
    if (q.minSeverity) and.push({ severity: { [Op.gte]: q.minSeverity } });
    const order: Order = [[q.sort.field, q.sort.dir], ['id', 'DESC']];
    const { rows, count } = await RideReport.findAndCountAll({ where: and.length ? { [Op.and]: and } : {}, include, order, offset: q.offset, limit: q.pageSize });
    return { items: rows.map((r) => row(r as Joined)), total: count };
  },

  /** Reports grouped by segment (one row per segment with reports in `status`). */
  async groups(status: RideReportStatus) {
    // the reports' ids are their keys, so the list's DISTINCT drops none; the route's name is
    // grouped with its segment (PostgreSQL wants every selected column grouped or aggregated)
    const ids = sqlFor(RideReport.sequelize!).distinctList('rr.id');
    const rows = await RideReport.sequelize!.query<{
      segment_id: number; route_id: number; route_name: string; seq: number; start_m: number; end_m: number; iso_class: string | null; gd_n0: number | null;
      roughness_source: string | null; geometry: string; n: number; max_severity: number; first_at: string; last_at: string; ids: string;
    }>(
      `SELECT s.id AS segment_id, s.route_id, r.name AS route_name, s.seq, s.start_m, s.end_m, s.iso_class, s.gd_n0, s.roughness_source, s.geometry,
              COUNT(*) AS n, MAX(rr.severity) AS max_severity, MIN(rr.reported_at) AS first_at, MAX(rr.reported_at) AS last_at, ${ids} AS ids
       FROM ride_reports rr JOIN route_segments s ON s.id = rr.segment_id JOIN routes r ON r.id = s.route_id
       WHERE rr.status = ? GROUP BY s.id, r.id ORDER BY MAX(rr.severity) DESC, COUNT(*) DESC, MAX(rr.reported_at) DESC`,
      { replacements: [status], type: QueryTypes.SELECT },
    );
    return rows.map((g) => {
      const coords = JSON.parse(g.geometry) as LonLat[];
      const mid = coords[Math.floor(coords.length / 2)];
      return {
        segmentId: g.segment_id,
        routeId: g.route_id,
        routeName: g.route_name,
        seq: g.seq,
        startM: g.start_m,
        endM: g.end_m,
        isoClass: g.iso_class,
        gdN0: g.gd_n0,
        roughnessSource: g.roughness_source,
        coords,
        mid,
        count: Number(g.n),
        maxSeverity: Number(g.max_severity),
        firstAt: new Date(g.first_at).toISOString(),
        lastAt: new Date(g.last_at).toISOString(),
        reportIds: String(g.ids).split(',').map(Number).sort((a, b) => a - b),
      };
    });
  },

  async decide(id: number, patch: Partial<{ status: RideReportStatus; decidedById: number; decidedAt: Date; dismissReason: string | null; classBefore: string | null; estimatedClass: string | null; estimatedGdN0: number | null; classAfter: string | null; gdN0After: number | null; observationId: number | null }>, t: Transaction) {
    const [n] = await RideReport.update(patch, { where: { id, status: 'new' }, transaction: t });
    return n;
  },

  async driverContact(driverId: number, t?: Transaction) {
    const u = await User.findByPk(driverId, { attributes: ['id', 'name', 'email', 'active', 'notifyRideReports'], transaction: t });
    return u ? { id: u.id, name: u.name, email: u.email, active: u.active, notify: u.notifyRideReports } : null;
  },

  transaction<T>(fn: (t: Transaction) => Promise<T>) {
    return RideReport.sequelize!.transaction(fn);
  },

  /** Reports at or above `minSeverity`, still new and not yet in a digest, oldest first, with their segment, route and driver. */
  undigestedSevere(sq: Sequelize, minSeverity: number, transaction: Transaction) {
    return sq.query<{ id: number; reported_at: string; severity: number; felt: string; note: string | null; seq: number; start_m: number; end_m: number; route_name: string; depot_id: number | null; driver_name: string; snap_distance_m: number }>(
      `SELECT rr.id, rr.reported_at, rr.severity, rr.felt, rr.note, s.seq, s.start_m, s.end_m, r.name AS route_name, r.depot_id, u.name AS driver_name, rr.snap_distance_m
       FROM ride_reports rr JOIN route_segments s ON s.id = rr.segment_id JOIN routes r ON r.id = rr.route_id JOIN users u ON u.id = rr.driver_id
       WHERE rr.status = 'new' AND rr.severity >= ? AND rr.digest_notified_at IS NULL ORDER BY rr.reported_at`,
      { replacements: [minSeverity], type: QueryTypes.SELECT, transaction },
    );
  },

  /** Records that these reports went into a digest. */
  async markDigested(sq: Sequelize, ids: number[], transaction: Transaction) {
    if (!ids.length) return;
    await sq.query(`UPDATE ride_reports SET digest_notified_at = CURRENT_TIMESTAMP WHERE id IN (${ids.map(() => '?').join(',')})`, { replacements: ids, transaction });
  },
};
