import { StatusBadge, type StatusTone } from '@/components/ui/status-badge';
import { VEHICLE_STATUS_WORDS } from '@contracts/fleet';
import type { VehicleStatus } from '../api/get-vehicles';

/** A vehicle's status in the app's words (server/contracts/fleet.ts). */
export const vehicleStatusLabels = VEHICLE_STATUS_WORDS;

export const vehicleStatusTones: Record<VehicleStatus, StatusTone> = {
  in_service: 'ok',
  workshop: 'watch',
  retired: 'neutral',
};

export function VehicleStatusBadge({ status, size }: { status: VehicleStatus; size?: 'sm' | 'md' }) {
  return (
    <StatusBadge tone={vehicleStatusTones[status] ?? 'neutral'} size={size}>
      {vehicleStatusLabels[status] ?? status}
    </StatusBadge>
  );
}
