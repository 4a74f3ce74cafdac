/** `GET /api/routes/:id/speed-advice`. */
import type { Router } from 'express';
import { z } from 'zod';
import { allow, currentUser } from '../http/access';
import { idParam, parse } from '../http/validate';
import { AppError } from '../errors';
import { SpecAxle, SuspensionSpec, Vehicle } from '../db/models';
import { roadsRepository } from '../roads/repository';
import { COMFORT_BANDS, COMFORT_KEYS, DEFAULT_COMFORT, DEFAULT_POWER_LIMIT_W, MAX_ADVICE_KMH, MIN_ADVICE_KMH, SPEED_CAUTION, adviseSpeed, dutyCurve, prepareSpec } from './speed-advice';

const query = z
  .object({
    specId: z.coerce.number({ message: 'must be an id' }).int().positive('must be an id').optional(),
    comfort: z.enum(COMFORT_KEYS, { message: `must be one of ${COMFORT_KEYS.join(', ')}` }).default(DEFAULT_COMFORT),
    powerLimitW: z.coerce.number({ message: 'must be a number in W' }).min(5, 'must be at least 5 W').max(5000, 'must be at most 5000 W').default(DEFAULT_POWER_LIMIT_W),
    segmentId: z.coerce.number({ message: 'must be an id' }).int().positive().optional(),
  })
  .strict();

export function registerSpeedAdviceRoutes(api: Router) {
  api.get('/routes/:id/speed-advice', allow('driver', 'mechanic', 'manager'), async (req, res) => {
    const { id } = parse(idParam, req.params, 'address');
    const q = parse(query, req.query, 'query');
    const route = await roadsRepository.findRoute(id);
    if (!route) throw AppError.notFound('Route');
    let specId = q.specId;
    const user = currentUser(req);
    if (!specId && user.role === 'driver') specId = (await Vehicle.findOne({ where: { driverId: user.id }, attributes: ['specId'], order: [['id', 'ASC']] }))?.specId;
    const spec = specId ? await SuspensionSpec.findByPk(specId) : await SuspensionSpec.findOne({ order: [['id', 'ASC']] });
    if (!spec) throw AppError.badRequest('Some values in the query are not valid.', { specId: `no suspension spec with id ${specId}` });
    const axles = await SpecAxle.findAll({ where: { specId: spec.id }, order: [['axleIndex', 'ASC']] });
    if (!axles.length) throw AppError.badRequest('This suspension spec has no axles.', { specId: 'has no axles' });
    const prepared = prepareSpec(
      axles.map((a) => ({ axleIndex: a.axleIndex, label: a.label, corner: { sprungMassKg: a.sprungMassKg, unsprungMassKg: a.unsprungMassKg, springRateNPerM: a.springRateNPerM, dampingNsPerM: a.dampingNsPerM, tireRateNPerM: a.tireRateNPerM } })),
    );
    const band = COMFORT_BANDS.find((b) => b.key === q.comfort)!;
    const segs = await roadsRepository.segmentsOf(id);
    const segments = segs.map((s) => {
      const a = adviseSpeed(prepared, s.gdN0, band.limit, q.powerLimitW);
      return { id: s.id, seq: s.seq, startM: s.startM, endM: s.endM, isoClass: s.isoClass, gdN0: s.gdN0, iri: s.iri, postedKmh: s.speedKmh ?? route.defaultSpeedKmh, ...a };
    });
    if (q.segmentId && !segs.some((s) => s.id === q.segmentId)) throw AppError.badRequest('Some values in the query are not valid.', { segmentId: 'is not a segment of this route' });
    const rated = segs.filter((s) => s.gdN0 !== null && s.gdN0 > 0);
    // The chart shows the chosen segment, or by default the route's median roughness (a typical stretch).
    const byGd = [...rated].sort((a, b) => a.gdN0! - b.gdN0!);
    const chartSeg = q.segmentId ? segs.find((s) => s.id === q.segmentId)! : (byGd[Math.floor(byGd.length / 2)] ?? null);
    const chart = chartSeg && chartSeg.gdN0 ? { segmentId: chartSeg.id, seq: chartSeg.seq, isoClass: chartSeg.isoClass, gdN0: chartSeg.gdN0, points: dutyCurve(prepared, chartSeg.gdN0) } : null;
    const advised = segments.map((s) => s.advisedKmh).filter((v): v is number => v !== null);
    res.json({
      route: { id: route.id, name: route.name, defaultSpeedKmh: route.defaultSpeedKmh },
      spec: { id: spec.id, name: spec.name, axles: axles.map((a) => ({ axleIndex: a.axleIndex, label: a.label })) },
      comfort: band,
      comfortBands: COMFORT_BANDS,
      powerLimitW: q.powerLimitW,
      rangeKmh: [MIN_ADVICE_KMH, MAX_ADVICE_KMH],
      segments,
      summary: { lowestKmh: advised.length ? Math.min(...advised) : null, segmentsBelowPosted: segments.filter((s) => s.advisedKmh !== null && s.advisedKmh < s.postedKmh).length },
      chart,
      caution: SPEED_CAUTION,
      method:
        'Closed form: the weighted body acceleration over the front axle (ISO 2631-1 Wk) and each axle’s mean damper power at the segment’s Gd(n0); both grow with Gd(n0)·v, so the highest speed within each limit follows directly.',
    });
  });
}
