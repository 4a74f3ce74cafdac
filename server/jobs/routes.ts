import type { Router } from 'express';
import { z } from 'zod';
import type { Config } from '../config';
import type { Db } from '../db';
import type { Logger } from '../logger';
import type { Mailer } from '../mail/mailer';
import { AppError } from '../errors';
import { allow, currentUser } from '../http/access';
import { idParam, isoDay, listQuery, notAfter, paging, parse } from '../http/validate';
import { jobService, type StartNightly } from './service';
import { localDay } from '../wear/repository';

const runBody = z
  .object({
    asOf: isoDay.optional(),
  })
  .strict();

const runList = listQuery(['id'], '-id', {});

export function registerJobRoutes(r: Router, deps: { config: Config; db: Db; log: Logger; mailer: Mailer | null; now: () => Date; startNightly: StartNightly | null }) {
  const jobs = jobService(deps);

  r.post('/jobs/nightly/run', allow('manager'), async (req, res) => {
    const body = parse(runBody, req.body ?? {}, 'body');
    // a run for a day that has not come yet would stamp predictions and mail a digest for it
    notAfter(body.asOf, localDay(deps.now(), deps.config.timeZone), 'asOf');
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
