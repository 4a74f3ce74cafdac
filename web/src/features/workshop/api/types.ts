import { queryRoots } from '@/lib/query-keys';
import type { CornerState, LifeSource } from '@contracts/workshop';

export type { CornerState, LifeSource } from '@contracts/workshop';

export const LIFE_SOURCE_WORDS: Record<LifeSource, string> = {
  prior: "trade's prior",
  fleet: "fleet's removals",
  'test-lane': 'test lane (calibrated)',
};

export interface InspectionListItem {
  id: number;
  vehicle: { id: number; fleetNumber: string; plate: string };
  dueDate: string;
  daysLeft: number;
  status: 'scheduled' | 'due' | 'overdue' | 'done' | 'cancelled';
  reason: string;
  trigger: string | null;
  assignee: { id: number; name: string } | null;
  depot: { id: number; name: string; assignedDirectly: boolean };
  resultsRecorded: boolean;
  completedAt: string | null;
  corners: CornerState[];
}

export interface CornerResult {
  position: string;
  axleIndex: number;
  damperId: number | null;
  adhesionPct: number | null;
  /** Measured minimum phase angle [°] (phase-shift method). */
  phaseDeg: number | null;
  /** Which reading the measured damping came from. */
  estimateMethod: 'adhesion' | 'phase' | null;
  findings: string[];
  verdict: string;
  nominalNsPerM: number;
  predictedNsPerM: number | null;
  predictedBasis: string | null;
  measuredNsPerM: number | null;
  estimateNote: string | null;
}

export interface WorkRecord {
  id: number;
  vehicle: { id: number; fleetNumber: string; plate: string; depotName: string; specName: string };
  inspectionId: number | null;
  mechanic: { id: number; name: string } | null;
  performedAt: string;
  odometerKm: number;
  summary: string;
  partsCost: number | null;
  labourHours: number | null;
  notes: string | null;
  items: { position: string; axleIndex: number; component: string; partDescription: string; partNumber: string | null; cost: number | null; removalReason: string; removedDamperId: number | null; installedDamperId: number | null }[];
}

export interface InspectionDetail {
  id: number;
  vehicle: { id: number; fleetNumber: string; plate: string; odometerKm: number; status: string; vehicleClass: string | null };
  dueDate: string;
  status: InspectionListItem['status'];
  reason: string;
  trigger: string | null;
  assignee: { id: number; name: string } | null;
  depot: { id: number; name: string } | null;
  odometerKm: number | null;
  notes: string | null;
  /** Plate amplitude (zero-to-peak) the results were measured and inverted at [mm]. */
  plateAmplitudeMm: number;
  resultsAt: string | null;
  completedAt: string | null;
  /** The day the mechanic asked to check again (a corner given "check again soon"), or null. */
  followUpOn: string | null;
  predicted: CornerState[];
  results: CornerResult[];
  axleDifferences: { axleIndex: number; differencePoints: number | null; flagged: boolean; limitPoints: number }[];
  attachments: { id: number; kind: string; mimeType: string; sizeBytes: number; originalName: string; url: string }[];
  workRecords: WorkRecord[];
}

export interface WorkshopOptions {
  findings: string[];
  verdicts: string[];
  removalReasons: string[];
  laneFlagPoints: number;
  /** The test lane's plate amplitude setting (zero-to-peak) [mm]. */
  lanePlateAmplitudeMm: number;
  attachmentMaxBytes: number;
}

export const workshopKeys = {
  all: queryRoots.workshop,
  inspections: (q: Record<string, unknown>) => [...workshopKeys.all, 'inspections', q] as const,
  inspection: (id: number) => [...workshopKeys.all, 'inspection', id] as const,
  options: () => [...workshopKeys.all, 'options'] as const,
  vehicle: (id: number) => [...workshopKeys.all, 'vehicle', id] as const,
  workRecord: (id: number) => [...workshopKeys.all, 'work-record', id] as const,
  forecast: (days: number) => [...workshopKeys.all, 'forecast', days] as const,
  workload: (weeks: number) => [...workshopKeys.all, 'workload', weeks] as const,
  fleetLife: (specId: number) => [...workshopKeys.all, 'fleet-life', specId] as const,
  lifeBacktest: (specId: number) => [...workshopKeys.all, 'life-backtest', specId] as const,
  modelCheck: () => [...workshopKeys.all, 'model-check'] as const,
};

export const FINDING_LABELS: Record<string, string> = {
  oil_leak: 'Oil on the damper body (leak)',
  mount_loose_or_cracked: 'Mount loose or cracked',
  bush_worn: 'Bush worn or split',
  bump_stop_damaged: 'Bump stop damaged or missing',
  spring_cracked_or_sagging: 'Spring cracked or sagging',
  tyre_uneven_wear: 'Tyre wearing unevenly (cupping, scalloping)',
};

/** Commonly cited fail line of the phase-shift method (common practice; docs/methods.md "Phase-shift method"). */
export const PHASE_FAIL_BELOW_DEG = 35;

export const VERDICT_LABELS: Record<string, string> = { ok: 'Keep in service', monitor: 'Keep, check again soon', replace: 'Replace' };
