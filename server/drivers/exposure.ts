/**
 * Drivers' daily whole-body vibration exposure, computed by the nightly job from the
 * duty it stores per trip and corner.
 *
 * Method: the driver sits over the front axle. A trip's floor acceleration is that of the
 * front-axle corners (`trip_duties.axle_index = 0`, FL and FR, equal in the model) as an RMS,
 * `a_floor = √((a_FL² + a_FR²) / 2)`; the seat sees `a_w = SEAT · cab · √((1 + ρ)/2) · a_floor`
 * with the spec's floor-to-seat factors (server/physics/seat.ts, docs/methods.md "Exposure at
 * the seat"); its duration is the trip's. The day's exposure is Directive 2002/44/EC
 * `A(8) = √(Σ a_w,i²·T_i / 8 h)` ({@link dailyA8}). A screening estimate from a model, not a
 * seat measurement (docs/methods.md "Whole-body vibration").
 */
import { createHash } from 'node:crypto';
import type { Sequelize } from 'sequelize';
import { EXPOSURE_ACTION_VALUE, EXPOSURE_LIMIT_VALUE, dailyA8, exposureStatus } from '../physics/exposure';
import { FRONT_TRACK_CORRELATION, floorToSeat } from '../physics/seat';
import { mailRepository, type QueuedMail } from '../mail/repository';
import { esc } from '../mail/templates';
import { plusDays } from '../lib/days';
import { exposureRepository, type ExposureDayFigures } from './exposure-repository';

export const EXPOSURE_CAUTION =
  'A screening estimate from a model of the vehicle floor above the front axle, carried to the seat by stated factors, not a measurement at the seat. Follow your local regulations and have a competent person assess drivers’ exposure before acting on it.';

export const EXPOSURE_METHOD =
  `Front-axle floor acceleration of each trip (the driver sits over the front axle), carried to the seat: a_w = SEAT · cab · √((1 + ρ)/2) · a_floor, with the spec's SEAT value (default by vehicle class: 0.95 conventional seat, 0.75 suspension seat; typical textbook values, Griffin 1990), its cab suspension factor (1 when none is entered) and the left/right wheel tracks taken as correlated ρ = ${FRONT_TRACK_CORRELATION} (assumed; Cebon 1999); T = trip duration; A(8) = √(Σ a_w²·T / 8 h) (Directive 2002/44/EC, vertical, k = 1).`;

/** Days of history the nightly step recomputes (trips imported late land in this window). */
export const EXPOSURE_WINDOW_DAYS = 60;
/** Exceedances older than this are recorded but not mailed (a first run would mail months of history). */
export const EXPOSURE_MAIL_DAYS = 7;

export interface ExposurePart {
  tripId: number;
  vehicleId: number;
  routeId: number;
  /** Weighted RMS at the seat over the trip [m/s²]. */
  aw: number;
  /** Front-axle floor weighted RMS over the trip [m/s²], before the floor-to-seat factor. */
  awFloor: number;
  /** Floor-to-seat factor used (SEAT · cab · track) [1]. */
  seatFactor: number;
  /** Duration [h]. */
  hours: number;
}

export interface ExposureDayValue extends ExposureDayFigures {
  parts: ExposurePart[];
}

export interface FrontDutyRow {
  tripId: number;
  driverId: number;
  vehicleId: number;
  routeId: number;
  day: string;
  durationS: number;
  rmsWeightedAccel: number;
  /** The spec's floor-to-seat factor (server/physics/seat.ts) [1]. */
  floorToSeat: number;
}

const r4 = (x: number) => Math.round(x * 1e4) / 1e4;

/** Driver-days from front-axle duty rows (pure). */
export function exposureDays(rows: readonly FrontDutyRow[]): ExposureDayValue[] {
  const trips = new Map<number, { row: FrontDutyRow; sumSq: number; n: number }>();
  for (const r of rows) {
    const t = trips.get(r.tripId) ?? { row: r, sumSq: 0, n: 0 };
    t.sumSq += r.rmsWeightedAccel * r.rmsWeightedAccel;
    t.n += 1;
    trips.set(r.tripId, t);
  }
  const days = new Map<string, ExposurePart[]>();
  const dayKey = (d: number, day: string) => `${d}|${day}`;
  for (const { row, sumSq, n } of trips.values()) {
    const awFloor = Math.sqrt(sumSq / n);
    const part: ExposurePart = {
      tripId: row.tripId, vehicleId: row.vehicleId, routeId: row.routeId, aw: awFloor * row.floorToSeat, awFloor, seatFactor: row.floorToSeat,
      hours: Math.min(24, Math.max(0, row.durationS / 3600)),
    };
    const k = dayKey(row.driverId, row.day);
    days.set(k, [...(days.get(k) ?? []), part]);
  }
  const out: ExposureDayValue[] = [];
  for (const [k, parts] of days) {
    const [driverId, day] = k.split('|');
    parts.sort((a, b) => a.tripId - b.tripId);
    const a8 = dailyA8(parts.map((p) => ({ weightedAccel: p.aw, hours: p.hours })));
    out.push({
      driverId: Number(driverId),
      day,
      a8,
      hours: parts.reduce((s, p) => s + p.hours, 0),
      trips: parts.length,
      maxWeightedAccel: Math.max(...parts.map((p) => p.aw)),
      status: exposureStatus(a8),
      parts: parts.map((p) => ({ ...p, aw: r4(p.aw), awFloor: r4(p.awFloor), seatFactor: r4(p.seatFactor), hours: r4(p.hours) })),
    });
  }
  return out.sort((a, b) => a.driverId - b.driverId || a.day.localeCompare(b.day));
}

/**
 * The nightly step: recomputes every driver-day of the last {@link EXPOSURE_WINDOW_DAYS} days up
 * to `asOf` from `trip_duties`, and queues one e-mail per manager listing days newly above the
 * action value (de-duplicated; marked in the same transaction). Idempotent.
 */
export async function refreshExposure(ctx: { sequelize: Sequelize; now: Date; asOf: string; publicUrl: string; runId: number | null }) {
  const from = plusDays(ctx.asOf, -EXPOSURE_WINDOW_DAYS);
  const { sequelize } = ctx;
  return sequelize.transaction(async (transaction) => {
    const rows = await exposureRepository.frontDuty(sequelize, from, ctx.asOf, transaction);
    const specs = await exposureRepository.seatInputs(sequelize, transaction);
    const factor = new Map(specs.map((s) => [s.vehicle_id, floorToSeat({ vehicleClass: s.vehicle_class, seatFactor: s.seat_factor, cabFactor: s.cab_factor }).total]));
    const days = exposureDays(
      rows.map((r) => ({
        tripId: r.trip_id, driverId: r.driver_id, vehicleId: r.vehicle_id, routeId: r.route_id, day: r.trip_date, durationS: r.duration_s, rmsWeightedAccel: r.rms_weighted_accel,
        floorToSeat: factor.get(r.vehicle_id) ?? 1,
      })),
    );
    const existing = await exposureRepository.notifiedDays(sequelize, from, ctx.asOf, transaction);
    const notified = new Map(existing.map((e) => [`${e.driver_id}|${e.day}`, e.notified_at]));
    const nowText = ctx.now.toISOString();
    await exposureRepository.replaceDays(
      sequelize,
      from,
      ctx.asOf,
      days.map((d) => ({ driverId: d.driverId, day: d.day, a8: d.a8, hours: d.hours, trips: d.trips, maxWeightedAccel: d.maxWeightedAccel, status: d.status, parts: JSON.stringify(d.parts), notifiedAt: notified.get(`${d.driverId}|${d.day}`) ?? null })),
      nowText,
      transaction,
    );

    // Mail managers about days newly above the action value.
    const fresh = await exposureRepository.unnotifiedAbove(sequelize, EXPOSURE_ACTION_VALUE, transaction);
    const mailFrom = plusDays(ctx.asOf, -EXPOSURE_MAIL_DAYS);
    const toMail = fresh.filter((f) => f.day > mailFrom);
    const managers = await exposureRepository.activeManagers(sequelize, transaction);
    const mails: QueuedMail[] = [];
    for (const m of managers) {
      const mine = toMail.filter((f) => m.depot_id === null || f.depot_id === null || f.depot_id === m.depot_id);
      if (!mine.length) continue;
      const keys = mine.map((f) => `${f.driver_id}:${f.day}`).join(',');
      const body = exposureMail(m.name, mine, ctx.publicUrl);
      mails.push({ dedupeKey: `exposure:${m.id}:${createHash('sha256').update(keys).digest('hex').slice(0, 16)}`, kind: 'note', userId: m.id, toAddress: m.email, subject: body.subject, textBody: body.text, htmlBody: body.html, jobRunId: ctx.runId });
    }
    const queued = await mailRepository.queue(mails, ctx.now, transaction);
    await exposureRepository.markNotified(sequelize, fresh, nowText, transaction);
    return { exposureDutyRows: rows.length, exposureDays: days.length, exposureDaysAboveAction: days.filter((d) => d.a8 > EXPOSURE_ACTION_VALUE).length, exposureMailsQueued: queued };
  });
}

function exposureMail(name: string, days: { name: string; day: string; a8: number; hours: number }[], publicUrl: string) {
  const subject = `Driver vibration: ${days.length} day${days.length === 1 ? '' : 's'} above the action value of ${EXPOSURE_ACTION_VALUE} m/s²`;
  const line = (d: (typeof days)[number]) =>
    `${d.name}, ${d.day}: A(8) ${d.a8.toFixed(2)} m/s² over ${d.hours.toFixed(1)} h${d.a8 > EXPOSURE_LIMIT_VALUE ? ` — above the limit value of ${EXPOSURE_LIMIT_VALUE} m/s²` : ''}`;
  const url = `${publicUrl}/exposure`;
  const text = [`Hello ${name},`, '', `These drivers' estimated daily exposure exceeded the action value (Directive 2002/44/EC):`, '', ...days.map((d) => `- ${line(d)}`), '', `Details: ${url}`, '', EXPOSURE_CAUTION].join('\n');
  const html =
    `<!doctype html><html><body style="font-family:system-ui,sans-serif;color:#1E2A32;background:#FAF8F3;padding:24px"><div style="max-width:640px;margin:0 auto;background:#fff;border:1px solid #d8d4ca;border-radius:8px;padding:24px">` +
    `<p style="margin:0 0 4px;font-weight:600;color:#D9622B">Reboundry</p><h1 style="font-size:20px;margin:0 0 16px">${esc(subject)}</h1><p>Hello ${esc(name)},</p>` +
    `<p>These drivers' estimated daily exposure exceeded the action value (Directive 2002/44/EC):</p><ul>${days.map((d) => `<li>${esc(line(d))}</li>`).join('')}</ul>` +
    `<p><a href="${esc(url)}" style="color:#D9622B">Open driver exposure</a></p><p style="font-size:13px;color:#5B6B73">${esc(EXPOSURE_CAUTION)}</p></div></body></html>`;
  return { subject, text, html };
}
