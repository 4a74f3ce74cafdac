/** Roads data access: routes, segments, roughness observations, surveys. */
import { Op, QueryTypes, type Order, type Transaction, type WhereOptions } from 'sequelize';
import { Depot, RoadSurvey, RoughnessObservation, Route, RouteSegment, Trip, User, Vehicle, type RoughnessSource } from '../db/models';
import { currentValue } from './current-roughness';
import { sqlFor } from '../db/dialect';
import { classifyGd } from '../physics/iso8608';
import { iriFromGd } from '../physics/iri';
import type { LonLat, SegmentGeometry } from './geometry';

export interface SegmentRow {
  id: number;
  routeId: number;
  seq: number;
  startM: number;
  endM: number;
  coords: LonLat[];
  speedKmh: number | null;
  iri: number | null;
  gdN0: number | null;
  isoClass: string | null;
  roughnessSource: RoughnessSource | null;
  roughnessDate: string | null;
  surveyId: number | null;
}

const segRow = (s: RouteSegment): SegmentRow => ({
  id: s.id,
  routeId: s.routeId,
  seq: s.seq,
  startM: s.startM,
  endM: s.endM,
  coords: JSON.parse(s.geometry) as LonLat[],
  speedKmh: s.speedKmh,
  iri: s.iri ?? null,
  gdN0: s.gdN0 ?? null,
  isoClass: s.isoClass ?? null,
  roughnessSource: s.roughnessSource ?? null,
  roughnessDate: s.roughnessDate ?? null,
  surveyId: s.surveyId ?? null,
});

export interface ObservationInput {
  segmentId: number;
  iri: number | null;
  gdN0: number | null;
  isoClass: string | null;
  source: RoughnessSource;
  observedOn: string;
  recordedById: number | null;
  note: string | null;
  surveyId: number | null;
}

export type SegmentSort = 'seq' | 'routeName' | 'iri' | 'isoClass' | 'roughnessDate' | 'speedKmh';

const surveyRow = (s: RoadSurvey & { uploadedBy?: User | null }) => ({
  id: s.id,
  routeId: s.routeId,
  originalName: s.originalName,
  dxM: s.dxM,
  startM: s.startM,
  endM: s.endM,
  pointCount: s.pointCount,
  surveyedOn: s.surveyedOn,
  note: s.note,
  uploadedAt: s.uploadedAt.toISOString(),
  uploadedByName: s.uploadedBy?.name ?? null,
});

export const roadsRepository = {
  async findRoute(id: number, t?: Transaction) {
    const r = await Route.findByPk(id, { transaction: t });
    if (!r) return null;
    return {
      id: r.id,
      name: r.name,
      description: r.description,
      depotId: r.depotId ?? null,
      coordinates: (JSON.parse(r.geometry) as { coordinates: LonLat[] }).coordinates,
      lengthM: r.lengthM,
      defaultSpeedKmh: r.defaultSpeedKmh,
      segmentLengthM: r.segmentLengthM,
    };
  },

  async routeNameTaken(name: string, exceptId?: number) {
    return (await Route.count({ where: { name, ...(exceptId ? { id: { [Op.ne]: exceptId } } : {}) } })) > 0;
  },

  async depotExists(id: number) {
    return (await Depot.count({ where: { id } })) > 0;
  },

  async segmentsOf(routeId: number, t?: Transaction): Promise<SegmentRow[]> {
    const rows = await RouteSegment.findAll({ where: { routeId }, order: [['seq', 'ASC']], transaction: t });
    return rows.map(segRow);
  },

  async surveysOf(routeId: number) {
    const rows = await RoadSurvey.findAll({ where: { routeId }, include: [{ model: User, as: 'uploadedBy', attributes: ['id', 'name'] }], order: [['surveyedOn', 'DESC'], ['id', 'DESC']] });
    return rows.map((s) => surveyRow(s as RoadSurvey & { uploadedBy?: User | null }));
  },

  async findSurvey(id: number) {
    const s = await RoadSurvey.findByPk(id, { include: [{ model: User, as: 'uploadedBy', attributes: ['id', 'name'] }] });
    return s ? { ...surveyRow(s as RoadSurvey & { uploadedBy?: User | null }), filePath: s.filePath } : null;
  },

  /** The route's trip count and 10 latest trips; only `driverId`'s own when given (a driver's view). */
  async tripsOn(routeId: number, driverId?: number) {
    const where = driverId === undefined ? { routeId } : { routeId, driverId };
    const [count, recent] = await Promise.all([
      Trip.count({ where }),
      Trip.findAll({
        where,
        include: [
          { model: Vehicle, as: 'vehicle', attributes: ['id', 'fleetNumber'] },
          { model: User, as: 'driver', attributes: ['id', 'name'] },
        ],
        order: [['startedAt', 'DESC']],
        limit: 10,
      }),
    ]);
    return {
      count,
      recent: recent.map((t) => {
        const tw = t as Trip & { vehicle?: Vehicle; driver?: User | null };
        return {
          id: t.id,
          vehicleId: t.vehicleId,
          fleetNumber: tw.vehicle?.fleetNumber ?? '',
          driverName: tw.driver?.name ?? null,
          startedAt: t.startedAt.toISOString(),
          distanceKm: t.distanceKm,
          meanSpeedKmh: t.meanSpeedKmh,
        };
      }),
    };
  },

  async createRoute(
    r: { name: string; description: string | null; depotId: number | null; coordinates: LonLat[]; lengthM: number; defaultSpeedKmh: number; segmentLengthM: number },
    segs: SegmentGeometry[],
    stated: { isoClass: string; gdN0: number; observedOn: string; recordedById: number } | null,
  ) {
    return Route.sequelize!.transaction(async (transaction) => {
      const route = await Route.create(
        {
          name: r.name,
          description: r.description,
          depotId: r.depotId,
          geometry: JSON.stringify({ type: 'LineString', coordinates: r.coordinates }),
          lengthM: r.lengthM,
          defaultSpeedKmh: r.defaultSpeedKmh,
          segmentLengthM: r.segmentLengthM,
        },
        { transaction },
      );
      const created = await RouteSegment.bulkCreate(
        segs.map((s) => ({
          routeId: route.id,
          seq: s.seq,
          startM: s.startM,
          endM: s.endM,
          geometry: JSON.stringify(s.coords),
          speedKmh: null,
          iri: null,
          gdN0: stated?.gdN0 ?? null,
          isoClass: stated?.isoClass ?? null,
          roughnessSource: stated ? 'stated' : null,
          roughnessDate: stated?.observedOn ?? null,
          surveyId: null,
        })),
        { transaction, returning: true },
      );
      if (stated) {
        await RoughnessObservation.bulkCreate(
          created.map((s) => ({
            segmentId: s.id,
            iri: null,
            gdN0: stated.gdN0,
            isoClass: stated.isoClass,
            source: 'stated' as const,
            observedOn: stated.observedOn,
            recordedById: stated.recordedById,
            note: 'Class stated when the route was created',
            surveyId: null,
          })),
          { transaction },
        );
      }
      return route.id;
    });
  },

  async updateRoute(id: number, patch: Partial<{ name: string; description: string | null; depotId: number | null; defaultSpeedKmh: number }>) {
    await Route.update(patch, { where: { id } });
  },

  async setSegmentSpeeds(routeId: number, edits: { seq: number; speedKmh: number | null }[]) {
    await Route.sequelize!.transaction(async (transaction) => {
      for (const e of edits) await RouteSegment.update({ speedKmh: e.speedKmh }, { where: { routeId, seq: e.seq }, transaction });
    });
  },

  /** Adds observations and re-applies the current-value rule to the segments they touch. */
  async addObservations(obs: ObservationInput[], transaction: Transaction) {
    for (let i = 0; i < obs.length; i += 500) await RoughnessObservation.bulkCreate(obs.slice(i, i + 500), { transaction });
    await roadsRepository.refreshCurrent([...new Set(obs.map((o) => o.segmentId))], transaction);
  },

  /** Applies the current-value rule (current-roughness.ts) to the given segments. */
  async refreshCurrent(segmentIds: number[], transaction: Transaction) {
    for (let i = 0; i < segmentIds.length; i += 400) {
      const ids = segmentIds.slice(i, i + 400);
      const all = await RoughnessObservation.findAll({ where: { segmentId: { [Op.in]: ids } }, transaction });
      const bySeg = new Map<number, RoughnessObservation[]>();
      for (const o of all) bySeg.set(o.segmentId, [...(bySeg.get(o.segmentId) ?? []), o]);
      for (const id of ids) {
        // Drivers' reports are blended in with a lower weight than a survey
        const cur = currentValue(bySeg.get(id) ?? [], classifyGd, iriFromGd);
        await RouteSegment.update(
          cur
            ? { iri: cur.iri, gdN0: cur.gdN0, isoClass: cur.isoClass, roughnessSource: cur.source, roughnessDate: cur.observedOn, surveyId: cur.surveyId }
            : { iri: null, gdN0: null, isoClass: null, roughnessSource: null, roughnessDate: null, surveyId: null },
          { where: { id }, transaction },
        );
      }
    }
  },

  /** The id of a segment's most recently recorded observation. */
  async lastObservationId(segmentId: number, transaction: Transaction) {
    const o = await RoughnessObservation.findOne({ where: { segmentId }, order: [['id', 'DESC']], attributes: ['id'], transaction });
    return o?.id ?? null;
  },

  async createSurvey(s: { routeId: number; filePath: string; originalName: string; dxM: number; startM: number; endM: number; pointCount: number; surveyedOn: string; note: string | null; uploadedById: number; uploadedAt: Date }, transaction: Transaction) {
    const row = await RoadSurvey.create(s, { transaction });
    return row.id;
  },

  transaction<T>(fn: (t: Transaction) => Promise<T>) {
    return Route.sequelize!.transaction(fn);
  },

  async segmentDetail(id: number) {
    const s = await RouteSegment.findByPk(id, { include: [{ model: Route, as: 'route', attributes: ['id', 'name', 'defaultSpeedKmh'] }] });
    if (!s) return null;
    const obs = await RoughnessObservation.findAll({
      where: { segmentId: id },
      include: [{ model: User, as: 'recordedBy', attributes: ['id', 'name'] }],
      order: [['observedOn', 'DESC'], ['id', 'DESC']],
    });
    const route = (s as RouteSegment & { route?: Route }).route;
    return {
      segment: { ...segRow(s), routeName: route?.name ?? '', defaultSpeedKmh: route?.defaultSpeedKmh ?? null },
      observations: obs.map((o) => ({
        id: o.id,
        iri: o.iri,
        gdN0: o.gdN0,
        isoClass: o.isoClass,
        source: o.source,
        observedOn: o.observedOn,
        recordedByName: (o as RoughnessObservation & { recordedBy?: User | null }).recordedBy?.name ?? null,
        note: o.note,
        surveyId: o.surveyId ?? null,
      })),
    };
  },

  async listSegments(q: {
    offset: number;
    pageSize: number;
    sort: { field: SegmentSort; dir: 'ASC' | 'DESC' };
    routeId?: number;
    isoClass?: string;
    source?: RoughnessSource;
  }) {
    const and: WhereOptions[] = [];
    if (q.routeId) and.push({ routeId: q.routeId });
    if (q.isoClass) and.push({ isoClass: q.isoClass });
    if (q.source) and.push({ roughnessSource: q.source });
    const order: Order =
      q.sort.field === 'routeName'
        ? [[{ model: Route, as: 'route' }, 'name', q.sort.dir], ['seq', 'ASC']]
        : [[q.sort.field, q.sort.dir], ['routeId', 'ASC'], ['seq', 'ASC']];
    const { rows, count } = await RouteSegment.findAndCountAll({
      where: and.length ? { [Op.and]: and } : {},
      include: [{ model: Route, as: 'route', attributes: ['id', 'name', 'defaultSpeedKmh'] }],
      attributes: { exclude: ['geometry'] },
      order,
      offset: q.offset,
      limit: q.pageSize,
    });
    return {
      items: rows.map((s) => {
        const route = (s as RouteSegment & { route?: Route }).route;
        return {
          id: s.id,
          routeId: s.routeId,
          routeName: route?.name ?? '',
          seq: s.seq,
          startM: s.startM,
          endM: s.endM,
          speedKmh: s.speedKmh ?? route?.defaultSpeedKmh ?? null,
          speedSet: s.speedKmh !== null,
          iri: s.iri ?? null,
          gdN0: s.gdN0 ?? null,
          isoClass: s.isoClass ?? null,
          roughnessSource: s.roughnessSource ?? null,
          roughnessDate: s.roughnessDate ?? null,
        };
      }),
      total: count,
    };
  },

  /** Every segment in a compact form for the map: parallel arrays. */
  /**
   * A version of what {@link mapData} returns: the row count and latest change of segments,
   * routes and depots (every write to them goes through Sequelize, which stamps updated_at).
   */
  async mapVersion(): Promise<string> {
    const text = sqlFor(RouteSegment.sequelize!).asText;
    const [row] = await RouteSegment.sequelize!.query<{ v: string }>(
      `SELECT (SELECT COUNT(*) || ':' || COALESCE(${text('MAX(updated_at)')}, '') FROM route_segments) || '/' ||
              (SELECT COUNT(*) || ':' || COALESCE(${text('MAX(updated_at)')}, '') FROM routes) || '/' ||
              (SELECT COUNT(*) || ':' || COALESCE(${text('MAX(updated_at)')}, '') FROM depots) AS v`,
      { type: QueryTypes.SELECT },
    );
    return row.v;
  },

  async mapData() {
    const [routes, segs, depots] = await Promise.all([
      Route.findAll({ attributes: ['id', 'name', 'defaultSpeedKmh'], order: [['id', 'ASC']] }),
      RouteSegment.findAll({ attributes: ['id', 'routeId', 'geometry', 'isoClass'], order: [['routeId', 'ASC'], ['seq', 'ASC']], raw: true }),
      Depot.findAll({ order: [['name', 'ASC']] }),
    ]);
    return {
      routes: routes.map((r) => ({ id: r.id, name: r.name })),
      depots: depots.map((d) => ({ id: d.id, name: d.name, lat: d.lat, lon: d.lon, address: d.address })),
      segments: {
        id: segs.map((s) => s.id),
        routeId: segs.map((s) => s.routeId),
        isoClass: segs.map((s) => s.isoClass ?? null),
        coords: segs.map((s) => JSON.parse(s.geometry) as LonLat[]),
      },
    };
  },
};
