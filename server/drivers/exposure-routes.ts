/** Exposure API: a driver's own days; the manager's overview of every driver. */
import type { Router } from 'express';
import { z } from 'zod';
import { allow, currentUser } from '../http/access';
import { isoDay, parse } from '../http/validate';
import { AppError } from '../errors';
import { exposureRepository } from './exposure-repository';
import { exposureOverview, seatFactorText } from './exposure-overview';
import { EXPOSURE_ACTION_VALUE, EXPOSURE_LIMIT_VALUE } from '../physics/exposure';
import { EXPOSURE_CAUTION, EXPOSURE_METHOD, type ExposurePart } from './exposure';
import { localDay, plusDays } from '../lib/days';

const isoDate = isoDay;

function range(q: { from?: string; to?: string }, today: string) {
  const to = q.to ?? today;
  const from = q.from ?? plusDays(to, -29);
  if (from > to) throw AppError.badRequest('Some values in the query are not valid.', { from: 'must not be after to' });
  if (Date.parse(to) - Date.parse(from) > 400 * 86_400_000) throw AppError.badRequest('Some values in the query are not valid.', { from: 'the range must be at most 400 days' });
  return { from, to };
}

const base = { actionValue: EXPOSURE_ACTION_VALUE, limitValue: EXPOSURE_LIMIT_VALUE, caution: EXPOSURE_CAUTION, method: EXPOSURE_METHOD };

export function registerExposureRoutes(api: Router, ctx: { now: () => Date; timeZone: string }) {
  const today = () => localDay(ctx.now(), ctx.timeZone);

  api.get('/exposure', allow('driver', 'manager'), async (req, res) => {
    const q = parse(z.object({ driverId: z.coerce.number({ message: 'must be an id' }).int().positive('must be an id').optional(), from: isoDate.optional(), to: isoDate.optional() }).strict(), req.query, 'query');
    const user = currentUser(req);
    if (user.role === 'driver' && q.driverId !== undefined && q.driverId !== user.id) throw AppError.forbidden('Drivers see only their own exposure.');
    if (user.role === 'manager' && q.driverId === undefined) throw AppError.badRequest('Choose a driver.', { driverId: 'is required (the overview of every driver is /api/exposure/overview)' });
    const driverId = q.driverId ?? user.id;
    const { from, to } = range(q, today());
    const driver = await exposureRepository.user(driverId);
    if (!driver || driver.role !== 'driver') throw AppError.notFound('Driver');
    const rows = await exposureRepository.driverDays(driverId, from, to);
    const days = rows.map((r) => ({ day: r.day, a8: r.a8, hours: r.hours, trips: r.trips, maxWeightedAccel: r.max_weighted_accel, status: r.status, seatFactor: seatFactorText(JSON.parse(r.parts) as ExposurePart[]) }));
    res.json({
      ...base,
      driver: { id: driver.id, name: driver.name },
      from,
      to,
      days,
      summary: {
        daysDriven: days.length,
        daysAboveAction: days.filter((d) => d.a8 > EXPOSURE_ACTION_VALUE).length,
        daysAboveLimit: days.filter((d) => d.a8 > EXPOSURE_LIMIT_VALUE).length,
        maxA8: days.length ? Math.max(...days.map((d) => d.a8)) : null,
      },
    });
  });

  api.get('/exposure/overview', allow('manager'), async (req, res) => {
    const q = parse(z.object({ from: isoDate.optional(), to: isoDate.optional() }).strict(), req.query, 'query');
    const { from, to } = range(q, today());
    res.json({ ...base, ...(await exposureOverview(from, to)) });
  });
}
