import { QueryTypes, type Sequelize } from 'sequelize';

/**
 * A damper's daily duty summed by hand from its stored trip duty rows, day by day in trip order,
 * with wear km Σ km·severity^b at road sensitivity `b`: what the wear phase should accumulate,
 * computed apart from its own SQL.
 */
export async function dailyDutyByHand(sequelize: Sequelize, damperId: number, b: number) {
  const trips = await sequelize.query<{ day: string; km: number; e: number; f: number; s: number }>(
    `SELECT trip_date AS day, distance_km AS km, energy_j AS e, spring_damage AS f, severity AS s FROM trip_duties WHERE damper_id = ? ORDER BY trip_date, trip_id`,
    { replacements: [damperId], type: QueryTypes.SELECT },
  );
  const byDay = new Map<string, { day: string; distanceKm: number; energyJ: number; springDamage: number; wearKm: number }>();
  for (const t of trips) {
    const d = byDay.get(t.day) ?? { day: t.day, distanceKm: 0, energyJ: 0, springDamage: 0, wearKm: 0 };
    d.distanceKm += t.km;
    d.energyJ += t.e;
    d.springDamage += t.f;
    d.wearKm += t.km * Math.pow(t.s, b);
    byDay.set(t.day, d);
  }
  return [...byDay.values()];
}
