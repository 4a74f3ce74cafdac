import { PageHeader } from '@/components/ui/page-header';
import { useDepots } from '@/features/depots/api/get-depots';
import { useUsers } from '@/features/users/api/get-users';
import { PlanningSections } from '@/features/workshop/components/planning';
import { vehiclePath } from '../navigation';

/** The manager's workshop planning: assignments, workload per depot and week, 90-day forecast. */
export function PlanningPage() {
  const mechanics = useUsers({ role: 'mechanic', active: true, page: 1, pageSize: 200, sort: 'name' });
  const depots = useDepots();
  return (
    <>
      <title>Workshop planning · Reboundry</title>
      <PageHeader title="Workshop planning" description="Who inspects what, how busy each depot is, and the dampers and money the next 90 days will need." />
      <PlanningSections
        mechanics={(mechanics.data?.items ?? []).map((m) => ({ id: m.id, name: m.name, depotId: null }))}
        depots={(depots.data?.items ?? []).map((d) => ({ id: d.id, name: d.name }))}
        vehiclePath={vehiclePath}
      />
    </>
  );
}
