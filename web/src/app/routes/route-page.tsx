import { useParams } from 'react-router';
import { useQuery } from '@tanstack/react-query';
import { PageHeader } from '@/components/ui/page-header';
import { meQueryOptions } from '@/features/auth/api/get-me';
import { routeQueryOptions } from '@/features/road-routes/api/get-route';
import { RouteView } from '@/features/road-routes/components/route-view';
import { isoDate } from '@/lib/format';
import { RouteSpeedAdvice } from '@/features/speed-advice/components/route-speed-advice';
import { pages, vehiclePath } from '../navigation';

export function RoutePage() {
  const id = Number(useParams().routeId);
  const me = useQuery(meQueryOptions());
  const route = useQuery(routeQueryOptions(id));
  const name = route.data?.route.name ?? 'Route';
  // Mechanics and drivers read route pages; only managers see edit controls, trips and (drivers) no vehicle links.
  const role = me.data?.role;
  const isManager = role === 'manager';
  return (
    <>
      <title>{`${name} · Reboundry`}</title>
      <PageHeader title={name} eyebrow="Route" description={route.data?.route.description ?? undefined} back={isManager ? { to: pages.routes.path, label: 'Routes' } : { to: pages.map.path, label: 'Road map' }} />
      <RouteView routeId={id} canEdit={isManager} today={isoDate(new Date())} vehiclePath={role === 'driver' ? undefined : vehiclePath} tripsPath={isManager ? `/trips?routeId=${id}` : undefined} />
      <RouteSpeedAdvice routeId={id} canPickSpec={me.data?.role === 'manager'} />
    </>
  );
}
