import type { Router } from 'express';
import { z } from 'zod';
import type { Mailer } from './mailer';
import { AppError } from '../errors';
import { allow, currentUser } from '../http/access';
import { idParam, listQuery, paging, parse } from '../http/validate';
import { mailRepository } from './repository';

const outboxList = listQuery(['id'], '-id', { q: z.string().trim().max(100).optional() });

const prefsPatch = z
  .object({
    inspectionDigest: z.boolean({ message: 'must be true or false' }).optional(),
    rideReports: z.boolean({ message: 'must be true or false' }).optional(),
    assignments: z.boolean({ message: 'must be true or false' }).optional(),
  })
  .strict()
  .refine((p) => Object.keys(p).length > 0, { message: 'give at least one of inspectionDigest, rideReports, assignments' });

export function registerMailRoutes(r: Router, deps: { mailer: Mailer | null }) {
  r.get('/outbox', allow('manager'), async (req, res) => {
    const q = parse(outboxList, req.query, 'query');
    const list = await mailRepository.listCaught({ ...paging(q), q: q.q });
    res.json({
      ...list,
      transport: deps.mailer ? deps.mailer.describe() : 'not configured',
      catches: deps.mailer?.catches ?? false,
      sent: await mailRepository.sentCounts(),
    });
  });

  r.get('/outbox/:id', allow('manager'), async (req, res) => {
    const { id } = parse(idParam, req.params, 'address');
    const message = await mailRepository.getCaught(id);
    if (!message) throw AppError.notFound('Message');
    res.json({ message });
  });

  r.get('/account/notifications', allow('manager', 'mechanic', 'driver'), async (req, res) => {
    const prefs = await mailRepository.prefs(currentUser(req).id);
    if (!prefs) throw AppError.notFound('User');
    res.json({ preferences: prefs });
  });

  r.patch('/account/notifications', allow('manager', 'mechanic', 'driver'), async (req, res) => {
    const body = parse(prefsPatch, req.body, 'body');
    const id = currentUser(req).id;
    await mailRepository.setPrefs(id, body);
    res.json({ preferences: await mailRepository.prefs(id) });
  });
}
