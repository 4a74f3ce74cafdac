import { Caution } from '@/components/ui/caution';
import { Section } from '@/components/ui/section';
import type { InspectionDetail, WorkshopOptions } from '../api/types';
import { CornerChips } from './corner-chips';
import { ResultsTable } from './corner-results-table';
import { InspectionAttachments } from './inspection-attachments';
import { LaneResultsForm, useLaneResultsDraft } from './lane-results-form';
import { WorkRecordForm } from './work-record-form';

/**
 * An inspection as the mechanic records it: the predicted state of each corner, then (while it
 * is open) the test-lane results, the photos and printouts, the results recorded so far and the work done.
 */
export function InspectionRecord({ inspection, options, today, onWorkSaved }: { inspection: InspectionDetail; options: WorkshopOptions; today: string; onWorkSaved: (id: number) => void }) {
  const open = ['scheduled', 'due', 'overdue'].includes(inspection.status);
  // held here: saving the work record also forgets the test-lane draft
  const results = useLaneResultsDraft(inspection, options);

  return (
    <>
      <Caution className="mb-4">
        Predictions support, and never replace, the inspection by a qualified mechanic; follow the manufacturer&apos;s requirements and local regulations.
      </Caution>
      <Section title="Predicted state of each corner" description="From the wear model (or a km estimate before the first nightly run).">
        <CornerChips corners={inspection.predicted} />
      </Section>

      {open ? <LaneResultsForm inspection={inspection} options={options} today={today} draft={results} /> : null}

      <InspectionAttachments inspection={inspection} options={options} open={open} />

      {inspection.results.length ? <ResultsTable results={inspection.results} plateAmplitudeMm={inspection.plateAmplitudeMm} /> : null}

      {open ? (
        <WorkRecordForm
          inspection={inspection}
          options={options}
          today={today}
          onSaved={(id) => {
            results.clear();
            onWorkSaved(id);
          }}
        />
      ) : null}
    </>
  );
}
