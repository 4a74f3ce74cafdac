import type { Router } from 'express';
import type { Sequelize } from 'sequelize';
import type { Config } from '../config';
import { AppError } from '../errors';
import { allow, currentUser } from '../http/access';
import { idParam, parse } from '../http/validate';
import { inspectionService } from '../inspections/service';
import { CAUTION_TEXT } from '../mail/templates';
import { DAMPING_AT_END_OF_LIFE, DUTY_WINDOW_DAYS, estimatedDamping } from './wear';
import { wearReadRepository } from './read-repository';

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
        'Life used = wear km / median life in wear km. Wear km is each trip\'s distance weighted by its road severity (rod sliding distance per km, with a heat factor on very rough fast stretches) against the road the rated km is stated on (ISO 8608 class B at 80 km/h): severity 1 there, about 2 on class C, 4 on class D.',
        "The median life comes from the spec's life model: fitted to the fleet's own removals, starting from the trade's prior (the rated km on class B; 1.5× shorter per ISO class step, as makers' severe-service schedules commonly halve intervals). End-of-life dates come with a P10–P90 range from the fitted scatter.",
        `A damper is also at end of life ${deps.config.workshop.life.calendarYears} years after fitting, whatever its distance (common practice: 5–7 years).`,
        `Present damping is estimated as a linear fade from the nominal value to ${Math.round(DAMPING_AT_END_OF_LIFE * 100)} % at end of life (an assumption until a test-lane result is recorded).`,
        `Dates are a straight-line projection of the last ${DUTY_WINDOW_DAYS} days' wear.`,
        'Distance a damper ran before the trips on record is charged as opening wear at the rated road\'s rate, unless its own record is at least as long, then at its own recorded rate; the share is shown with its range and revised as the records grow.',
        'Spring fatigue uses an assumed S–N curve (not the spring maker\'s).',
      ],
      dampers: dampers.map((d) => {
        const rows = history.filter((h) => h.damper_id === d.id);
        const last = rows[rows.length - 1];
        const L = d.life_wear_km ?? null;
        const openingWear = L !== null && d.opening_share !== null ? d.opening_share * L : 0;
        const path: { day: string; lifeUsedFraction: number; low?: number; high?: number }[] = [];
        if (d.p_as_of) {
          path.push({ day: d.p_as_of, lifeUsedFraction: d.life_used_fraction });
          if (d.threshold_date && d.threshold_date > d.p_as_of) path.push({ day: d.threshold_date, lifeUsedFraction: th });
          if (d.end_of_life_date && d.end_of_life_date > d.p_as_of) path.push({ day: d.end_of_life_date, lifeUsedFraction: 1 });
        }
        const perKm = d.window_km && d.window_km > 0 && d.window_wear_km !== null ? d.window_wear_km / d.window_km : null;
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
          opening:
            d.opening_km === null || d.opening_share === null
              ? null
              : { km: d.opening_km, share: d.opening_share, shareLow: d.opening_share_low ?? d.opening_share, shareHigh: d.opening_share_high ?? d.opening_share, basis: d.opening_basis ?? '' },
          lastDutyDay: last?.day ?? null,
          prediction: d.p_as_of
            ? {
                asOf: d.p_as_of,
                windowDays: d.window_days,
                windowKm: d.window_km,
                windowWearKm: d.window_wear_km,
                kmPerDay: d.km_per_day,
                wearKmPerDay: d.wear_km_per_day,
                severity: perKm,
                lifeWearKm: L,
                lifeP10WearKm: d.life_p10_wear_km,
                lifeP90WearKm: d.life_p90_wear_km,
                /** Median life [km] at the damper's own recent road mix. */
                lifeKm: L !== null && perKm ? L / perKm : L,
                roadSensitivity: d.road_sensitivity,
                lifeSource: d.life_source,
                distanceLifeUsed: d.distance_life_used,
                calendarLifeUsed: d.calendar_life_used,
                thresholdFraction: d.threshold_fraction,
                scheduleQuantile: d.schedule_quantile,
                thresholdDate: d.threshold_date,
                endOfLifeDate: d.end_of_life_date,
                endOfLifeP10Date: d.end_of_life_p10_date,
                endOfLifeP90Date: d.end_of_life_p90_date,
                governedBy: d.governed_by,
                springRatePerDay: d.spring_rate_per_day,
                springThresholdDate: d.spring_threshold_date,
                basis: d.basis ? (JSON.parse(d.basis) as Record<string, string>) : null,
              }
            : null,
          path,
          history: rows.map((h) => {
            const u = L ? (h.cum_wear_km + openingWear) / L : 0;
            return { day: h.day, distanceKm: h.distance_km, wearKm: h.wear_km, severity: h.distance_km > 0 ? h.wear_km / h.distance_km : null, lifeUsedFraction: u, dampingNsPerM: estimatedDamping(d.nominal_damping, u), springDamage: h.cum_spring_damage };
          }),
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
        severity: x.severity,
        sharePct: totalEnergy > 0 ? (x.energy_j / totalEnergy) * 100 : 0,
        springDamage: x.spring_damage,
        avgWeightedAccel: x.avg_weighted_accel,
      })),
      nextInspection: next,
    });
  });
}
