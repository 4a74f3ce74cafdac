/**
 * What the duty of a vehicle's trips takes and gives (wear/duty.ts computes it): the vehicle's
 * axles, dampers, trips and routes in; one duty record per trip and corner and the wear added to
 * each damper out, with the stored row layout of a duty record.
 */
import { jsonRows } from '../db/json-rows';
import type { CornerParams } from '../physics/types';

export type Position = 'FL' | 'FR' | 'RL' | 'RR' | string;

/** One axle of the vehicle's spec. */
export interface AxleInput {
  axleIndex: number;
  /** Unladen corner parameters [kg, N/m, N·s/m]. */
  corner: CornerParams;
  /** Rated damper life [km] (the rated life energy is this distance on class B at 80 km/h). */
  ratedDamperLifeKm: number;
}

/** A damper fitted (or once fitted) at a position. */
export interface DamperSpan {
  id: number;
  position: Position;
  axleIndex: number;
  /** Installation day (YYYY-MM-DD). */
  installedAt: string;
  /** Removal day (YYYY-MM-DD), null while fitted. */
  removedAt: string | null;
}

/** A road segment as the job sees it. */
export interface SegmentInput {
  id: number;
  startM: number;
  endM: number;
  /** Speed on this stretch [km/h], null = the trip's mean speed. */
  speedKmh: number | null;
  /** Current roughness [m³], null = not rated. */
  gdN0: number | null;
  /** Measured profile behind the current roughness, when there is one. */
  profile: { surveyId: number; dxM: number; startM: number; elevationsM: Float64Array } | null;
}

export interface RouteInput {
  id: number;
  lengthM: number;
  segments: SegmentInput[];
}

export interface TripInput {
  id: number;
  routeId: number;
  driverId: number | null;
  /** Local day of the trip start (YYYY-MM-DD, in the app's time zone). */
  tripDate: string;
  durationS: number;
  distanceKm: number;
  meanSpeedKmh: number;
  payloadKg: number | null;
}

export interface VehicleWork {
  vehicleId: number;
  axles: AxleInput[];
  dampers: DamperSpan[];
  trips: TripInput[];
}

/** One trip × corner duty record (SI units), ready to store. */
export interface DutyRecord {
  tripId: number;
  vehicleId: number;
  damperId: number | null;
  routeId: number;
  driverId: number | null;
  position: Position;
  axleIndex: number;
  tripDate: string;
  distanceKm: number;
  durationS: number;
  sprungMassKg: number;
  energyJ: number;
  meanPowerW: number;
  rmsRelativeVelocity: number;
  rmsSuspensionTravel: number;
  rmsTireLoadRatio: number;
  rmsBodyAccel: number;
  rmsWeightedAccel: number;
  springDamage: number;
  /** Rod sliding distance over the trip [m] (life-law.ts). */
  slidingM: number;
  /** Road severity of the trip [1]: sliding per km × heat factor against the reference road (life-law.ts); unrated stretches count 1. */
  severity: number;
  segments: number;
  profiledSegments: number;
  unratedSegments: number;
}

/** Wear added to one damper by this batch. */
export interface WearDelta {
  damperId: number;
  energyJ: number;
  springDamage: number;
  /** Earliest trip day that touched it. */
  firstDay: string;
}

export interface VehicleDutyResult {
  duties: DutyRecord[];
  wear: WearDelta[];
  /** Per-trip problems (the trip is skipped, the rest goes on). */
  errors: { tripId: number; message: string }[];
  segments: number;
}

/** The columns of a stored duty record (table `trip_duties`), in {@link dutyRow} order. */
export const TRIP_DUTY_COLUMNS = [
  'trip_id', 'vehicle_id', 'damper_id', 'route_id', 'driver_id', 'position', 'axle_index', 'trip_date', 'distance_km', 'duration_s',
  'sprung_mass_kg', 'energy_j', 'mean_power_w', 'rms_relative_velocity', 'rms_suspension_travel', 'rms_tire_load_ratio', 'rms_body_accel',
  'rms_weighted_accel', 'spring_damage', 'segments', 'profiled_segments', 'unrated_segments', 'sliding_m', 'severity',
];

/** A duty record's values in {@link TRIP_DUTY_COLUMNS} order. */
export const dutyRow = (d: DutyRecord) => [
  d.tripId, d.vehicleId, d.damperId, d.routeId, d.driverId, d.position, d.axleIndex, d.tripDate, d.distanceKm, d.durationS,
  d.sprungMassKg, d.energyJ, d.meanPowerW, d.rmsRelativeVelocity, d.rmsSuspensionTravel, d.rmsTireLoadRatio, d.rmsBodyAccel,
  d.rmsWeightedAccel, d.springDamage, d.segments, d.profiledSegments, d.unratedSegments, d.slidingM, d.severity,
];

/**
 * A vehicle's duty as it travels to the database: the records already written as JSON rows
 * ({@link TRIP_DUTY_COLUMNS}), on the thread that computed them, so the job's thread only passes
 * the text on (no copy of every record between threads, no formatting on the job's thread).
 */
export interface PackedDutyResult extends Omit<VehicleDutyResult, 'duties'> {
  dutyRows: string;
  dutyCount: number;
}

export function packDuty(r: VehicleDutyResult): PackedDutyResult {
  return { dutyRows: jsonRows(r.duties.map(dutyRow)), dutyCount: r.duties.length, wear: r.wear, errors: r.errors, segments: r.segments };
}
