import { Section } from '@/components/ui/section';
import { SimpleTable } from '@/components/ui/simple-table';
import { formatNumber } from '@/lib/format';
import { FINDING_LABELS, PHASE_FAIL_BELOW_DEG, VERDICT_LABELS, type CornerResult } from '../api/types';
import { mm } from './record-form-parts';

/** Predicted against measured damping per corner, with the engine's reason when there is no estimate. */
export function ResultsTable({ results, plateAmplitudeMm }: { results: CornerResult[]; plateAmplitudeMm: number }) {
  return (
    <Section
      title="Predicted and measured damping"
      description={`Measured = the damping that explains the adhesion on the two-mass model, at the lane's plate amplitude of ${mm(plateAmplitudeMm)} mm zero-to-peak (${mm(2 * plateAmplitudeMm)} mm stroke). A reading above what the nominal damping predicts reads as at least new.`}
    >
      <SimpleTable
        label="Predicted and measured damping"
        rows={results}
        getRowKey={(r) => r.position}
        columns={[
          { key: 'p', header: 'Corner', cell: (r) => r.position, rowHeader: true },
          { key: 'a', header: 'Adhesion', unit: '%', numeric: true, cell: (r) => formatNumber(r.adhesionPct, 1) },
          { key: 'ph', header: 'Min. phase', unit: '°', numeric: true, cell: (r) => (r.phaseDeg === null ? '' : `${formatNumber(r.phaseDeg, 1)}${r.phaseDeg < PHASE_FAIL_BELOW_DEG ? ' (fail)' : ''}`) },
          { key: 'pr', header: 'Predicted', unit: 'N·s/m', numeric: true, cell: (r) => formatNumber(r.predictedNsPerM) },
          { key: 'm', header: 'Measured', unit: 'N·s/m', numeric: true, cell: (r) => formatNumber(r.measuredNsPerM) },
          { key: 'from', header: 'Estimate from', cell: (r) => (r.estimateMethod === 'phase' ? 'phase shift' : r.estimateMethod === 'adhesion' ? 'adhesion' : '') },
          { key: 'n', header: 'Nominal', unit: 'N·s/m', numeric: true, cell: (r) => formatNumber(r.nominalNsPerM) },
          { key: 'v', header: 'Verdict', cell: (r) => VERDICT_LABELS[r.verdict] ?? r.verdict },
          { key: 'note', header: 'Note', cell: (r) => (r.findings.length ? r.findings.map((f) => FINDING_LABELS[f] ?? f).join('; ') : '') + (r.estimateNote ? ` ${r.estimateNote}` : '') },
        ]}
      />
    </Section>
  );
}
