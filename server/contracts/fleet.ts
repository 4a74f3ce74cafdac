/** Request bodies of the fleet endpoints (depots, vehicles) and what they answer, shared with the client. */
import { z } from 'zod';
import { isoDay, noHiddenChars } from './common';

export const VEHICLE_STATUSES = ['in_service', 'workshop', 'retired'] as const;
export type VehicleStatus = (typeof VEHICLE_STATUSES)[number];

/** A vehicle's status in the app's words. */
export const VEHICLE_STATUS_WORDS: Record<VehicleStatus, string> = { in_service: 'In service', workshop: 'In workshop', retired: 'Retired' };

/** A vehicle in `GET /api/vehicles` (and the body of a saved vehicle). */
export interface VehicleListItem {
  id: number;
  fleetNumber: string;
  plate: string;
  status: VehicleStatus;
  odometerKm: number;
  specId: number;
  specName: string;
  depotId: number;
  depotName: string;
  driverId: number | null;
  driverName: string | null;
  /** The day it entered service (the interval rule counts from it until a first inspection), or null. */
  commissionedAt: string | null;
}

export const lat = z.number({ message: 'must be a number in degrees' }).min(-90, 'must be between −90° and 90°').max(90, 'must be between −90° and 90°');
export const lon = z.number({ message: 'must be a number in degrees' }).min(-180, 'must be between −180° and 180°').max(180, 'must be between −180° and 180°');
export const depotBody = z.object({ name: z.string({ message: 'is required' }).trim().min(2, 'must be at least 2 characters').max(120).refine(...noHiddenChars), address: z.string().trim().max(240).nullish(), lat, lon }).strict();

const positiveId = z.number({ message: 'must be an id' }).int().positive('must be an id');
const odometer = z.number({ message: 'must be a number in km' }).min(0, 'must be 0 km or more').max(5_000_000, 'must be at most 5 000 000 km');
export const fleetNumber = z.string({ message: 'is required' }).trim().min(1, 'is required').max(20, 'must be 20 characters or fewer').regex(/^[A-Za-z0-9-]+$/, 'may use letters, digits and -');
export const plate = z.string({ message: 'is required' }).trim().min(2, 'must be at least 2 characters').max(20, 'must be 20 characters or fewer').refine(...noHiddenChars);

export const vehicleBody = z
  .object({
    fleetNumber,
    plate,
    specId: positiveId,
    depotId: positiveId,
    driverId: positiveId.nullish(),
    odometerKm: odometer.default(0),
    commissionedAt: isoDay.nullish(),
  })
  .strict();
export const vehiclePatch = z
  .object({
    fleetNumber,
    plate,
    specId: positiveId,
    depotId: positiveId,
    driverId: positiveId.nullable(),
    odometerKm: odometer,
    status: z.enum(VEHICLE_STATUSES, { message: `must be one of ${VEHICLE_STATUSES.join(', ')}` }),
  })
  .partial()
  .strict()
  .refine((v) => Object.keys(v).length > 0, { message: 'give at least one field to change', path: ['_'] });
