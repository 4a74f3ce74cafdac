import type { Router } from 'express';
import type { Sequelize } from 'sequelize';
import type { Config } from '../config';
import { AppError } from '../errors';
import { allow, currentUser } from '../http/access';
import { idParam, parse } from '../http/validate';
import { inspectionService } from '../inspections/service';
import { CAUTION_TEXT } from '../mail/templates';
import { DAMPING_AT_END_OF_LIFE, DUTY_WINDOW_DAYS, formatKm } from './wear';
import { wearReadRepository } from './read-repository';
import { OPENING_MIN_RECORDED_KM } from './opening';

export function registerWearRoutes(r: Router, deps: { sequelize: Sequelize; config: Config }) {
  const repo = wearReadRepository(deps.sequelize);
  const inspections = inspectionService(deps.sequelize);

  r.get('/vehicles/:id/wear', allow('manager', 'mechanic', 'driver'), async (req, res) => {
    const { id } = parse(idParam, req.params, 'address');
    const vehicle = await repo.vehicle(id);
    if (!vehicle) throw AppError.notFound('Vehicle');
    const user = currentUser(req);
    if (user.role === 'driver' && vehicle.driver_id !== user.id) throw AppError.forbidden('Drivers can see only the vehicle assigned to them.');
    const dampers = await repo.fittedDampers(id);
    const ids = dampers.map((d) => d.id);
    const [history, byRoute, next] = await Promise.all([repo.history(ids), repo.dutyByRoute(ids), inspections.nextForVehicle(id)]);
    const th = deps.config.inspection.threshold;
    const totalEnergy = byRoute.reduce((s, x) => s + x.energy_j, 0);
    res.json({
      vehicleId: id,
      thresholdFraction: th,
      windowDays: DUTY_WINDOW_DAYS,
      caution: CAUTION_TEXT,
      assumptions: [
        `Consumed life = dissipated damper energy / life energy; the rated life energy is what the corner dissipates over its rated km on ISO 8608 class B road at 80 km/h.`,
        `Present damping is estimated as a linear fade from the nominal value to ${Math.round(DAMPING_AT_END_OF_LIFE * 100)} % at end of life (an assumption until a test-lane result is recorded).`,
        `Dates are a straight-line projection of the last ${DUTY_WINDOW_DAYS} days' duty.`,
        `Spring fatigue uses an assumed S–N curve (not the spring maker's).`,
        `Distance a damper ran before the trips on record (its odometer distance since fitting less those trips) is charged as opening wear: at its own recorded energy per km once it has ${formatKm(OPENING_MIN_RECORDED_KM)} of duty on record, otherwise at its spec's reference rate (class B at 80 km/h); estimated once, when the damper first enters the records (an assumption: its roads and loads before the records are taken to be like those since).`,
      ],
      dampers: dampers.map((d) => {
        const rows = history.filter((h) => h.damper_id === d.id);
        const last = rows[rows.length - 1];
        const path: { day: string; lifeUsedFraction: number }[] = [];
        if (d.p_as_of) {
          path.push({ day: d.p_as_of, lifeUsedFraction: d.life_used_fraction });
          if (d.threshold_date && d.threshold_date > d.p_as_of) path.push({ day: d.threshold_date, lifeUsedFraction: th });
          if (d.end_of_life_date && d.end_of_life_date > d.p_as_of) path.push({ day: d.end_of_life_date, lifeUsedFraction: 1 });
        }
        return {
          id: d.id,
          position: d.position,
          axleIndex: d.axle_index,
          partNumber: d.part_number,
          installedAt: d.installed_at,
          energyJ: d.energy_j,
          springDamage: d.fatigue_damage,
          lifeUsedFraction: d.life_used_fraction,
          nominalDampingNsPerM: d.nominal_damping,
          dampingNsPerM: d.damping_ns_per_m ?? d.nominal_damping,
          ratedDamperLifeKm: d.rated_damper_life_km,
          opening: d.opening_km === null ? null : { km: d.opening_km, energyJ: d.opening_energy_j ?? 0, basis: d.opening_basis ?? '' },
          lastDutyDay: last?.day ?? null,
          prediction: d.p_as_of
            ? {
                asOf: d.p_as_of,
                windowDays: d.window_days,
                windowKm: d.window_km,
                windowEnergyJ: d.window_energy_j,
                rateJPerDay: d.rate_j_per_day,
                lifeEnergyJ: d.life_energy_j,
                lifeSource: d.life_source,
                thresholdFraction: d.threshold_fraction,
                thresholdDate: d.threshold_date,
                endOfLifeDate: d.end_of_life_date,
                springRatePerDay: d.spring_rate_per_day,
                springThresholdDate: d.spring_threshold_date,
                basis: d.basis ? (JSON.parse(d.basis) as Record<string, string>) : null,
              }
            : null,
          path,
          history: rows.map((h) => ({ day: h.day, distanceKm: h.distance_km, energyJ: h.energy_j, cumEnergyJ: h.cum_energy_j, lifeUsedFraction: h.life_used_fraction, dampingNsPerM: h.damping_ns_per_m, springDamage: h.cum_spring_damage })),
        };
      }),
      dutyByRoute: byRoute.map((x) => ({
        routeId: x.route_id,
        routeName: x.route_name,
        axleIndex: x.axle_index,
        trips: Number(x.trips),
        km: x.km,
        energyJ: x.energy_j,
        energyJPerKm: x.km > 0 ? x.energy_j / x.km / 2 : 0,
        sharePct: totalEnergy > 0 ? (x.energy_j / totalEnergy) * 100 : 0,
        springDamage: x.spring_damage,
        avgWeightedAccel: x.avg_weighted_accel,
      })),
      nextInspection: next,
    });
  });
}
