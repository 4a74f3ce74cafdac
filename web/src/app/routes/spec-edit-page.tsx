import { useNavigate, useParams } from 'react-router';
import { ErrorState } from '@/components/ui/error-state';
import { LoadingState } from '@/components/ui/loading-state';
import { PageHeader } from '@/components/ui/page-header';
import { useSpec } from '@/features/specs/api/spec-editor-api';
import { SpecEditor } from '@/features/specs/components/spec-editor';
import { pages } from '../navigation';

export function SpecEditPage() {
  const param = useParams().specId;
  const id = param ? Number(param) : null;
  const spec = useSpec(id);
  const navigate = useNavigate();
  const title = id === null ? 'New suspension spec' : `Edit ${spec.data?.spec.name ?? 'spec'}`;
  return (
    <>
      <title>{`${title} · Reboundry`}</title>
      <PageHeader title={title} back={{ to: pages.specs.path, label: 'Suspension specs' }} description="Per-corner quarter-car parameters. Body bounce, wheel hop and damping ratio update as you type, computed by the server’s two-mass model." />
      {id !== null && spec.isPending ? <LoadingState label="Loading the spec…" /> : id !== null && spec.error ? <ErrorState error={spec.error} what="the spec" /> : <SpecEditor key={id ?? 'new'} spec={spec.data?.spec ?? null} onSaved={(sid) => void navigate(`/specs/${sid}/edit`, { replace: true })} />}
    </>
  );
}
