/**
 * Duty of one vehicle's trips: pure, batched work with no I/O, so it can run in a worker
 * thread or on another machine. Input: the vehicle's corners and installed dampers, its
 * unprocessed trips and the segments (roughness, speed, measured profile) of the routes they
 * drove. Output: one duty record per trip × corner and the wear added to each damper.
 *
 * Methods (docs/methods.md "Road roughness"):
 * - Classified segments (a current Gd(n0), no measured profile): closed form, one Lyapunov
 *   solve per (corner, payload-adjusted sprung mass band, speed band), cached for the run;
 *   spring fatigue by Dirlik's spectral method from the travel PSD (moments per unit Gd(n0)
 *   computed once per cached solve — Dirlik's shape parameters do not depend on Gd(n0) for
 *   `w = 2` roads, only `m0` scales, so damage = D_ref·(Gd/Gd_ref)^(k/2)·T).
 * - Segments whose current roughness is a measured survey: time-domain simulation (exact ZOH,
 *   the quarter car with the Wk filter appended) over the segment's part of the profile (with a
 *   lead-in so the start transient is not counted), limited to the closed form's road band and
 *   resampled finer; every output of the segment, the weighted acceleration included, comes
 *   from that simulation; rainflow counting of suspension travel and Miner's rule for the
 *   spring (docs/methods.md "One road model for both methods").
 *
 * - Damper duty measure (docs/methods.md, "Damper duty measure"): per segment, the rod sliding
 *   distance √(2/π)·σ_rel·t weighted by the heat factor, summed into the trip's severity against
 *   the unladen corner on class B at 80 km/h (life-law.ts); unrated stretches count severity 1.
 *
 * Rules and assumptions (stated, not published):
 * - Payload sharing: the front axle carries {@link FRONT_AXLE_PAYLOAD_SHARE} of the trip's
 *   payload and the other axles share the rest equally (the load space of a van or rigid truck
 *   sits mostly behind the front axle); each axle's share is split equally left/right. A
 *   single-axle spec carries it all.
 * - Bands: payload-adjusted sprung mass is rounded to geometric steps of
 *   {@link MASS_BAND_RATIO} and speed to {@link SPEED_BAND_KMH} km/h bands (band centre).
 * - Segment speed: the segment's own speed limit where set (slow stretches), otherwise the
 *   trip's mean speed. Segment lengths are scaled by trip distance / route length.
 * - The damper is modelled with its nominal (spec) coefficient; fade is reported, not fed back.
 * - Left and right corners of an axle see the same road and load, so each axle is computed once.
 *
 * @module
 */
import { dutyOnRoad, prepareDuty, travelMoments, type PreparedDuty } from '../physics/closed-form';
export { travelMoments } from '../physics/closed-form';
import { prepareSimulation, simulateWeighted, type PreparedSimulation } from '../physics/simulate';
import { dirlikDamage, rainflowDamage, type SnCurve } from '../physics/fatigue';
import { bandLimitProfile, type BandLimitedProfile } from '../physics/profile-band';
import { gdForClass } from '../physics/iso8608';
import { STANDARD_GRAVITY, type CornerParams } from '../physics/types';
import { heatFactor, severityReference, slidingM } from './life-law';
import { segmentsOnDay, type DatedRoute } from './roughness-as-of';
import type { DamperSpan, DutyRecord, Position, SegmentInput, VehicleDutyResult, VehicleWork, WearDelta } from './duty-types';

/** Share of the payload on the front axle of a multi-axle spec (assumption, see module doc). */
export const FRONT_AXLE_PAYLOAD_SHARE = 0.3;
/** Geometric step of the sprung-mass bands (10 %: ±5 % in mass moves damper energy by a few per cent). */
export const MASS_BAND_RATIO = 1.1;
/** Width of the speed bands [km/h]. */
export const SPEED_BAND_KMH = 5;
/** Lead-in simulated before a profiled segment and not counted [m]. */
export const PROFILE_LEAD_IN_M = 30;
/** Profile taken past a segment's end, where there is more, and not counted [m]: it keeps the band limit's edge ringing out of the segment. */
export const PROFILE_TAIL_M = 10;
/** Reference road for the spectral damage cache: ISO 8608 class B mean [m³]. */
const GD_REF = gdForClass('B');

/**
 * Spring S–N curve in terms of suspension-travel range (ASSUMED, not published): Basquin
 * exponent k = 5 and 2·10⁷ cycles at a travel range equal to the spring's static deflection
 * `ms·g/ks` (so C = 2e7·δ_static⁵). Chosen so that a spring on ordinary roads outlives the
 * vehicle while rough unsealed routes consume it measurably; replace with the spring maker's
 * curve when known.
 */
export const SPRING_SN = Object.freeze({ k: 5, cyclesAtStaticDeflection: 2e7 });

/** Basquin curve of a corner's spring from {@link SPRING_SN}. */
export function springSnCurve(c: CornerParams): SnCurve {
  const deflection = (c.sprungMassKg * STANDARD_GRAVITY) / c.springRateNPerM;
  return { k: SPRING_SN.k, C: SPRING_SN.cyclesAtStaticDeflection * deflection ** SPRING_SN.k };
}

export * from './duty-types';

/** Positions of an axle's two corners. */
export function axlePositions(axleIndex: number, axleCount: number): [Position, Position] {
  if (axleIndex === 0) return ['FL', 'FR'];
  if (axleIndex === axleCount - 1) return ['RL', 'RR'];
  return [`L${axleIndex + 1}`, `R${axleIndex + 1}`];
}

/** Payload carried by one corner of an axle [kg] under the sharing rule of the module doc. */
export function cornerPayloadKg(payloadKg: number, axleIndex: number, axleCount: number): number {
  if (!(payloadKg > 0)) return 0;
  if (axleCount <= 1) return payloadKg / 2;
  const axleShare = axleIndex === 0 ? FRONT_AXLE_PAYLOAD_SHARE : (1 - FRONT_AXLE_PAYLOAD_SHARE) / (axleCount - 1);
  return (payloadKg * axleShare) / 2;
}

/** Band centre of a payload-adjusted sprung mass [kg] (geometric steps of MASS_BAND_RATIO). */
export function massBand(sprungMassKg: number): number {
  const step = Math.log(MASS_BAND_RATIO);
  return Math.exp(Math.round(Math.log(sprungMassKg) / step) * step);
}

/** Band centre of a speed [km/h]. */
export function speedBand(speedKmh: number): number {
  return Math.max(SPEED_BAND_KMH, Math.round(speedKmh / SPEED_BAND_KMH) * SPEED_BAND_KMH);
}

interface Prepared {
  duty: PreparedDuty;
  /** Spring damage per second on the reference road GD_REF [1/s]. */
  springDamagePerSRef: number;
  sn: SnCurve;
  corner: CornerParams;
  speedMps: number;
}

interface SimOutcome {
  energyJPerKm: number;
  msRelVel: number;
  msTravel: number;
  msTireLoadRatio: number;
  msBodyAccel: number;
  msWeightedAccel: number;
  /** Spring damage over the segment as simulated (per traversal). */
  springDamage: number;
}

/**
 * The run's cache: prepared closed-form solves per (corner, mass band, speed band), prepared
 * simulations per (corner, mass band, speed band, dx), and simulated results per
 * (prepared simulation, segment). Deterministic: the same key always yields the same value.
 */
export class DutyCache {
  private readonly prepared = new Map<string, Prepared>();
  private readonly sims = new Map<string, PreparedSimulation>();
  private readonly simResults = new Map<string, Map<number, SimOutcome>>();
  /** Band-limited, resampled profile parts per (survey, segment): speed- and corner-independent. */
  private readonly parts = new Map<string, { part: BandLimitedProfile; first: number; end: number } | null>();
  private travel = new Float64Array(2048);
  solves = 0;
  simulations = 0;

  closedForm(cornerKey: string, corner: CornerParams, speedKmh: number): Prepared {
    const key = `${cornerKey}|${corner.sprungMassKg}|${speedKmh}`;
    let p = this.prepared.get(key);
    if (!p) {
      const v = speedKmh / 3.6;
      const duty = prepareDuty(corner, v);
      const sn = springSnCurve(corner);
      const m = travelMoments(corner, v, GD_REF);
      const springDamagePerSRef = dirlikDamage(m, { ...sn, durationS: 1 });
      p = { duty, springDamagePerSRef, sn, corner, speedMps: v };
      this.prepared.set(key, p);
      this.solves++;
    }
    return p;
  }

  simulated(cornerKey: string, corner: CornerParams, speedKmh: number, seg: SegmentInput, sn: SnCurve): SimOutcome | null {
    const prof = seg.profile!;
    const key = `${cornerKey}|${corner.sprungMassKg}|${speedKmh}|${prof.dxM}|${prof.surveyId}`;
    let results = this.simResults.get(key);
    if (!results) {
      results = new Map();
      this.simResults.set(key, results);
    }
    const hit = results.get(seg.id);
    if (hit) return hit;
    // The segment's part of the profile with a lead-in before it and a short tail after it
    // (neither counted), limited to the road band of the closed form and resampled finer, so
    // both methods see the same road (docs/methods.md "One road model for both methods").
    const partKey = `${prof.surveyId}|${prof.dxM}|${seg.id}`;
    let cut = this.parts.get(partKey);
    if (cut === undefined) {
      const from = Math.round((seg.startM - prof.startM) / prof.dxM);
      const to = Math.round((seg.endM - prof.startM) / prof.dxM);
      const lo = Math.max(0, from - Math.round(PROFILE_LEAD_IN_M / prof.dxM));
      const last = prof.elevationsM.length - 1;
      const hi = Math.min(last, to);
      const tail = Math.min(last, to + Math.round(PROFILE_TAIL_M / prof.dxM));
      if (from < 0 || hi - Math.max(lo, from) < 4 || tail - lo < 7) cut = null; // profile does not cover the segment
      else {
        const part = bandLimitProfile(prof.elevationsM.subarray(lo, tail + 1), prof.dxM);
        cut = { part, first: (from - lo) * part.factor, end: (hi - lo) * part.factor };
      }
      this.parts.set(partKey, cut);
    }
    if (!cut) return null;
    const simKey = `${key}|${cut.part.dxM}`;
    let sim = this.sims.get(simKey);
    if (!sim) {
      sim = prepareSimulation(corner, cut.part.dxM, speedKmh / 3.6, { weighted: true });
      this.sims.set(simKey, sim);
    }
    const n = cut.end - cut.first;
    if (this.travel.length < n) this.travel = new Float64Array(n);
    const r = simulateWeighted(sim, cut.part.elevationsM, cut.first, cut.end, this.travel);
    const springDamage = r.counted >= 2 ? rainflowDamage(this.travel, r.counted, sn.k, sn.C) : 0;
    const powerW = sim.dampingNsPerM * r.msRelVel;
    const out: SimOutcome = {
      energyJPerKm: (powerW / sim.speedMps) * 1000,
      msRelVel: r.msRelVel,
      msTravel: r.msTravel,
      msTireLoadRatio: r.msTireLoad / (sim.staticLoadN * sim.staticLoadN),
      msBodyAccel: r.msBodyAccel,
      msWeightedAccel: r.msWeightedAccel,
      springDamage,
    };
    results.set(seg.id, out);
    this.simulations++;
    return out;
  }
}

/** Reference road and speed of a spec's rated life: ISO 8608 class B (mean) at 80 km/h. */
export const REFERENCE_SPEED_KMH = 80;

/**
 * Duty per km of a corner on the reference road (class B at {@link REFERENCE_SPEED_KMH} km/h),
 * the road a spec's rated life is stated on: damper energy [J/km] and spring damage [1/km].
 */
export function referenceDutyPerKm(c: CornerParams): { energyJ: number; springDamage: number } {
  const key = cornerKeyOf(c);
  let r = referenceCache.get(key);
  if (!r) {
    const v = REFERENCE_SPEED_KMH / 3.6;
    const energyJ = dutyOnRoad(prepareDuty(c, v), GD_REF).damperEnergyJPerKm;
    const springDamage = dirlikDamage(travelMoments(c, v, GD_REF), { ...springSnCurve(c), durationS: 1 }) * (1000 / v);
    r = Object.freeze({ energyJ, springDamage });
    if (referenceCache.size > 10_000) referenceCache.clear();
    referenceCache.set(key, r);
  }
  return r;
}
const referenceCache = new Map<string, { energyJ: number; springDamage: number }>();

/** The damper fitted at `position` on `day`, if any. */
export function damperOn(dampers: DamperSpan[], position: Position, day: string): DamperSpan | null {
  for (const d of dampers) {
    if (d.position === position && d.installedAt <= day && (d.removedAt === null || d.removedAt > day)) return d;
  }
  return null;
}

/**
 * Computes the duty of every trip of one vehicle. Pure: same inputs, same outputs.
 *
 * @param work the vehicle's axles, dampers and trips
 * @param routes the routes driven, by id
 * @param cache the run's cache
 */
export function computeVehicleDuty(work: VehicleWork, routes: Map<number, DatedRoute>, cache: DutyCache): VehicleDutyResult {
  const duties: DutyRecord[] = [];
  const wear = new Map<number, WearDelta>();
  const errors: { tripId: number; message: string }[] = [];
  let segmentCount = 0;
  const axleCount = work.axles.length;
  for (const trip of work.trips) {
    try {
      const route = routes.get(trip.routeId);
      if (!route) throw new Error(`route ${trip.routeId} is not loaded`);
      // the segments as they stood on the trip's day (roughness-as-of.ts)
      const segments = segmentsOnDay(route, trip.tripDate);
      if (!(trip.meanSpeedKmh > 0)) throw new Error(`mean speed ${trip.meanSpeedKmh} km/h is not positive`);
      const scale = route.lengthM > 0 ? (trip.distanceKm * 1000) / route.lengthM : 1;
      const records: DutyRecord[] = [];
      for (const axle of work.axles) {
        const sprung = massBand(axle.corner.sprungMassKg + cornerPayloadKg(trip.payloadKg ?? 0, axle.axleIndex, axleCount));
        const corner: CornerParams = { ...axle.corner, sprungMassKg: sprung };
        const cornerKey = cornerKeyOf(axle.corner);
        let energy = 0, time = 0, msRel = 0, msTravel = 0, msTire = 0, msAcc = 0, msW = 0, spring = 0;
        let profiled = 0, unrated = 0;
        // duty measure (life-law.ts): sliding distance, and sliding weighted by the heat factor
        const ref = severityReference(axle.corner);
        let sliding = 0, heatedSliding = 0, ratedKm = 0, unratedKm = 0;
        // consecutive segments mostly share a speed band: look the cache up only when it changes
        let lastV = Number.NaN;
        let p: Prepared | null = null;
        for (const seg of segments) {
          const lengthKm = ((seg.endM - seg.startM) / 1000) * scale;
          if (!(lengthKm > 0)) continue;
          const v = speedBand(seg.speedKmh ?? trip.meanSpeedKmh);
          if (seg.gdN0 === null && !seg.profile) {
            unrated++;
            unratedKm += lengthKm;
            continue;
          }
          if (v !== lastV || !p) {
            p = cache.closedForm(cornerKey, corner, v);
            lastV = v;
          }
          const t = (lengthKm * 1000) / p.speedMps;
          const cf = seg.gdN0 !== null ? dutyOnRoad(p.duty, seg.gdN0) : null;
          const sim = seg.profile ? cache.simulated(cornerKey, corner, v, seg, p.sn) : null;
          if (sim) {
            profiled++;
            energy += sim.energyJPerKm * lengthKm;
            msRel += sim.msRelVel * t;
            msTravel += sim.msTravel * t;
            msTire += sim.msTireLoadRatio * t;
            msAcc += sim.msBodyAccel * t;
            // damage of one traversal of the segment's length, scaled to the driven length
            spring += sim.springDamage * scale;
            msW += sim.msWeightedAccel * t;
            const rmsRel = Math.sqrt(sim.msRelVel);
            const sl = slidingM(rmsRel, t);
            sliding += sl;
            heatedSliding += sl * heatFactor(corner.dampingNsPerM * sim.msRelVel, ref.powerW);
          } else if (cf) {
            energy += cf.damperEnergyJPerKm * lengthKm;
            msRel += cf.rmsRelativeVelocity ** 2 * t;
            msTravel += cf.rmsSuspensionTravel ** 2 * t;
            msTire += cf.rmsTireLoadRatio ** 2 * t;
            msAcc += cf.rmsBodyAccel ** 2 * t;
            msW += cf.rmsWeightedAccel ** 2 * t;
            spring += p.springDamagePerSRef * Math.pow(seg.gdN0! / GD_REF, p.sn.k / 2) * t;
            const sl = slidingM(cf.rmsRelativeVelocity, t);
            sliding += sl;
            heatedSliding += sl * heatFactor(cf.damperPowerW, ref.powerW);
          } else {
            unrated++;
            unratedKm += lengthKm;
            continue;
          }
          ratedKm += lengthKm;
          time += t;
        }
        const rms = (s: number) => (time > 0 ? Math.sqrt(s / time) : 0);
        const drivenKm = ratedKm + unratedKm;
        const severity = drivenKm > 0 ? (heatedSliding / ref.slidingMPerKm + unratedKm) / drivenKm : 1;
        for (const position of axlePositions(axle.axleIndex, axleCount)) {
          const damper = damperOn(work.dampers, position, trip.tripDate);
          records.push({
            tripId: trip.id,
            vehicleId: work.vehicleId,
            damperId: damper?.id ?? null,
            routeId: trip.routeId,
            driverId: trip.driverId,
            position,
            axleIndex: axle.axleIndex,
            tripDate: trip.tripDate,
            distanceKm: trip.distanceKm,
            durationS: trip.durationS,
            sprungMassKg: sprung,
            energyJ: energy,
            meanPowerW: time > 0 ? energy / time : 0,
            rmsRelativeVelocity: rms(msRel),
            rmsSuspensionTravel: rms(msTravel),
            rmsTireLoadRatio: rms(msTire),
            rmsBodyAccel: rms(msAcc),
            rmsWeightedAccel: rms(msW),
            springDamage: spring,
            slidingM: sliding,
            severity,
            segments: segments.length,
            profiledSegments: profiled,
            unratedSegments: unrated,
          });
        }
      }
      for (const r of records) {
        if (![r.energyJ, r.springDamage, r.rmsWeightedAccel, r.severity].every(Number.isFinite)) throw new Error(`non-finite duty on ${r.position}`);
      }
      segmentCount += segments.length;
      for (const r of records) {
        duties.push(r);
        if (r.damperId === null) continue;
        const w = wear.get(r.damperId);
        if (w) {
          w.energyJ += r.energyJ;
          w.springDamage += r.springDamage;
          if (r.tripDate < w.firstDay) w.firstDay = r.tripDate;
        } else wear.set(r.damperId, { damperId: r.damperId, energyJ: r.energyJ, springDamage: r.springDamage, firstDay: r.tripDate });
      }
    } catch (err) {
      errors.push({ tripId: trip.id, message: err instanceof Error ? err.message : String(err) });
    }
  }
  return { duties, wear: [...wear.values()], errors, segments: segmentCount };
}

function cornerKeyOf(c: CornerParams): string {
  return `${c.sprungMassKg}/${c.unsprungMassKg}/${c.springRateNPerM}/${c.dampingNsPerM}/${c.tireRateNPerM}`;
}
