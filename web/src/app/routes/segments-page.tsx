import { PageHeader } from '@/components/ui/page-header';
import { SegmentsTable } from '@/features/road-routes/components/segments-table';
import { useSegmentListParams } from '@/features/road-routes/hooks/use-segment-list-params';
import { pages } from '../navigation';

export function SegmentsPage() {
  const [params, update] = useSegmentListParams();
  return (
    <>
      <title>Segments · Reboundry</title>
      <PageHeader
        title="Segments"
        back={{ to: pages.routes.path, label: 'Routes' }}
        description="Every stretch of every route with its current roughness, where that value comes from, and the speed used for it."
      />
      <SegmentsTable params={params} onParamsChange={update} routePath={(id) => `/routes/${id}`} mapPath={(id) => `${pages.map.path}?segment=${id}`} />
    </>
  );
}
