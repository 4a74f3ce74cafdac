import { Link } from 'react-router';
import { EmptyState } from '@/components/ui/empty-state';
import { ErrorState } from '@/components/ui/error-state';
import { LoadingState } from '@/components/ui/loading-state';
import { Section } from '@/components/ui/section';
import { formatNumber } from '@/lib/format';
import { useSpecs } from '../api/get-specs';
import { SpecCornerTable } from './spec-corner-table';

/** Every suspension spec with its corner parameters. */
export function SpecsList({ vehiclesPath, editPath }: { vehiclesPath: (specId: number) => string; editPath?: (specId: number) => string }) {
  const specs = useSpecs();
  if (specs.isPending) return <LoadingState label="Loading specs…" />;
  if (specs.error) return <ErrorState error={specs.error} what="the specs" onRetry={() => void specs.refetch()} />;
  if (specs.data.items.length === 0) {
    return (
      <EmptyState title="No suspension specs yet">
        A spec describes one vehicle type&rsquo;s suspension per axle. Add one before adding vehicles of that type.
      </EmptyState>
    );
  }
  return (
    <div>
      {specs.data.items.map((spec) => (
        <Section
          key={spec.id}
          title={spec.name}
          description={
            <>
              {spec.vehicleClass}
              {spec.description ? ` — ${spec.description}` : ''}
            </>
          }
          actions={
            <span className="flex gap-4">
              <Link to={vehiclesPath(spec.id)} className="link text-sm">
                {formatNumber(spec.vehicleCount)} {spec.vehicleCount === 1 ? 'vehicle' : 'vehicles'}
              </Link>
              {editPath ? (
                <Link to={editPath(spec.id)} className="link text-sm" aria-label={`Edit ${spec.name}`}>
                  Edit
                </Link>
              ) : null}
            </span>
          }
        >
          <SpecCornerTable axles={spec.axles} label={`${spec.name}: corner parameters per axle`} />
        </Section>
      ))}
    </div>
  );
}
