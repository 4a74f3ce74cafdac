import './work-record-print.css';
import { Button } from '@/components/ui/button';
import { Facts } from '@/components/ui/facts';
import { SimpleTable } from '@/components/ui/simple-table';
import { formatDate, formatDateTime, formatNumber } from '@/lib/format';
import { FINDING_LABELS, PHASE_FAIL_BELOW_DEG, VERDICT_LABELS, type InspectionDetail, type WorkRecord } from '../api/types';

const mm = (v: number) => formatNumber(v, Number.isInteger(v) ? 0 : 1);

interface WorkRecordSheetProps {
  record: WorkRecord;
  /** The inspection the work came from, when there is one and it has loaded. */
  inspection?: InspectionDetail | null;
  /** Why the inspection is not shown although the record names one. */
  inspectionProblem?: 'loading' | 'error' | null;
}

/**
 * A work record laid out to print: the work, then the inspection behind it — its test-lane
 * results per corner at the lane's plate amplitude, the findings and verdicts, and its photos —
 * so the paper copy carries the evidence for the parts replaced.
 */
export function WorkRecordSheet({ record, inspection = null, inspectionProblem = null }: WorkRecordSheetProps) {
  return (
    <article className="print-sheet" aria-label={`Work record ${record.id}`}>
      <div className="mb-4 flex items-start justify-between gap-3">
        <div>
          <h1 className="text-2xl font-semibold">Work record {record.id}</h1>
          <p className="text-slate">
            {record.vehicle.fleetNumber} · {record.vehicle.plate} · {record.vehicle.specName} · {record.vehicle.depotName}
          </p>
        </div>
        <Button className="no-print" onClick={() => window.print()}>
          Print
        </Button>
      </div>
      <Facts
        items={[
          { label: 'Date', value: formatDate(record.performedAt) },
          { label: 'Odometer [km]', value: formatNumber(record.odometerKm), numeric: true },
          { label: 'Mechanic', value: record.mechanic?.name ?? '—' },
          { label: 'Labour [h]', value: formatNumber(record.labourHours, 1), numeric: true },
          { label: 'Parts [£]', value: formatNumber(record.partsCost, 2), numeric: true },
          { label: 'Inspection', value: record.inspectionId ? `#${record.inspectionId}` : '—' },
        ]}
      />
      <p className="my-3">{record.summary}</p>
      <SimpleTable
        label="Parts replaced"
        rows={record.items}
        getRowKey={(i) => `${i.position}-${i.component}`}
        columns={[
          { key: 'p', header: 'Corner', cell: (i) => i.position, rowHeader: true },
          { key: 'c', header: 'Part', cell: (i) => i.component },
          { key: 'd', header: 'Description', cell: (i) => i.partDescription },
          { key: 'n', header: 'Part number', cell: (i) => i.partNumber ?? '—' },
          { key: 'r', header: 'Removed because', cell: (i) => i.removalReason },
          { key: 'cost', header: 'Cost', unit: '£', numeric: true, cell: (i) => formatNumber(i.cost, 2) },
        ]}
      />
      {record.notes ? <p className="mt-3 text-sm">{record.notes}</p> : null}

      {record.inspectionId ? (
        inspection ? (
          <InspectionEvidence inspection={inspection} />
        ) : (
          <p className="mt-6 text-sm text-slate">
            {inspectionProblem === 'error'
              ? `The results of inspection #${record.inspectionId} could not be loaded; open the inspection to see them.`
              : `Loading the results of inspection #${record.inspectionId}…`}
          </p>
        )
      ) : null}

      <p className="mt-6 text-sm text-slate">Signed (mechanic): ______________________ Date: ____________</p>
    </article>
  );
}

/** The inspection's test-lane readings, findings and verdicts per corner, and its photos. */
function InspectionEvidence({ inspection }: { inspection: InspectionDetail }) {
  const photos = inspection.attachments.filter((a) => a.mimeType.startsWith('image/'));
  const others = inspection.attachments.filter((a) => !a.mimeType.startsWith('image/'));
  const usesPhase = inspection.results.some((r) => r.phaseDeg !== null);
  const usesAdhesion = inspection.results.some((r) => r.adhesionPct !== null);
  return (
    <section aria-labelledby="sheet-inspection" className="mt-6 break-inside-avoid-page">
      <h2 id="sheet-inspection" className="text-lg font-semibold">
        Inspection #{inspection.id}
      </h2>
      <p className="text-sm text-slate">
        {inspection.reason}
        {inspection.resultsAt ? ` Results recorded ${formatDateTime(inspection.resultsAt)}` : ''}
        {inspection.assignee ? ` by ${inspection.assignee.name}` : ''}
        {inspection.odometerKm !== null ? `, odometer ${formatNumber(inspection.odometerKm)} km` : ''}.
      </p>
      {inspection.results.length ? (
        <>
          <p className="mt-2 text-sm">
            Test lane at a plate amplitude of {mm(inspection.plateAmplitudeMm)} mm zero-to-peak ({mm(2 * inspection.plateAmplitudeMm)} mm stroke).
            {usesPhase ? ` Minimum phase is commonly read as a fail below ${PHASE_FAIL_BELOW_DEG}°.` : ''}
          </p>
          <SimpleTable
            label="Test-lane results and findings"
            rows={inspection.results}
            getRowKey={(r) => r.position}
            columns={[
              { key: 'p', header: 'Corner', cell: (r) => r.position, rowHeader: true },
              ...(usesAdhesion ? [{ key: 'a', header: 'Adhesion', unit: '%', numeric: true, cell: (r: InspectionDetail['results'][number]) => formatNumber(r.adhesionPct, 1) }] : []),
              ...(usesPhase
                ? [{ key: 'ph', header: 'Min. phase', unit: '°', numeric: true, cell: (r: InspectionDetail['results'][number]) => (r.phaseDeg === null ? '—' : `${formatNumber(r.phaseDeg, 1)}${r.phaseDeg < PHASE_FAIL_BELOW_DEG ? ' (fail)' : ''}`) }]
                : []),
              { key: 'm', header: 'Measured damping', unit: 'N·s/m', numeric: true, cell: (r) => formatNumber(r.measuredNsPerM) },
              { key: 'n', header: 'Nominal', unit: 'N·s/m', numeric: true, cell: (r) => formatNumber(r.nominalNsPerM) },
              { key: 'f', header: 'Findings', cell: (r) => (r.findings.length ? r.findings.map((f) => FINDING_LABELS[f] ?? f).join('; ') : 'none') },
              { key: 'v', header: 'Verdict', cell: (r) => VERDICT_LABELS[r.verdict] ?? r.verdict },
            ]}
          />
          {inspection.axleDifferences.some((d) => d.differencePoints !== null) ? (
            <ul className="mt-2 text-sm" aria-label="Left–right difference per axle">
              {inspection.axleDifferences
                .filter((d) => d.differencePoints !== null)
                .map((d) => (
                  <li key={d.axleIndex}>
                    Axle {d.axleIndex + 1}: left–right adhesion difference {formatNumber(d.differencePoints, 1)} points
                    {d.flagged ? ` — large (over ${d.limitPoints} points)` : ` (within ${d.limitPoints} points)`}
                  </li>
                ))}
            </ul>
          ) : null}
        </>
      ) : (
        <p className="mt-2 text-sm">No test-lane results were recorded on this inspection.</p>
      )}
      {inspection.notes ? <p className="mt-2 text-sm">Inspection notes: {inspection.notes}</p> : null}
      {photos.length ? (
        <>
          <h3 className="mt-4 font-semibold">Photos</h3>
          <ul className="mt-1 flex flex-wrap gap-3" aria-label="Inspection photos">
            {photos.map((a) => (
              <li key={a.id} className="break-inside-avoid text-xs text-slate">
                <img src={a.url} alt={`Photo from inspection #${inspection.id}: ${a.originalName}`} className="h-40 max-w-56 rounded border border-line object-contain" />
                <span className="mt-0.5 block">{a.originalName}</span>
              </li>
            ))}
          </ul>
        </>
      ) : null}
      {others.length ? <p className="mt-2 text-sm">Also attached: {others.map((a) => a.originalName).join(', ')}.</p> : null}
    </section>
  );
}
