/** What GET /api/vehicles/:id/wear answers, as the client reads it, and the figures a damper's prediction states. */
import type { LifeSource } from './workshop';

export type { LifeSource } from './workshop';

/**
 * The dates and rates a damper's latest prediction states: as the nightly job works them out
 * (server/wear/wear.ts) and as the wear page reads them back.
 */
export interface PredictionFigures {
  asOf: string;
  windowDays: number;
  windowKm: number;
  windowWearKm: number;
  /** Wear km per calendar day and km per day over the window. */
  wearKmPerDay: number;
  kmPerDay: number;
  /** Life used by the distance alone and by the calendar alone (life used is the larger). */
  distanceLifeUsed: number;
  calendarLifeUsed: number;
  thresholdFraction: number;
  /** Quantile of the life the inspection date is scheduled on (0.5 = median). */
  scheduleQuantile: number;
  thresholdDate: string | null;
  /** End of life at the median of the fitted scatter, and its P10–P90 range. */
  endOfLifeDate: string | null;
  endOfLifeP10Date: string | null;
  endOfLifeP90Date: string | null;
  /** Which limit sets the end of life. */
  governedBy: 'distance' | 'calendar';
  springRatePerDay: number;
  springThresholdDate: string | null;
}

/** What a prediction rests on, in words. */
export interface PredictionBasis {
  method: string;
  life: string;
  opening: string;
  calendar: string;
  damping: string;
  window: string;
}

export interface WearDay {
  day: string;
  distanceKm: number;
  /** The day's distance weighted by road severity: km on the rated road that did the same wear. */
  wearKm: number;
  /** Road severity of the day's driving [×]: 1 = ISO 8608 class B at 80 km/h; null on a day without distance. */
  severity: number | null;
  lifeUsedFraction: number;
  dampingNsPerM: number;
  springDamage: number;
}

/** A damper's latest prediction as the wear page reads it back. */
export interface WearPrediction extends PredictionFigures {
  /** Road severity of the window [×]: wear km per km; null without distance in the window. */
  severity: number | null;
  /** Median life and its P10–P90, in wear km (km on the rated road). */
  lifeWearKm: number | null;
  lifeP10WearKm: number | null;
  lifeP90WearKm: number | null;
  /** Median life [km] at the damper's own recent road mix. */
  lifeKm: number | null;
  roadSensitivity: number | null;
  lifeSource: LifeSource;
  basis: PredictionBasis | null;
}

export interface DamperWear {
  id: number;
  position: string;
  axleIndex: number;
  partNumber: string | null;
  installedAt: string;
  springDamage: number;
  lifeUsedFraction: number;
  nominalDampingNsPerM: number;
  dampingNsPerM: number;
  ratedDamperLifeKm: number;
  /** Opening wear: km before the trips on record, its share of life with a range, and on what basis; null until estimated. */
  opening: { km: number; share: number; shareLow: number; shareHigh: number; basis: string } | null;
  lastDutyDay: string | null;
  prediction: WearPrediction | null;
  path: { day: string; lifeUsedFraction: number }[];
  history: WearDay[];
}

export interface RouteDuty {
  routeId: number;
  routeName: string;
  axleIndex: number;
  trips: number;
  km: number;
  /** Mean road severity of the route's trips [×], weighted by distance. */
  severity: number;
  springDamage: number;
  avgWeightedAccel: number;
}

export interface VehicleWear {
  vehicleId: number;
  thresholdFraction: number;
  windowDays: number;
  caution: string;
  assumptions: string[];
  dampers: DamperWear[];
  dutyByRoute: RouteDuty[];
  nextInspection: { id: number; dueDate: string; status: string; trigger: string | null; reason: string; basis: Record<string, unknown> | null; assigneeName: string | null } | null;
}
