import { StatusBadge, type StatusTone } from '@/components/ui/status-badge';
import type { VehicleStatus } from '../api/get-vehicles';

export const vehicleStatusLabels: Record<VehicleStatus, string> = {
  in_service: 'In service',
  workshop: 'In workshop',
  retired: 'Retired',
};

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
