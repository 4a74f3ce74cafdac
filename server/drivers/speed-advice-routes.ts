/** `GET /api/routes/:id/speed-advice`. */
import type { Router } from 'express';
import { z } from 'zod';
import { allow, currentUser } from '../http/access';
import { idParam, parse } from '../http/validate';
import { AppError } from '../errors';
import { fleetRepository } from '../fleet/repository';
import { tripsRepository } from '../trips/repository';
import { roadsRepository } from '../roads/repository';
import { EXPOSURE_ACTION_VALUE } from '../physics/exposure';
import { FRONT_TRACK_CORRELATION } from '../physics/seat';
import { FRONT_AXLE_PAYLOAD_SHARE } from '../wear/duty';
import {
  COMFORT_BANDS,
  COMFORT_KEYS,
  DAILY_EXPOSURE_KEY,
  DAMPER_MULTIPLE_RANGE,
  DAMPER_REFERENCE_TEXT,
  DEFAULT_COMFORT,
  DEFAULT_DAMPER_MULTIPLE,
  DEFAULT_EXPOSURE_HOURS,
  MAX_ADVICE_KMH,
  MIN_ADVICE_KMH,
  ROAD_ATTENTION,
  SPEED_CAUTION,
  adviseSpeed,
  dailyExposureLimit,
  dutyCurve,
  prepareSpec,
  type DamperLimit,
} from './speed-advice';

const query = z
  .object({
    specId: z.coerce.number({ message: 'must be an id' }).int().positive('must be an id').optional(),
    comfort: z.enum(COMFORT_KEYS, { message: `must be one of ${COMFORT_KEYS.join(', ')}` }).default(DEFAULT_COMFORT),
    damperMultiple: z.coerce
      .number({ message: 'must be a number (times the damper’s own class-B power)' })
      .min(DAMPER_MULTIPLE_RANGE[0], `must be at least ${DAMPER_MULTIPLE_RANGE[0]}`)
      .max(DAMPER_MULTIPLE_RANGE[1], `must be at most ${DAMPER_MULTIPLE_RANGE[1]}`)
      .default(DEFAULT_DAMPER_MULTIPLE),
    powerLimitW: z.coerce.number({ message: 'must be a number in W' }).min(5, 'must be at least 5 W').max(5000, 'must be at most 5000 W').optional(),
    load: z.enum(['laden', 'unladen'], { message: 'must be laden or unladen' }).default('laden'),
    payloadKg: z.coerce.number({ message: 'must be a number in kg' }).min(0, 'must be 0 kg or more').max(40_000, 'must be at most 40 000 kg').optional(),
    exposureHours: z.coerce.number({ message: 'must be a number of hours' }).min(0.25, 'must be at least 0.25 h').max(24, 'must be at most 24 h').default(DEFAULT_EXPOSURE_HOURS),
    segmentId: z.coerce.number({ message: 'must be an id' }).int().positive().optional(),
  })
  .strict()
  .superRefine((q, ctx) => {
    if (q.payloadKg !== undefined && q.load === 'unladen') ctx.addIssue({ code: 'custom', path: ['payloadKg'], message: 'is only used with load=laden' });
  });

/** Trips with a payload looked at for a spec's typical load (the most recent). */
const PAYLOAD_SAMPLE = 500;

/** The median payload [kg] of a spec's most recent trips with a payload on record, or null when none. */
async function typicalPayloadKg(specId: number): Promise<{ kg: number; trips: number } | null> {
  const kg = (await tripsRepository.recentPayloadsKg(specId, PAYLOAD_SAMPLE)).sort((a, b) => a - b);
  if (!kg.length) return null;
  const mid = kg.length >> 1;
  return { kg: Math.round(kg.length % 2 ? kg[mid] : (kg[mid - 1] + kg[mid]) / 2), trips: kg.length };
}

const f2 = (x: number) => x.toFixed(2);

export function registerSpeedAdviceRoutes(api: Router) {
  api.get('/routes/:id/speed-advice', allow('driver', 'mechanic', 'manager'), async (req, res) => {
    const { id } = parse(idParam, req.params, 'address');
    const q = parse(query, req.query, 'query');
    const route = await roadsRepository.findRoute(id);
    if (!route) throw AppError.notFound('Route');
    let specId = q.specId;
    const user = currentUser(req);
    if (!specId && user.role === 'driver') specId = (await fleetRepository.driverSpecId(user.id)) ?? undefined;
    const spec = await fleetRepository.findSpec(specId ?? (await fleetRepository.firstSpecId()) ?? 0);
    if (!spec) throw AppError.badRequest('Some values in the query are not valid.', { specId: `no suspension spec with id ${specId}` });
    const axles = spec.axles;
    if (!axles.length) throw AppError.badRequest('This suspension spec has no axles.', { specId: 'has no axles' });
    if (q.segmentId && !(await roadsRepository.segmentsOf(id)).some((s) => s.id === q.segmentId)) throw AppError.badRequest('Some values in the query are not valid.', { segmentId: 'is not a segment of this route' });

    const seat = spec.seat.used;
    // Laden: the payload asked for, else the spec's typical (median) recorded payload.
    const typical = q.load === 'laden' && q.payloadKg === undefined ? await typicalPayloadKg(spec.id) : null;
    const payloadKg = q.load === 'unladen' ? 0 : (q.payloadKg ?? typical?.kg ?? 0);
    const loadText =
      q.load === 'unladen'
        ? 'unladen (the spec’s own sprung masses)'
        : q.payloadKg !== undefined
          ? `laden with ${Math.round(payloadKg)} kg (as asked)`
          : typical
            ? `laden with ${typical.kg} kg, the median payload of the spec’s last ${typical.trips} trips with a payload on record`
            : 'laden was asked, but no trip of this spec has a payload on record, so unladen';
    const loadNote = payloadKg > 0 && axles.length > 1 ? `; ${Math.round(FRONT_AXLE_PAYLOAD_SHARE * 100)} % of it on the front axle, the rest shared by the others, half per corner` : '';

    const prepared = prepareSpec(
      axles.map((a) => ({ axleIndex: a.axleIndex, label: a.label, corner: a.corner })),
      { seatFactor: seat.total, payloadKg },
    );
    const isDaily = q.comfort === DAILY_EXPOSURE_KEY;
    const band = isDaily
      ? { key: DAILY_EXPOSURE_KEY, label: 'Daily exposure budget', range: `A(8) ≤ ${EXPOSURE_ACTION_VALUE} m/s² over ${q.exposureHours} h`, limit: dailyExposureLimit(q.exposureHours) }
      : COMFORT_BANDS.find((b) => b.key === q.comfort)!;
    const damper: DamperLimit = q.powerLimitW !== undefined ? { absoluteW: q.powerLimitW } : { multiple: q.damperMultiple };
    const limits = { seatAwLimit: band.limit, rideLabel: isDaily ? ('daily exposure' as const) : ('comfort' as const), damper };

    const segs = await roadsRepository.segmentsOf(id);
    const segments = segs.map((s) => {
      const a = adviseSpeed(prepared, s.gdN0, limits);
      return { id: s.id, seq: s.seq, startM: s.startM, endM: s.endM, isoClass: s.isoClass, gdN0: s.gdN0, iri: s.iri, postedKmh: s.speedKmh ?? route.defaultSpeedKmh, ...a };
    });
    const rated = segs.filter((s) => s.gdN0 !== null && s.gdN0 > 0);
    // The chart shows the chosen segment, or by default the route's median roughness (a typical stretch).
    const byGd = [...rated].sort((a, b) => a.gdN0! - b.gdN0!);
    const chartSeg = q.segmentId ? segs.find((s) => s.id === q.segmentId)! : (byGd[Math.floor(byGd.length / 2)] ?? null);
    const chart = chartSeg && chartSeg.gdN0 ? { segmentId: chartSeg.id, seq: chartSeg.seq, isoClass: chartSeg.isoClass, gdN0: chartSeg.gdN0, points: dutyCurve(prepared, chartSeg.gdN0) } : null;
    const advised = segments.map((s) => s.advisedKmh).filter((v): v is number => v !== null);

    const damperText =
      'multiple' in damper
        ? `each damper at most ${damper.multiple}× ${DAMPER_REFERENCE_TEXT}: ${prepared.axles.map((a) => `${a.label} ${Math.round(a.refPowerW)} W → ${Math.round(damper.multiple * a.refPowerW)} W`).join(', ')}${damper.multiple === DEFAULT_DAMPER_MULTIPLE ? ` (default: the power above which the wear model counts heat)` : ''}`
        : `every damper at most ${damper.absoluteW} W (an absolute limit, the same for every damper size)`;
    const rideText = isDaily
      ? `seat a_w at most ${f2(band.limit)} m/s² = ${EXPOSURE_ACTION_VALUE}·√(8 h / ${q.exposureHours} h): ${q.exposureHours} h a day at that level keep A(8) at the action value of Directive 2002/44/EC (other driving that day uses the same budget)`
      : `seat a_w at most ${band.limit} m/s² (ISO 2631-1 Annex C, ${band.label.toLowerCase()})`;
    res.json({
      route: { id: route.id, name: route.name, defaultSpeedKmh: route.defaultSpeedKmh },
      spec: { id: spec.id, name: spec.name, vehicleClass: spec.vehicleClass, axles: axles.map((a) => ({ axleIndex: a.axleIndex, label: a.label })) },
      comfort: band,
      comfortBands: [...COMFORT_BANDS, { key: DAILY_EXPOSURE_KEY, label: 'Daily exposure budget', range: `A(8) ≤ ${EXPOSURE_ACTION_VALUE} m/s² over the hours given`, limit: dailyExposureLimit(q.exposureHours) }],
      damper: {
        multiple: 'multiple' in damper ? damper.multiple : null,
        absoluteW: 'absoluteW' in damper ? damper.absoluteW : null,
        axles: prepared.axles.map((a) => ({ label: a.label, referencePowerW: a.refPowerW, limitW: 'multiple' in damper ? damper.multiple * a.refPowerW : damper.absoluteW })),
      },
      load: { case: q.load, payloadKg, text: loadText + loadNote },
      seat: { factor: seat.total, seat: seat.seat, seatSource: seat.seatSource, cab: seat.cab, track: seat.track, correlation: FRONT_TRACK_CORRELATION },
      exposureHours: q.exposureHours,
      rangeKmh: [MIN_ADVICE_KMH, MAX_ADVICE_KMH],
      segments,
      summary: {
        lowestKmh: advised.length ? Math.min(...advised) : null,
        highestKmh: advised.length ? Math.max(...advised) : null,
        segmentsNeedingAttention: segments.filter((s) => s.belowMinimum).length,
        segmentsBelowPosted: segments.filter((s) => s.belowMinimum || (s.advisedKmh !== null && s.advisedKmh < s.postedKmh)).length,
      },
      chart,
      assumptions: [
        `Load: ${loadText}${loadNote}.`,
        `Ride: ${rideText}.`,
        `Seat: a_w = ${f2(seat.total)} × the front axle’s floor acceleration (SEAT ${f2(seat.seat)}, ${seat.seatSource}; cab ${f2(seat.cab)}${seat.cab === 1 ? ', none entered' : ''}; left/right tracks correlated ρ = ${FRONT_TRACK_CORRELATION}, factor ${f2(seat.track)}) — the same seat as the drivers’ exposure.`,
        `Damper: ${damperText}.`,
        `No advice below ${MIN_ADVICE_KMH} km/h: there the road needs attention (report the segment) instead of a slower speed.`,
      ],
      attention: ROAD_ATTENTION,
      caution: SPEED_CAUTION,
      method:
        'Closed form on each segment’s Gd(n0): the front axle’s Wk-weighted body acceleration carried to the seat, and each axle’s mean damper power; both rise with speed, and the highest speed within both limits is found on a per-km/h grid of solves.',
    });
  });
}
