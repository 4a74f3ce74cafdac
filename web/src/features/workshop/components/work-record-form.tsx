import { useRef, useState } from 'react';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { Section } from '@/components/ui/section';
import { focusFirstError, serverPathErrors, type FieldErrors } from '@/lib/form-errors';
import { isoDate } from '@/lib/format';
import { useRecordWork, type WorkInput } from '../api/record-work';
import type { InspectionDetail, WorkshopOptions } from '../api/types';
import { useDraft } from '../hooks/use-draft';
import { DraftRestoredNotice, inputCls, isNumber, NotSavedNotice } from './record-form-parts';

/** One corner's parts on the work form, as typed. */
interface PartDraft { position: string; damper: boolean; spring: boolean; partDescription: string; partNumber: string; cost: string; removalReason: string }

/**
 * The work done at an open inspection: the parts replaced per corner, summary, labour, odometer
 * and date. Saving retires the old dampers, fits the new ones and closes the inspection; `onSaved`
 * gets the new work record's id.
 */
export function WorkRecordForm({ inspection, options, today, onSaved }: { inspection: InspectionDetail; options: WorkshopOptions; today: string; onSaved: (workRecordId: number) => void }) {
  const work = useDraft<{ parts: PartDraft[]; summary: string; labour: string; odometer: string; date: string; notes: string }>(`rb-draft:inspection:${inspection.id}:work`, () => ({
    parts: inspection.predicted.map((c) => ({ position: c.position, damper: false, spring: false, partDescription: '', partNumber: '', cost: '', removalReason: options.removalReasons[0] })),
    summary: '',
    labour: '',
    odometer: String(Math.round(inspection.odometerKm ?? inspection.vehicle.odometerKm)),
    date: today,
    notes: '',
  }));
  const recordWork = useRecordWork();
  const [workErrors, setWorkErrors] = useState<FieldErrors>({});
  const workForm = useRef<HTMLFormElement>(null);
  const setPart = (i: number, patch: Partial<PartDraft>) => work.setValue((v) => ({ ...v, parts: v.parts.map((c, k) => (k === i ? { ...c, ...patch } : c)) }));

  const submitWork = () => {
    const items: WorkInput['items'] = [];
    // which corner each item came from, to put a server error on that corner's fields
    const itemCorner: string[] = [];
    const found: FieldErrors = {};
    for (const p of work.value.parts) {
      if ((p.damper || p.spring) && p.cost.trim() !== '' && (!isNumber(p.cost) || Number(p.cost.replace(',', '.')) < 0)) found[`cost.${p.position}`] = `Cost ${p.position} must be a number of £, 0 or more.`;
      for (const component of ['damper', 'spring'] as const) {
        if (!p[component]) continue;
        itemCorner.push(p.position);
        items.push({ position: p.position, component, partDescription: p.partDescription || `${component === 'damper' ? 'Damper' : 'Spring'}, ${p.position}`, partNumber: p.partNumber || null, cost: Number((p.cost || '0').replace(',', '.')), removalReason: p.removalReason });
      }
    }
    if (work.value.summary.trim().length < 3) found.summary = 'Summary must be at least 3 characters: say what was done.';
    if (work.value.labour.trim() !== '' && (!isNumber(work.value.labour) || Number(work.value.labour.replace(',', '.')) < 0)) found.labourHours = 'Labour must be a number of hours, 0 or more.';
    if (!isNumber(work.value.odometer) || Number(work.value.odometer.replace(',', '.')) < 0) found.odometerKm = 'Odometer must be a number of km, 0 or more.';
    setWorkErrors(found);
    if (Object.keys(found).length) {
      focusFirstError(workForm.current, found);
      return;
    }
    const itemField: Record<string, string> = { partDescription: 'partDescription', partNumber: 'partNumber', cost: 'cost', removalReason: 'removalReason' };
    const itemLabel: Record<string, string> = { partDescription: 'Part description', partNumber: 'Part number', cost: 'Cost', removalReason: 'Reason for removal' };
    recordWork.mutate(
      { vehicleId: inspection.vehicle.id, inspectionId: inspection.id, performedOn: work.value.date, odometerKm: Number(work.value.odometer.replace(',', '.')), summary: work.value.summary, labourHours: Number((work.value.labour || '0').replace(',', '.')), notes: work.value.notes || null, items },
      {
        onSuccess: (w) => {
          work.clear();
          onSaved(w.id);
        },
        onError: (err) => {
          // item errors go on the corner's field ("items.1.cost" → "cost.FR"), the rest on their own
          const raw = serverPathErrors(err, (path) => {
            const m = /^items\.(\d+)\.(\w+)/.exec(path);
            if (m) return itemCorner[Number(m[1])] && itemLabel[m[2]] ? `${itemLabel[m[2]]} ${itemCorner[Number(m[1])]}` : undefined;
            return ({ summary: 'Summary', labourHours: 'Labour', odometerKm: 'Odometer', performedOn: 'Date', notes: 'Notes' } as Record<string, string>)[path];
          });
          const f: FieldErrors = {};
          for (const [path, text] of Object.entries(raw)) {
            const m = /^items\.(\d+)\.(\w+)/.exec(path);
            f[m && itemField[m[2]] ? `${itemField[m[2]]}.${itemCorner[Number(m[1])]}` : path] = text;
          }
          setWorkErrors(f);
          focusFirstError(workForm.current, f);
        },
      },
    );
  };

  return (
    <Section title="Record work" description="Tick the parts you replaced. Saving retires the old dampers, fits the new ones and closes this inspection, all at once.">
      {work.restored ? <DraftRestoredNotice onDismiss={work.dismiss}>Your unsaved work record was brought back.</DraftRestoredNotice> : null}
      <form
        ref={workForm}
        aria-label="Work record"
        noValidate
        onSubmit={(e) => {
          e.preventDefault();
          submitWork();
        }}
      >
        <div className="grid gap-3 md:grid-cols-2">
          {work.value.parts.map((p, i) => (
            <fieldset key={p.position} className="rounded-md border border-line p-3">
              <legend className="px-1 font-semibold">Corner {p.position}</legend>
              <div className="flex gap-4">
                <label className="flex min-h-9 items-center gap-2 text-sm">
                  <input type="checkbox" className="size-5" aria-label={`Replace damper ${p.position}`} checked={p.damper} onChange={(e) => setPart(i, { damper: e.target.checked })} />
                  Damper replaced
                </label>
                <label className="flex min-h-9 items-center gap-2 text-sm">
                  <input type="checkbox" className="size-5" aria-label={`Replace spring ${p.position}`} checked={p.spring} onChange={(e) => setPart(i, { spring: e.target.checked })} />
                  Spring replaced
                </label>
              </div>
              {p.damper || p.spring ? (
                <div className="mt-2 grid gap-2">
                  <TextField label="Part description" name={`partDescription.${p.position}`} aria-label={`Part description ${p.position}`} value={p.partDescription} error={workErrors[`partDescription.${p.position}`]} onChange={(e) => setPart(i, { partDescription: e.target.value })} />
                  <TextField label="Part number" name={`partNumber.${p.position}`} aria-label={`Part number ${p.position}`} value={p.partNumber} error={workErrors[`partNumber.${p.position}`]} onChange={(e) => setPart(i, { partNumber: e.target.value })} />
                  <TextField label="Cost [£]" name={`cost.${p.position}`} inputMode="decimal" aria-label={`Cost ${p.position}`} value={p.cost} error={workErrors[`cost.${p.position}`]} onChange={(e) => setPart(i, { cost: e.target.value })} />
                  <label className="text-sm">
                    Reason for removal
                    <select className={inputCls} aria-label={`Removal reason ${p.position}`} value={p.removalReason} onChange={(e) => setPart(i, { removalReason: e.target.value })}>
                      {options.removalReasons.map((r) => (
                        <option key={r}>{r}</option>
                      ))}
                    </select>
                  </label>
                </div>
              ) : null}
            </fieldset>
          ))}
        </div>
        <div className="mt-3 grid gap-3 md:grid-cols-2">
          <TextField label="Summary" name="summary" aria-label="Work summary" value={work.value.summary} error={workErrors.summary} onChange={(e) => work.setValue((v) => ({ ...v, summary: e.target.value }))} />
          <TextField label="Labour [h]" name="labourHours" inputMode="decimal" value={work.value.labour} error={workErrors.labourHours} onChange={(e) => work.setValue((v) => ({ ...v, labour: e.target.value }))} />
          <TextField label="Odometer [km]" name="odometerKm" inputMode="numeric" aria-label="Work odometer [km]" value={work.value.odometer} error={workErrors.odometerKm} onChange={(e) => work.setValue((v) => ({ ...v, odometer: e.target.value }))} />
          <TextField label="Date" name="performedOn" type="date" value={work.value.date} max={isoDate(new Date())} error={workErrors.performedOn} onChange={(e) => work.setValue((v) => ({ ...v, date: e.target.value }))} />
        </div>
        <NotSavedNotice errors={workErrors} failure={recordWork.error as Error | null} />
        <Button type="submit" variant="primary" size="lg" className="mt-3" busy={recordWork.isPending}>
          Save work record and close inspection
        </Button>
      </form>
    </Section>
  );
}
