import type { Router } from 'express';
import { z } from 'zod';
import type { Config } from '../config';
import type { Db } from '../db';
import type { Logger } from '../logger';
import type { Mailer } from '../mail/mailer';
import { AppError } from '../errors';
import { allow, currentUser } from '../http/access';
import { idParam, listQuery, paging, parse } from '../http/validate';
import { jobService } from './service';

const runBody = z
  .object({
    asOf: z
      .string()
      .regex(/^\d{4}-\d{2}-\d{2}$/, 'must be a date like 2026-11-30')
      .refine((s) => !Number.isNaN(Date.parse(s)), 'must be a real date')
      .optional(),
  })
  .strict();

const runList = listQuery(['id'], '-id', {});

export function registerJobRoutes(r: Router, deps: { config: Config; db: Db; log: Logger; mailer: Mailer | null; now: () => Date }) {
  const jobs = jobService(deps);

  r.post('/jobs/nightly/run', allow('manager'), async (req, res) => {
    const body = parse(runBody, req.body ?? {}, 'body');
    if (!deps.mailer) throw new AppError(503, 'mail_unavailable', 'Mail is not configured for this app instance, so the job cannot run here.');
    const runId = await jobs.startNightly({ asOf: body.asOf, requestedById: currentUser(req).id });
    res.status(202).json({ runId });
  });

  r.get('/jobs/runs', allow('manager'), async (req, res) => {
    const q = parse(runList, req.query, 'query');
    res.json(await jobs.list(paging(q)));
  });

  r.get('/jobs/runs/:id', allow('manager'), async (req, res) => {
    const { id } = parse(idParam, req.params, 'address');
    const run = await jobs.get(id);
    if (!run) throw AppError.notFound('Job run');
    res.json({ run });
  });
}
