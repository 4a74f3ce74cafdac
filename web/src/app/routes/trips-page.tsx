import { PageHeader } from '@/components/ui/page-header';
import { Section } from '@/components/ui/section';
import { TripForm } from '@/features/trips/components/trip-form';
import { TripImport } from '@/features/trips/components/trip-import';
import { TripsTable } from '@/features/trips/components/trips-table';
import { vehiclePath } from '../navigation';

export function TripsPage() {
  return (
    <>
      <title>Trips · Reboundry</title>
      <PageHeader title="Trips" description="What each vehicle drove, where and how fast. Import telematics exports or enter a trip by hand." />
      <div className="flex flex-col gap-8">
        <Section title="Import a trip file" description="Checked row by row first; imported all at once or not at all.">
          <TripImport />
        </Section>
        <Section title="Enter a trip by hand">
          <TripForm />
        </Section>
        <TripsTable vehiclePath={vehiclePath} routePath={(id) => `/routes/${id}`} />
      </div>
    </>
  );
}
