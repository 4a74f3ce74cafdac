import type { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { z } from 'zod';
import type { Config } from '../config';
import { allow, currentUser } from '../http/access';
import { INSPECTION_SCOPE_SQL, inspectionScopeArgs, mechanicScope } from '../http/mechanic-scope';
import { parse } from '../http/validate';
import { localDay } from '../wear/repository';
import { DUE_SORTS } from './repository';
import { inspectionService } from './service';

const dueQuery = z
  .object({
    depotId: z.coerce.number({ message: 'must be a number' }).int().positive('must be a positive id').optional(),
    withinDays: z.coerce.number({ message: 'must be a number' }).int().min(0).max(3650).optional(),
    sort: z.enum(DUE_SORTS, { message: 'must be due or lifeUsed' }).default('due'),
  })
  .strict();

export function registerInspectionRoutes(r: Router, deps: { sequelize: Sequelize; config: Config; now: () => Date }) {
  const service = inspectionService(deps.sequelize);

  r.get('/inspections/due', allow('manager', 'mechanic'), async (req, res) => {
    const q = parse(dueQuery, req.query, 'query');
    const today = localDay(deps.now(), deps.config.timeZone);
    // a mechanic's due list holds only the inspections that are theirs (server/http/mechanic-scope.ts)
    const s = await mechanicScope(deps.sequelize, currentUser(req));
    const scope = s ? { sql: INSPECTION_SCOPE_SQL, args: inspectionScopeArgs(s) } : undefined;
    const items = await service.dueList({ today, depotId: q.depotId, withinDays: q.withinDays, sort: q.sort, scope });
    const counts = {
      overdue: items.filter((i) => i.status === 'overdue').length,
      due: items.filter((i) => i.status === 'due').length,
      next30: items.filter((i) => i.status === 'scheduled' && i.daysLeft <= 30).length,
      next90: items.filter((i) => i.status === 'scheduled' && i.daysLeft > 30 && i.daysLeft <= 90).length,
      later: items.filter((i) => i.status === 'scheduled' && i.daysLeft > 90).length,
    };
    res.json({ items, total: items.length, today, sort: q.sort, counts, rules: deps.config.inspection });
  });
}
