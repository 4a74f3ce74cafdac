import { useSearchParams } from 'react-router';
import { useSpecs } from '@/features/specs/api/get-specs';

/**
 * The suspension spec a damper-life page shows, kept in the address (`?specId=`) so the
 * damper-life page and its back-test open on the same spec and a link can be shared. The first
 * spec until one is chosen.
 */
export function useSpecChoice() {
  const specs = useSpecs();
  const [params, setParams] = useSearchParams();
  const asked = Number(params.get('specId'));
  const items = specs.data?.items ?? [];
  const specId = items.some((s) => s.id === asked) ? asked : (items[0]?.id ?? 0);
  const choose = (id: number) =>
    setParams(
      (p) => {
        const next = new URLSearchParams(p);
        next.set('specId', String(id));
        return next;
      },
      { replace: true },
    );
  return { specs, specId, choose };
}

/** The spec drop-down of the damper-life pages. */
export function SpecPicker({ specId, onChange }: { specId: number; onChange: (id: number) => void }) {
  const specs = useSpecs();
  return (
    <label className="text-sm">
      Spec{' '}
      <select className="min-h-9 rounded border border-line bg-surface px-2" value={specId} onChange={(e) => onChange(Number(e.target.value))}>
        {(specs.data?.items ?? []).map((s) => (
          <option key={s.id} value={s.id}>
            {s.name}
          </option>
        ))}
      </select>
    </label>
  );
}
