import { useSearchParams } from 'react-router';
import { PageHeader } from '@/components/ui/page-header';
import { FleetMap } from '@/features/map/components/fleet-map';
import { RideReportLayer } from '@/features/ride-reports/components/ride-report-layer';
import { SegmentSpeedAdvice } from '@/features/speed-advice/components/segment-speed-advice';
import { useQuery } from '@tanstack/react-query';
import { meQueryOptions } from '@/features/auth/api/get-me';

export function MapPage() {
  const segment = Number(useSearchParams()[0].get('segment')) || null;
  // Drivers' reports are the manager's to see
  const isManager = useQuery(meQueryOptions()).data?.role === 'manager';
  return (
    <>
      <title>Map · Reboundry</title>
      <PageHeader title="Road map" description="Every route segment coloured by its ISO 8608 roughness class. Click a segment for its IRI, source, date and speed." />
      <FleetMap initialSegment={segment} routePath={(id) => `/routes/${id}`} reportLayer={isManager ? <RideReportLayer /> : undefined} segmentExtra={(id) => <SegmentSpeedAdvice segmentId={id} />} />
    </>
  );
}
