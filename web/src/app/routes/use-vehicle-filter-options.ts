import type { Option } from '@/components/ui/field';
import { useDepots } from '@/features/depots/api/get-depots';
import { useSpecs } from '@/features/specs/api/get-specs';

/** Depot and spec choices for the vehicles table's filters. */
export function useVehicleFilterOptions(): { depotOptions: Option[]; specOptions: Option[] } {
  const depots = useDepots();
  const specs = useSpecs();
  return {
    depotOptions: (depots.data?.items ?? []).map((d) => ({ value: String(d.id), label: d.name })),
    specOptions: (specs.data?.items ?? []).map((s) => ({ value: String(s.id), label: s.name })),
  };
}
