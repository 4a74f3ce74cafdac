/** Ride-report rules: snapping, filing, access, the manager's decision and the driver's note. */
import { AppError } from '../errors';
import type { Logger } from '../logger';
import type { SessionUser } from '../http/access';
import type { Mailer } from '../mail/mailer';
import { mailRepository } from '../mail/repository';
import { sendPending } from '../mail/service';
import { roadsService } from '../roads/service';
import type { LonLat } from '../roads/geometry';
import type { RideReportStatus } from '../db/models';
import { rideReportsRepository, type RideReportSort } from './ride-reports-repository';
import { MAX_SNAP_M, snapToSegments } from './snap';
import { ESTIMATE_RULE_TEXT, reportEstimate, severityOf } from './ride-scale';
import { photoType, removePhoto, storePhoto } from './photos';
import { decisionMail } from './ride-mail';

const round = (x: number, d = 1) => Math.round(x * 10 ** d) / 10 ** d;

export interface RideContext {
  now: () => Date;
  dataDir: string;
  publicUrl: string;
  log: Logger;
  mailer?: Mailer | null;
}

export interface NewReportInput {
  lat: number;
  lon: number;
  positionSource: 'gps' | 'map';
  accuracyM: number | null;
  severity: number;
  felt: string[];
  note: string | null;
  reportedAt: Date | null;
}

export const rideReportsService = {
  estimateRule: ESTIMATE_RULE_TEXT,

  /**
   * The nearest route segment to a position, refused beyond {@link MAX_SNAP_M} — unless `nearest`
   * asks for it anyway (to show a driver far from every route which one is closest; a report
   * is still only filed within reach).
   */
  async snap(lat: number, lon: number, opts: { nearest?: boolean } = {}) {
    const lines = await rideReportsRepository.segmentLines();
    const hit = snapToSegments([lon, lat] as LonLat, lines);
    if (!hit) throw AppError.badRequest('There are no routes to report on yet.', { position: 'no route segments exist' });
    const withinReach = hit.distanceM <= MAX_SNAP_M;
    if (!withinReach && !opts.nearest) {
      // in km once it is a kilometre or more ("159 km", not "159403 m")
      const far = hit.distanceM >= 1000 ? `${(hit.distanceM / 1000).toFixed(hit.distanceM < 10_000 ? 1 : 0)} km` : `${Math.round(hit.distanceM)} m`;
      throw new AppError(422, 'too_far', `That place is ${far} from the nearest route we know; reports must be within ${MAX_SNAP_M} m of a route. Move the pin onto the road you drove.`, {
        position: `is ${far} from the nearest route (at most ${MAX_SNAP_M} m)`,
      });
    }
    const seg = (await rideReportsRepository.segmentInfo(hit.segmentId))!;
    return { segment: seg, point: { lat: hit.point[1], lon: hit.point[0] }, distanceM: round(hit.distanceM), maxDistanceM: MAX_SNAP_M, withinReach };
  },

  async create(user: SessionUser, input: NewReportInput, photo: Buffer | null, ctx: RideContext) {
    const snapped = await rideReportsService.snap(input.lat, input.lon);
    const now = ctx.now();
    // A draft sent later keeps the time it was written; a phone clock ahead of ours is clamped to now.
    const reportedAt = input.reportedAt && input.reportedAt.getTime() < now.getTime() ? input.reportedAt : now;
    const kind = photo ? photoType(photo) : null;
    const stored = photo && kind ? storePhoto(ctx.dataDir, photo, kind.ext) : null;
    try {
      const id = await rideReportsRepository.create({
        driverId: user.id,
        vehicleId: await rideReportsRepository.vehicleOfDriver(user.id),
        routeId: snapped.segment.routeId,
        segmentId: snapped.segment.id,
        lat: input.lat,
        lon: input.lon,
        positionSource: input.positionSource,
        accuracyM: input.accuracyM,
        snappedLat: snapped.point.lat,
        snappedLon: snapped.point.lon,
        snapDistanceM: snapped.distanceM,
        severity: input.severity,
        felt: [...new Set(input.felt)],
        note: input.note,
        photoPath: stored,
        photoType: kind?.type ?? null,
        photoBytes: photo ? photo.length : null,
        reportedAt,
      });
      return (await rideReportsRepository.find(id))!;
    } catch (e) {
      removePhoto(ctx.dataDir, stored);
      throw e;
    }
  },

  /** One report; a driver only sees their own (others look absent, not forbidden). */
  async get(user: SessionUser, id: number) {
    const r = await rideReportsRepository.find(id);
    if (!r || (user.role === 'driver' && r.driverId !== user.id)) throw AppError.notFound('Ride report');
    return r;
  },

  async list(user: SessionUser, q: { offset: number; pageSize: number; sort: { field: RideReportSort; dir: 'ASC' | 'DESC' }; driverId?: number; status?: RideReportStatus; routeId?: number; segmentId?: number; minSeverity?: number }) {
    if (user.role === 'driver') {
      if (q.driverId && q.driverId !== user.id) throw AppError.forbidden('Drivers see only their own reports.');
      return rideReportsRepository.list({ ...q, driverId: user.id });
    }
    return rideReportsRepository.list(q);
  },

  groups(status: RideReportStatus) {
    return rideReportsRepository.groups(status);
  },

  async accept(user: SessionUser, id: number, note: string | null, ctx: RideContext) {
    const now = ctx.now();
    const result = await rideReportsRepository.transaction(async (t) => {
      const r = await rideReportsRepository.find(id, t);
      if (!r) throw AppError.notFound('Ride report');
      if (r.status !== 'new') throw AppError.conflict(`This report was already ${r.status}.`, { status: `is ${r.status}` });
      const before = (await rideReportsRepository.segmentInfo(r.segmentId, t))!;
      const est = reportEstimate(before.isoClass, r.severity);
      const observationId = await roadsService.addDriverReportObservation(
        {
          segmentId: r.segmentId,
          gdN0: est.gdN0,
          isoClass: est.isoClass,
          observedOn: r.reportedAt.slice(0, 10),
          recordedById: user.id,
          note: `Driver's report #${r.id} (${severityOf(r.severity).label.toLowerCase()}, ${est.steps} class step${est.steps === 1 ? '' : 's'} above ${before.isoClass ?? 'B (assumed)'})${note ? `: ${note}` : ''}`,
        },
        t,
      );
      const after = (await rideReportsRepository.segmentInfo(r.segmentId, t))!;
      await rideReportsRepository.decide(id, { status: 'accepted', decidedById: user.id, decidedAt: now, classBefore: before.isoClass, estimatedClass: est.isoClass, estimatedGdN0: est.gdN0, classAfter: after.isoClass, gdN0After: after.gdN0, observationId }, t);
      await queueDriverNote(r, 'accepted', null, before.isoClass, after.isoClass, ctx, t);
      return { before, after };
    });
    await sendNow(ctx);
    return { report: await rideReportsRepository.find(id), segmentBefore: result.before, segmentAfter: result.after, rule: ESTIMATE_RULE_TEXT };
  },

  async dismiss(user: SessionUser, id: number, reason: string, ctx: RideContext) {
    const now = ctx.now();
    await rideReportsRepository.transaction(async (t) => {
      const r = await rideReportsRepository.find(id, t);
      if (!r) throw AppError.notFound('Ride report');
      if (r.status !== 'new') throw AppError.conflict(`This report was already ${r.status}.`, { status: `is ${r.status}` });
      await rideReportsRepository.decide(id, { status: 'dismissed', decidedById: user.id, decidedAt: now, dismissReason: reason }, t);
      await queueDriverNote(r, 'dismissed', reason, null, null, ctx, t);
    });
    await sendNow(ctx);
    return { report: await rideReportsRepository.find(id) };
  },
};

async function queueDriverNote(
  r: NonNullable<Awaited<ReturnType<typeof rideReportsRepository.find>>>,
  decision: 'accepted' | 'dismissed',
  reason: string | null,
  classBefore: string | null,
  classAfter: string | null,
  ctx: RideContext,
  t: Parameters<Parameters<typeof rideReportsRepository.transaction>[0]>[0],
) {
  const driver = await rideReportsRepository.driverContact(r.driverId, t);
  // The driver's preference "ride reports" turns these notes off.
  if (!driver || !driver.active || !driver.notify) return;
  const body = decisionMail({
    name: driver.name,
    reportId: r.id,
    reportedAt: r.reportedAt,
    routeName: r.routeName,
    seq: r.segmentSeq ?? 0,
    startM: r.segmentStartM ?? 0,
    endM: r.segmentEndM ?? 0,
    decision,
    reason,
    classBefore,
    classAfter,
    reportsUrl: `${ctx.publicUrl}/my-reports`,
    settingsUrl: `${ctx.publicUrl}/account`,
  });
  await mailRepository.queue(
    [{ dedupeKey: `ride-report:${r.id}:${decision}`, kind: 'note', userId: driver.id, toAddress: driver.email, subject: body.subject, textBody: body.text, htmlBody: body.html, jobRunId: null }],
    ctx.now(),
    t,
  );
}

/** Sends queued mail now when the app has a mailer; otherwise the nightly run sends it. */
async function sendNow(ctx: RideContext) {
  if (!ctx.mailer) return;
  try {
    await sendPending(ctx.mailer, ctx.now(), ctx.log);
  } catch (e) {
    ctx.log.warn(`ride reports: sending mail failed, the nightly run retries: ${(e as Error).message}`);
  }
}
