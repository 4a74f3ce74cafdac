import { useMemo, useState } from 'react';
import { useNavigate } from 'react-router';
import { SegmentLayer } from '@/components/map/segment-layer';
import { ButtonLink, Button } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { Section } from '@/components/ui/section';
import { useMapData } from '@/features/map/api/get-map-data';
import { RouteCreate } from '@/features/road-routes/components/route-create';
import { RouteDraw } from '@/features/road-routes/components/route-draw';
import { RoutesTable } from '@/features/road-routes/components/routes-table';
import { pages } from '../navigation';

export function RoutesPage() {
  const navigate = useNavigate();
  const [mode, setMode] = useState<'draw' | 'upload'>('draw');
  const map = useMapData();
  const segments = map.data?.segments;
  const center = useMemo<[number, number]>(() => {
    const depots = map.data?.depots ?? [];
    if (!depots.length) return [52.56, -1.4];
    return [depots.reduce((s, d) => s + d.lat, 0) / depots.length, depots.reduce((s, d) => s + d.lon, 0) / depots.length];
  }, [map.data]);
  const onCreated = (id: number) => void navigate(`/routes/${id}`);
  return (
    <>
      <title>Routes · Reboundry</title>
      <PageHeader
        title="Routes"
        description="The roads your fleet drives, and the roughest stretch of each."
        actions={<ButtonLink to={pages.segments.path}>All segments</ButtonLink>}
      />
      <RoutesTable />
      <Section
        title="Add a route"
        className="mt-8"
        actions={
          <div role="group" aria-label="How to add the route" className="flex gap-1 rounded-md border border-line bg-surface p-0.5">
            <Button size="sm" variant={mode === 'draw' ? 'secondary' : 'quiet'} aria-pressed={mode === 'draw'} onClick={() => setMode('draw')}>
              Draw on the map
            </Button>
            <Button size="sm" variant={mode === 'upload' ? 'secondary' : 'quiet'} aria-pressed={mode === 'upload'} onClick={() => setMode('upload')}>
              Upload a file
            </Button>
          </div>
        }
      >
        {mode === 'draw' ? (
          <RouteDraw
            onCreated={onCreated}
            center={center}
            backdrop={segments ? <SegmentLayer data={segments} weight={3} /> : null}
          />
        ) : (
          <RouteCreate onCreated={onCreated} />
        )}
      </Section>
    </>
  );
}
