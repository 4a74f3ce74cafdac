import { PageHeader } from '@/components/ui/page-header';
import { FleetMap } from '@/features/map/components/fleet-map';

export function MapPage() {
  return (
    <>
      <title>Map · Reboundry</title>
      <PageHeader title="Road map" description="Every route segment coloured by its ISO 8608 roughness class. Click a segment for its IRI, source, date and speed." />
      <FleetMap routePath={(id) => `/routes/${id}`} />
    </>
  );
}
