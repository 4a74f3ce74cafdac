import { useQuery } from '@tanstack/react-query';
import { PageHeader } from '@/components/ui/page-header';
import { meQueryOptions } from '@/features/auth/api/get-me';
import { DriverExposure } from '@/features/exposure/components/my-exposure';
import { ExposureOverview } from '@/features/exposure/components/exposure-overview';

/** Vibration exposure: the driver's own days, or every driver's for the manager. */
export function ExposurePage() {
  const me = useQuery(meQueryOptions());
  const manager = me.data?.role === 'manager';
  return (
    <>
      <title>Vibration exposure · Reboundry</title>
      <PageHeader
        title={manager ? 'Drivers’ vibration exposure' : 'My vibration exposure'}
        description={manager ? 'Daily A(8) per driver over the last 30 days against the action value (0.5 m/s²) and the limit value (1.15 m/s²).' : 'Your daily A(8) over the last 30 days against the action value (0.5 m/s²) and the limit value (1.15 m/s²).'}
      />
      {me.data ? manager ? <ExposureOverview /> : <DriverExposure /> : null}
    </>
  );
}
