/**
 * The workshop's planning figures: each spec's damper life and its back-test, the expected
 * replacements and their cost over a horizon, open inspections per depot and week, and the model
 * check of predicted against measured damping.
 */
import { addDays, startOfISOWeek } from 'date-fns';
import type { LifeBacktest } from '../contracts/workshop';
import { AppError } from '../errors';
import { cornerState, FORECAST_MIN_CHANCE, replacementChance } from './corners';
import { day, iso, type WorkshopContext } from './context';
import { backtest, specLife, storedLifeModels } from './life';
import { workshopRepository } from './repository';

export function workshopPlanning({ cfg, today }: WorkshopContext) {
  return {
    async fleetLife(specId: number) {
      const s = await workshopRepository.specName(specId);
      if (!s) throw AppError.notFound('Suspension spec');
      return specLife(s.id, s.name, cfg.life);
    },

    /** What the model trained only on earlier data predicted for each removal, against what happened. */
    async lifeBacktest(specId: number): Promise<LifeBacktest> {
      const s = await workshopRepository.specName(specId);
      if (!s) throw AppError.notFound('Suspension spec');
      return { specName: s.name, ...(await backtest(s.id, cfg.life, today())) };
    },

    /** Expected damper replacements in the next `days` days, with cost, by spec and depot. */
    async forecast(days: number) {
      const from = today();
      const to = day(addDays(new Date(`${from}T00:00:00Z`), days));
      const [{ rows, lives }, km30, costs] = await Promise.all([
        Promise.all([workshopRepository.fittedCorners('all'), storedLifeModels(cfg.life.prior)]).then(([rows, lives]) => ({ rows, lives })),
        workshopRepository.km30(`${from} 23:59:59`),
        workshopRepository.damperPartCosts(),
      ]);
      // older work records without items: parts cost shared by the dampers they removed
      const legacy = await workshopRepository.legacyDamperCosts();
      const costOf = new Map<number, { cost: number; basis: string }>();
      for (const l of legacy) costOf.set(l.spec_id, { cost: l.cost, basis: 'parts cost of past work records per damper' });
      for (const c of costs) costOf.set(c.spec_id, { cost: c.cost, basis: `mean of ${c.n} damper part cost(s) recorded` });
      const meta = await workshopRepository.vehicleNames();
      const vm = new Map(meta.map((m) => [m.id, m]));
      const items = [];
      for (const r of rows) {
        const st = cornerState(r, lives, cfg.inspectionThreshold);
        const c0 = replacementChance(r, st, days, from, to, (km30.get(r.vehicle_id) ?? 0) / 30, lives.get(r.spec_id));
        if (c0.chance < FORECAST_MIN_CHANCE) continue;
        const m = vm.get(r.vehicle_id)!;
        const c = costOf.get(r.spec_id);
        items.push({
          vehicleId: r.vehicle_id, fleetNumber: m.fleet_number, position: r.position, damperId: r.damper_id, date: st.endOfLifeDate, chance: c0.chance, basis: c0.basis,
          specId: r.spec_id, specName: m.spec_name, depotId: m.depot_id, depotName: m.depot_name, cost: c?.cost ?? null, lifeUsedFraction: st.lifeUsedFraction,
        });
      }
      items.sort((a, b) => b.chance - a.chance || a.fleetNumber.localeCompare(b.fleetNumber) || a.position.localeCompare(b.position));
      const groups = new Map<string, { specId: number; specName: string; depotId: number; depotName: string; replacements: number; cost: number; costKnown: boolean }>();
      for (const it of items) {
        const key = `${it.specId}/${it.depotId}`;
        const g = groups.get(key) ?? { specId: it.specId, specName: it.specName, depotId: it.depotId, depotName: it.depotName, replacements: 0, cost: 0, costKnown: true };
        g.replacements += it.chance;
        if (it.cost === null) g.costKnown = false;
        else g.cost += it.chance * it.cost;
        groups.set(key, g);
      }
      const rowsOut = [...groups.values()]
        .map((g) => ({ ...g, replacements: Math.round(g.replacements * 10) / 10 }))
        .sort((a, b) => a.specName.localeCompare(b.specName) || a.depotName.localeCompare(b.depotName));
      return {
        from,
        to,
        days,
        rows: rowsOut,
        totals: { replacements: Math.round(items.reduce((s, x) => s + x.chance, 0) * 10) / 10, cost: rowsOut.reduce((s, g) => s + g.cost, 0) },
        method: `Expected replacements: for each fitted damper, the chance it reaches end of life within ${days} days given it has lasted so far (its fitted Weibull life at its last 30 days' wear rate; 1 when its calendar limit falls inside), summed; dampers under ${Math.round(FORECAST_MIN_CHANCE * 100)} % are left out of the list.`,
        costBasis: [...costOf.entries()].map(([specId, c]) => ({ specId, specName: meta.find((m) => vm.get(m.id) && rows.some((r) => r.spec_id === specId && r.vehicle_id === m.id))?.spec_name ?? `spec ${specId}`, ...c })),
        items,
      };
    },

    /** Open inspections per depot and ISO week of their due date (overdue in their own column). */
    async workload(weeks: number) {
      const t = today();
      const rows = await workshopRepository.openInspectionsByDepot();
      const depots = await workshopRepository.depotsWithMechanics();
      const week0 = startOfISOWeek(new Date(`${t}T00:00:00Z`));
      const weekStarts = Array.from({ length: weeks }, (_, k) => day(addDays(week0, 7 * k)));
      const out = depots.map((d) => ({ depotId: d.id, depotName: d.name, mechanics: Number(d.mechanics), overdue: 0, later: 0, unassigned: 0, weeks: weekStarts.map((w) => ({ weekStart: w, inspections: 0 })) }));
      for (const r of rows) {
        const o = out.find((x) => x.depotId === r.depot_id);
        if (!o) continue;
        if (r.assignee_id === null) o.unassigned++;
        if (r.due_date < t) {
          o.overdue++;
          continue;
        }
        const w = day(startOfISOWeek(new Date(`${r.due_date}T00:00:00Z`)));
        const cell = o.weeks.find((x) => x.weekStart === w);
        if (cell) cell.inspections++;
        else o.later++;
      }
      return { weekStarts, depots: out };
    },

    /** Predicted against measured damping over every inspection with an estimate. */
    async modelCheck() {
      const rows = await workshopRepository.predictedAgainstMeasured();
      const noEstimate = await workshopRepository.cornersWithoutEstimate();
      const diffs = rows.map((r) => r.predicted - r.measured);
      const n = diffs.length;
      const bias = n ? diffs.reduce((s, x) => s + x, 0) / n : null;
      const spread = n > 1 ? Math.sqrt(diffs.reduce((s, x) => s + (x - bias!) ** 2, 0) / (n - 1)) : null;
      const rel = rows.map((r) => (r.predicted - r.measured) / r.nominal);
      return {
        points: rows.map((r) => ({ inspectionId: r.inspection_id, vehicleId: r.vehicle_id, fleetNumber: r.fleet_number, position: r.position, predictedNsPerM: r.predicted, measuredNsPerM: r.measured, nominalNsPerM: r.nominal, basis: r.basis, date: iso(r.completed) })),
        n,
        biasNsPerM: bias,
        spreadNsPerM: spread,
        biasPctOfNominal: n ? (rel.reduce((s, x) => s + x, 0) / n) * 100 : null,
        noEstimate: Number(noEstimate),
        definitions: 'bias = mean of (predicted − measured); spread = standard deviation of (predicted − measured), n − 1 in the denominator',
      };
    },
  };
}
