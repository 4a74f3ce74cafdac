import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { SuspensionSpec } from '@/lib/suspension';
import type { AxleBody } from '@contracts/specs';
import { specKeys } from './spec-keys';

/** An axle as the spec endpoints take it (server/contracts/specs.ts). */
export type AxleForm = AxleBody;

export interface SpecPresets {
  presets: { key: string; name: string; vehicleClass: string; source: string; axles: AxleForm[] }[];
  typical: Record<string, Record<string, [number, number] | null>>;
  typicalSource: string;
  vehicleClasses: string[];
}

export interface CornerPreview {
  label: string;
  modes: { bodyHz: number; bodyDampingRatio: number; wheelHz: number; wheelDampingRatio: number };
  hints: string[];
  response: { fHz: number; bodyAccel: number; tireLoadN: number }[];
}

export function useSpecPresets() {
  return useQuery({ queryKey: [...specKeys.all, 'presets'], queryFn: ({ signal }) => api.get<SpecPresets>('/api/spec-presets', { signal }), staleTime: Infinity });
}

export function useSpec(id: number | null) {
  return useQuery({ queryKey: [...specKeys.all, 'detail', id], queryFn: ({ signal }) => api.get<{ spec: SuspensionSpec }>(`/api/specs/${id}`, { signal }), enabled: id !== null });
}

/** Modes and frequency response from the server's two-mass model, for the values being typed. */
export function useSpecPreview(body: { vehicleClass: string; axles: AxleForm[] } | null) {
  return useQuery({
    queryKey: [...specKeys.all, 'preview', body],
    queryFn: () => api.post<{ axles: CornerPreview[] }>('/api/specs/preview', body),
    enabled: body !== null,
    retry: false,
    placeholderData: (prev) => prev,
  });
}

export function useSaveSpec(id: number | null) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (b: { name: string; vehicleClass: string; description: string | null; seatFactor: number | null; cabFactor: number | null; axles: AxleForm[] }) =>
      id === null ? api.post<{ spec: SuspensionSpec }>('/api/specs', b) : api.put<{ spec: SuspensionSpec }>(`/api/specs/${id}`, b),
    onSuccess: () => void qc.invalidateQueries({ queryKey: specKeys.all }),
  });
}
