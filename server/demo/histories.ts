/** The demo fleet's odometers and damper histories, from the removal laws of history.ts. */
import { addDays, startOfDay, subDays } from 'date-fns';
import type { CreationAttributes } from 'sequelize';
import { Damper, Inspection, User, WorkRecord, type Trip } from '../db/models';
import { DEMO_LIFE_LAWS, simulateAxleHistory, type DemoDamperSpan } from './history';
import type { DemoVehicle } from './fleet';
import { day, type SeedContext } from './seed-context';

/** Odometers, and each corner's damper history before and during the records: removals, the inspections and work records behind them, and ordinary checks (docs/methods.md, "Demo fleet"). */
export async function seedHistories(ctx: SeedContext, vehicles: DemoVehicle[], trips: { tripRows: CreationAttributes<Trip>[]; kmByVehicle: Map<number, number>; roughKmByVehicle: Map<number, number> }) {
  const { tripRows, kmByVehicle, roughKmByVehicle } = trips;
  const { opts, transaction, rand, today, now, db } = ctx;
  // Odometers and damper histories (docs/methods.md, "Demo fleet").
  const mechanicOf = [
    (await User.findOne({ where: { email: 'mechanic@reboundry.test' }, ...opts }))!.id,
    (await User.findOne({ where: { email: 'mechanic.millbrook@reboundry.test' }, ...opts }))!.id,
  ];
  const recordsStart = subDays(today, 60);
  const DAY_MS = 86_400_000;
  const tripsOf = new Map<number, { at: number; km: number }[]>();
  for (const t of tripRows) {
    if (!tripsOf.has(t.vehicleId)) tripsOf.set(t.vehicleId, []);
    tripsOf.get(t.vehicleId)!.push({ at: (t.startedAt as Date).getTime(), km: t.distanceKm });
  }
  for (const [vi, { v, spec, depotIdx, workingDayKm }] of vehicles.entries()) {
    const trips = (tripsOf.get(v.id) ?? []).sort((a, b) => a.at - b.at);
    const recordedKm = kmByVehicle.get(v.id) ?? 0;
    const commissioned = new Date(`${v.commissionedAt!}T00:00:00Z`).getTime();
    const retired = v.status === 'retired';
    // km per calendar day: the rate of its trips on record; a retired vehicle, its working-day
    // distance over the working days of the records (5 in 7, less 8 % days off)
    const kmPerDay = retired ? (workingDayKm * 5 * 0.92) / 7 : recordedKm / 60;
    const retiredOn = retired ? subDays(recordsStart, 45).getTime() : null;
    const lastDay = retiredOn ?? recordsStart.getTime();
    const startOdo = Math.round((kmPerDay * Math.max(0, lastDay - commissioned)) / DAY_MS);
    const odoNow = Math.round(startOdo + recordedKm);
    await v.update({ odometerKm: odoNow }, opts);
    /** Odometer at the start of a day: before the records at the steady rate, in them from the trips. */
    const odoAt = (when: number) => {
      if (when <= commissioned) return 0;
      if (when >= recordsStart.getTime() && !retired) return Math.round(odoNow - trips.reduce((sum, t) => sum + (t.at >= when ? t.km : 0), 0));
      return Math.min(startOdo, Math.round((kmPerDay * (when - commissioned)) / DAY_MS));
    };
    /** The first day starting at or past an odometer reading (removals are done that day). */
    const dayAtKm = (km: number): number => {
      if (km <= 0) return commissioned;
      if (km <= startOdo) return Math.min(commissioned + Math.ceil(km / kmPerDay) * DAY_MS, lastDay - DAY_MS);
      let odo = startOdo;
      for (const t of trips) {
        odo += t.km;
        if (odo >= km) return startOfDay(new Date(t.at + DAY_MS)).getTime();
      }
      return today.getTime();
    };
    // its route mix: the share of its km on class C or rougher (the retired vehicle, with no
    // trips on record, is given a quarter)
    const roughShare = retired ? 0.25 : recordedKm > 0 ? roughKmByVehicle.get(v.id)! / recordedKm : 0;
    const law = DEMO_LIFE_LAWS[spec.prefix];
    const mechanicId = mechanicOf[depotIdx];
    let doneInspectionAt = 0;
    for (const [axleIndex, axle] of spec.axles.entries()) {
      const positions: [string, string] = axleIndex === 0 ? ['FL', 'FR'] : ['RL', 'RR'];
      const { spans, visits } = simulateAxleHistory(rand, law, roughShare, odoNow, positions);
      // one work record (and, for wear, the inspection that found it) per workshop visit
      const records: number[] = [];
      for (const visit of visits) {
        const when = new Date(dayAtKm(visit.km) + 10 * 3_600_000);
        const odo = odoAt(startOfDay(when).getTime());
        const removed = spans.filter((x) => x.visit === records.length);
        const causeReason = removed.find((x) => x.position === visit.cause)?.reason ?? '';
        const where = `${axle.label} ${visit.cause ?? ''}`.trim();
        let inspectionId: number | null = null;
        if (visit.kind === 'wear') {
          const reason =
            causeReason === 'worn: low adhesion'
              ? `Interval check on the test lane (${where}).`
              : causeReason === 'leaking'
                ? `Driver reported oil on the ${where} damper.`
                : `Driver reported a knock from the ${axle.label} axle.`;
          const insp = await Inspection.create(
            { vehicleId: v.id, dueDate: day(subDays(when, 2)), status: 'done', reason, trigger: 'manual', assigneeId: mechanicId, completedAt: when, odometerKm: odo, notes: `${where} damper ${causeReason}; replaced${removed.length > 1 ? ' as a pair' : ''}.` },
            opts,
          );
          inspectionId = insp.id;
          doneInspectionAt = Math.max(doneInspectionAt, when.getTime());
        }
        const summary =
          visit.kind === 'other_work'
            ? `${axle.label[0].toUpperCase()}${axle.label.slice(1)} springs and bushes renewed; dampers renewed with them.`
            : `Replaced ${removed.length > 1 ? `${axle.label} dampers (pair)` : `${where} damper`}${visit.kind === 'accident' ? ' after accident damage' : ''}.`;
        const wr = await WorkRecord.create(
          { vehicleId: v.id, inspectionId, mechanicId, performedAt: when, odometerKm: odo, summary, partsCost: (spec.prefix === 'RT' ? 206 : 93) * removed.length, labourHours: (spec.prefix === 'RT' ? 1.3 : 0.6) * removed.length },
          opts,
        );
        records.push(wr.id);
      }
      // the dampers, in the order they were fitted on each corner
      let aftermarket = 0;
      const idOf = new Map<DemoDamperSpan, { id: number; partNumber: string | null }>();
      for (const x of spans) {
        const fittedOn = dayAtKm(x.fittedKm);
        const removedOn = x.removedKm !== null ? dayAtKm(x.removedKm) : retired ? retiredOn : null;
        const d = await Damper.create(
          {
            vehicleId: v.id,
            position: x.position,
            axleIndex,
            partNumber: x.fittedKm === 0 ? `${spec.prefix}-D${axleIndex}-OE` : `${spec.prefix}-D${axleIndex}-AM${++aftermarket}`,
            installedAt: day(new Date(fittedOn)),
            installedOdometerKm: x.fittedKm === 0 ? 0 : odoAt(fittedOn),
            removedAt: removedOn !== null ? day(new Date(removedOn)) : null,
            removedOdometerKm: removedOn !== null ? odoAt(removedOn) : null,
            removalReason: x.reason ?? (retired ? 'vehicle retired' : null),
            removedByWorkRecordId: x.visit !== null ? records[x.visit] : null,
          },
          opts,
        );
        idOf.set(x, { id: d.id, partNumber: d.partNumber ?? null });
      }
      const items = [];
      for (const x of spans) {
        if (x.visit === null) continue;
        const successor = spans.find((y) => y.position === x.position && y.fittedKm === x.removedKm);
        const next = successor ? idOf.get(successor)! : null;
        items.push([records[x.visit], x.position, axleIndex, 'damper', `${axle.label} damper`, next?.partNumber ?? null, spec.prefix === 'RT' ? 206 : 93, x.reason, idOf.get(x)!.id, next?.id ?? null]);
      }
      if (items.length) {
        const stamp = now.toISOString();
        await db.sequelize.query(
          `INSERT INTO work_record_items (work_record_id, position, axle_index, component, part_description, part_number, cost, removal_reason, removed_damper_id, installed_damper_id, created_at, updated_at)
           VALUES ${items.map(() => '(?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)').join(', ')}`,
          { replacements: items.flatMap((it) => [...it, stamp, stamp]), transaction },
        );
      }
    }
    if (!retired && today.getTime() - doneInspectionAt > 320 * DAY_MS) {
      // an ordinary check some time in the last year, so the interval rule is spread out
      const doneOn = subDays(today, 25 + ((vi * 53) % 320));
      await Inspection.create(
        {
          vehicleId: v.id,
          dueDate: day(subDays(doneOn, 1)),
          status: 'done',
          reason: 'Interval rule: 12 months since the last inspection.',
          trigger: 'interval_months',
          assigneeId: mechanicId,
          completedAt: doneOn,
          odometerKm: odoAt(startOfDay(doneOn).getTime()),
          notes: 'All corners within limits on the test lane.',
        },
        opts,
      );
    }
    if (vi % 9 === 2 && !retired) {
      await Inspection.create(
        {
          vehicleId: v.id,
          dueDate: day(addDays(today, 5 + (vi % 20))),
          status: 'scheduled',
          reason: "Booked by hand with the vehicle's annual service.",
          trigger: 'manual',
          assigneeId: null,
          completedAt: null,
          odometerKm: null,
          notes: null,
        },
        opts,
      );
    }
  }
}
