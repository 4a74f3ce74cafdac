import type { Router } from 'express';
import fs from 'node:fs';
import { addYears, formatISO, isValid, parseISO } from 'date-fns';
import { z } from 'zod';
import type { Config } from '../config';
import { AppError } from '../errors';
import { allow, currentUser } from '../http/access';
import { idParam, isoDay, listQuery, noHiddenChars, paging, parse } from '../http/validate';
import { requireFile, singleFile } from '../http/upload';
import { ATTACHMENT_KINDS } from './attachments';
import { REMOVAL_REASONS } from './life';
import { FINDINGS, VERDICTS, workshopService } from './service';

const isoDate = isoDay;
const position = z.string({ message: 'must be a corner such as FL' }).regex(/^[A-Z0-9]{2,4}$/, 'must be a corner such as FL, FR, RL, RR');
const odometer = z.number({ message: 'must be a number in km' }).min(0, 'must be 0 km or more').max(5_000_000, 'must be at most 5 000 000 km');

const inspectionList = listQuery(['dueDate', 'fleetNumber', 'status'], 'dueDate', {
  status: z.enum(['open', 'all', 'scheduled', 'due', 'overdue', 'done', 'cancelled'], { message: 'must be open, all, scheduled, due, overdue, done or cancelled' }).optional(),
  assignee: z.string().regex(/^(me|none|\d+)$/, 'must be me, none or a user id').optional(),
  depotId: z.coerce.number({ message: 'must be a number' }).int().positive().optional(),
  vehicleId: z.coerce.number({ message: 'must be a number' }).int().positive().optional(),
});

const assignBody = z
  .object({
    assigneeId: z.number({ message: 'must be a user id' }).int().positive().nullable(),
    depotId: z.number({ message: 'must be a depot id' }).int().positive().nullable(),
    dueDate: isoDate,
  })
  .partial()
  .strict()
  .refine((v) => Object.keys(v).length > 0, { message: 'give a mechanic, a depot or a due date', path: ['_'] });

/** A follow-up date: a real day after the inspection day (`today`) and at most a year after it. */
const followUpDate = (today: string) => {
  const last = formatISO(addYears(parseISO(today), 1), { representation: 'date' });
  return isoDate
    .refine((s) => isValid(parseISO(s)) && formatISO(parseISO(s), { representation: 'date' }) === s, 'is not a calendar date')
    .refine((s) => s > today, `must be after the inspection day (${today})`)
    .refine((s) => s <= last, `must be within a year of the inspection (on or before ${last})`);
};

const resultsBody = (today: string) => z
  .object({
    odometerKm: odometer,
    notes: z.string().trim().max(4000, 'must be 4000 characters or fewer').nullish(),
    complete: z.boolean({ message: 'must be true or false' }).optional(),
    /** With a "check again soon" verdict: when to check again (default 30 days on). */
    followUpOn: followUpDate(today).nullish(),
    plateAmplitudeMm: z.number({ message: 'must be a number in mm' }).min(0.5, 'must be 0.5–10 mm (zero-to-peak: half the stroke)').max(10, 'must be 0.5–10 mm (zero-to-peak: half the stroke)').optional(),
    corners: z
      .array(
        z
          .object({
            position,
            adhesionPct: z.number({ message: 'must be a number in %' }).min(0, 'must be 0–100 %').max(100, 'must be 0–100 %').nullable(),
            phaseDeg: z.number({ message: 'must be a number in °' }).min(0, 'must be 0–180°').max(180, 'must be 0–180°').nullish(),
            findings: z.array(z.enum(FINDINGS, { message: `must be one of ${FINDINGS.join(', ')}` })).max(FINDINGS.length).default([]),
            verdict: z.enum(VERDICTS, { message: 'must be ok, monitor or replace' }),
          })
          .strict(),
        { message: 'must be a list of corners' },
      )
      .min(1, 'record at least one corner')
      .max(12),
  })
  .strict()
  .superRefine((v, ctx) => {
    const seen = new Set<string>();
    v.corners.forEach((c, k) => {
      if (seen.has(c.position)) ctx.addIssue({ code: 'custom', path: ['corners', k, 'position'], message: `${c.position} is given twice` });
      seen.add(c.position);
    });
  });

const workBody = z
  .object({
    vehicleId: z.number({ message: 'must be a vehicle id' }).int().positive('must be a vehicle id'),
    inspectionId: z.number({ message: 'must be an inspection id' }).int().positive().nullish(),
    performedOn: isoDate,
    odometerKm: odometer,
    summary: z.string({ message: 'is required' }).trim().min(3, 'must be at least 3 characters').max(400, 'must be 400 characters or fewer').refine(...noHiddenChars),
    labourHours: z.number({ message: 'must be a number in h' }).min(0, 'must be 0 h or more').max(200, 'must be at most 200 h'),
    notes: z.string().trim().max(4000).nullish(),
    items: z
      .array(
        z
          .object({
            position,
            component: z.enum(['damper', 'spring'], { message: 'must be damper or spring' }),
            partDescription: z.string({ message: 'is required' }).trim().min(2, 'must be at least 2 characters').max(160).refine(...noHiddenChars),
            partNumber: z.string().trim().max(60, 'must be 60 characters or fewer').refine(...noHiddenChars).nullish(),
            cost: z.number({ message: 'must be a number' }).min(0, 'must be 0 or more').max(1_000_000),
            removalReason: z.enum(REMOVAL_REASONS, { message: `must be one of: ${REMOVAL_REASONS.join(', ')}` }),
          })
          .strict(),
        { message: 'must be a list of parts' },
      )
      .min(1, 'add at least one replaced part')
      .max(24),
  })
  .strict()
  .superRefine((v, ctx) => {
    const seen = new Set<string>();
    v.items.forEach((it, k) => {
      const key = `${it.position}/${it.component}`;
      if (seen.has(key)) ctx.addIssue({ code: 'custom', path: ['items', k, 'position'], message: `the ${it.component} at ${it.position} is listed twice` });
      seen.add(key);
    });
  });

const attachmentForm = z.object({ kind: z.enum(ATTACHMENT_KINDS, { message: 'must be photo or printout' }) }).strict();
const workList = z.object({ vehicleId: z.coerce.number({ message: 'must be a number' }).int().positive().optional() }).strict();
const lifeQuery = z.object({ specId: z.coerce.number({ message: 'must be a spec id' }).int().positive('must be a spec id') }).strict();
const forecastQuery = z
  .object({
    days: z.coerce.number({ message: 'must be a number of days' }).int().min(7, 'must be 7–365 days').max(365, 'must be 7–365 days').default(90),
    format: z.enum(['json', 'csv'], { message: 'must be json or csv' }).default('json'),
  })
  .strict();
const workloadQuery = z.object({ weeks: z.coerce.number({ message: 'must be a number' }).int().min(1).max(26).default(8) }).strict();

const csvCell = (v: unknown) => {
  const s = v === null || v === undefined ? '' : String(v);
  // quote, and neutralise formula-looking cells for spreadsheets
  const safe = /^[=+\-@]/.test(s) ? `'${s}` : s;
  return /[",\n]/.test(safe) || safe !== s ? `"${safe.replace(/"/g, '""')}"` : safe;
};

export function registerWorkshopRoutes(r: Router, deps: { config: Config; now: () => Date }) {
  const cfg = deps.config.workshop;
  const svc = workshopService(cfg, { now: deps.now, dataDir: deps.config.dataDir, publicUrl: deps.config.publicUrl, timeZone: deps.config.timeZone });

  r.get('/inspections', allow('manager', 'mechanic'), async (req, res) => {
    const qy = parse(inspectionList, req.query, 'query');
    res.json(await svc.list(currentUser(req), { ...qy, ...paging(qy) }));
  });

  r.get('/inspections/:id', allow('manager', 'mechanic'), async (req, res) => {
    const { id } = parse(idParam, req.params, 'address');
    res.json(await svc.detail(currentUser(req), id));
  });

  r.patch('/inspections/:id', allow('manager'), async (req, res) => {
    const { id } = parse(idParam, req.params, 'address');
    const body = parse(assignBody, req.body, 'assignment');
    res.json(await svc.assign(id, body, currentUser(req)));
  });

  r.post('/inspections/:id/results', allow('mechanic'), async (req, res) => {
    const { id } = parse(idParam, req.params, 'address');
    const body = parse(resultsBody(formatISO(deps.now(), { representation: 'date' })), req.body, 'results');
    res.json(await svc.recordResults(currentUser(req), id, body));
  });

  r.post('/inspections/:id/attachments', allow('mechanic'), singleFile(cfg.attachmentMaxBytes), async (req, res) => {
    const { id } = parse(idParam, req.params, 'address');
    const form = parse(attachmentForm, req.body ?? {}, 'form');
    const file = requireFile(req.file);
    res.status(201).json(await svc.addAttachment(currentUser(req), id, form.kind, file));
  });

  r.get('/attachments/:id/file', allow('manager', 'mechanic'), async (req, res) => {
    const { id } = parse(idParam, req.params, 'address');
    const f = await svc.attachmentFile(currentUser(req), id);
    if (!fs.existsSync(f.path)) throw AppError.notFound('The attachment file');
    res.setHeader('content-type', f.mimeType);
    res.setHeader('content-disposition', `inline; filename="${f.originalName.replace(/[^\w.-]+/g, '_')}"`);
    res.setHeader('content-security-policy', "default-src 'none'; img-src 'self'; style-src 'unsafe-inline'");
    fs.createReadStream(f.path).pipe(res);
  });

  r.get('/work-records', allow('manager', 'mechanic'), async (req, res) => {
    const qy = parse(workList, req.query, 'query');
    res.json(await svc.workRecords(currentUser(req), qy));
  });

  r.get('/work-records/:id', allow('manager', 'mechanic'), async (req, res) => {
    const { id } = parse(idParam, req.params, 'address');
    res.json(await svc.workRecord(id, currentUser(req)));
  });

  r.post('/work-records', allow('mechanic'), async (req, res) => {
    const body = parse(workBody, req.body, 'work record');
    res.status(201).json(await svc.recordWork(currentUser(req), body));
  });

  r.get('/fleet-life', allow('manager', 'mechanic'), async (req, res) => {
    const { specId } = parse(lifeQuery, req.query, 'query');
    res.json(await svc.fleetLife(specId));
  });

  r.get('/life-backtest', allow('manager', 'mechanic'), async (req, res) => {
    const { specId } = parse(lifeQuery, req.query, 'query');
    res.json(await svc.lifeBacktest(specId));
  });

  r.get('/forecast', allow('manager'), async (req, res) => {
    const qy = parse(forecastQuery, req.query, 'query');
    const f = await svc.forecast(qy.days);
    if (qy.format === 'json') return res.json(f);
    const lines = [['spec', 'depot', 'replacements', 'cost', 'cost_known'].join(',')];
    for (const g of f.rows) lines.push([g.specName, g.depotName, g.replacements, g.cost.toFixed(2), g.costKnown ? 'yes' : 'no'].map(csvCell).join(','));
    lines.push('');
    lines.push(['end_of_life_date', 'vehicle', 'corner', 'spec', 'depot', 'chance', 'cost', 'basis'].join(','));
    for (const it of f.items) lines.push([it.date, it.fleetNumber, it.position, it.specName, it.depotName, it.chance.toFixed(3), it.cost === null ? '' : it.cost.toFixed(2), it.basis].map(csvCell).join(','));
    res.setHeader('content-type', 'text/csv; charset=utf-8');
    res.setHeader('content-disposition', `attachment; filename="damper-forecast-${f.from}-to-${f.to}.csv"`);
    res.send(`${lines.join('\n')}\n`);
  });

  r.get('/workload', allow('manager'), async (req, res) => {
    const { weeks } = parse(workloadQuery, req.query, 'query');
    res.json(await svc.workload(weeks));
  });

  r.get('/model-check', allow('manager'), async (_req, res) => {
    res.json(await svc.modelCheck());
  });

  r.get('/vehicles/:id/workshop', allow('manager', 'mechanic'), async (req, res) => {
    const { id } = parse(idParam, req.params, 'address');
    res.json(await svc.vehicleWorkshop(currentUser(req), id));
  });

  r.get('/workshop/options', allow('manager', 'mechanic'), (_req, res) => {
    res.json({ findings: FINDINGS, verdicts: VERDICTS, removalReasons: REMOVAL_REASONS, laneFlagPoints: cfg.laneFlagPoints, lanePlateAmplitudeMm: cfg.lanePlateAmplitudeMm, attachmentMaxBytes: cfg.attachmentMaxBytes });
  });
}
