import type { Router } from 'express';
import fs from 'node:fs';
import { formatISO } from 'date-fns';
import { z } from 'zod';
import type { Config } from '../config';
import { AppError } from '../errors';
import { allow, currentUser } from '../http/access';
import { idParam, listQuery, paging, parse } from '../http/validate';
import { requireFile, singleFile } from '../http/upload';
import { ATTACHMENT_KINDS } from './attachments';
import { workshopService } from './service';
import { FINDINGS, REMOVAL_REASONS, VERDICTS, assignBody, resultsBody, workBody } from '../contracts/workshop';
import { csvCell } from '../http/csv-export';

const inspectionList = listQuery(['dueDate', 'fleetNumber', 'status'], 'dueDate', {
  status: z.enum(['open', 'all', 'scheduled', 'due', 'overdue', 'done', 'cancelled'], { message: 'must be open, all, scheduled, due, overdue, done or cancelled' }).optional(),
  assignee: z.string().regex(/^(me|none|\d+)$/, 'must be me, none or a user id').optional(),
  depotId: z.coerce.number({ message: 'must be a number' }).int().positive().optional(),
  vehicleId: z.coerce.number({ message: 'must be a number' }).int().positive().optional(),
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
