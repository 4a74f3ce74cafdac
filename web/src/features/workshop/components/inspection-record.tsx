import { useRef, useState } from 'react';
import { addDays, addYears, format, parseISO } from 'date-fns';
import { Button } from '@/components/ui/button';
import { Caution } from '@/components/ui/caution';
import { SelectField, TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { Section } from '@/components/ui/section';
import { SimpleTable } from '@/components/ui/simple-table';
import { StatusBadge } from '@/components/ui/status-badge';
import { focusFirstError, serverPathErrors, type FieldErrors } from '@/lib/form-errors';
import { formatDate, formatNumber, isoDate } from '@/lib/format';
import { useRecordResults, type ResultsInput } from '../api/record-results';
import { useUploadAttachment } from '../api/upload-attachment';
import { useRecordWork, type WorkInput } from '../api/record-work';
import { FINDING_LABELS, PHASE_FAIL_BELOW_DEG, VERDICT_LABELS, type CornerResult, type InspectionDetail, type WorkshopOptions } from '../api/types';
import { useDraft } from '../hooks/use-draft';
import { CornerChips } from './corner-chips';

const inputCls = 'min-h-11 w-full rounded border border-line bg-surface px-3 text-base tabular focus-visible:outline-2 focus-visible:outline-accent';

interface CornerDraft { position: string; axleIndex: number; adhesion: string; phase?: string; findings: string[]; verdict: string }
interface PartDraft { position: string; damper: boolean; spring: boolean; partDescription: string; partNumber: string; cost: string; removalReason: string }

/** The verdict "keep, check again soon": it asks for a follow-up inspection. */
const CHECK_AGAIN = 'monitor';
type Corner = ResultsInput['corners'][number];
const dayAfter = (day: string, f: (d: Date) => Date) => format(f(parseISO(day)), 'yyyy-MM-dd');
/** Millimetres without a trailing .0 for whole values. */
const mm = (v: number) => formatNumber(v, Number.isInteger(v) ? 0 : 1);

const num = (s: string) => (s.trim() === '' ? null : Number(s.replace(',', '.')));
const isNumber = (s: string) => s.trim() !== '' && Number.isFinite(Number(s.replace(',', '.')));

/** Corners the wear model flags (due for inspection or past their life): the mechanic must choose a verdict. */
const flagged = (state: string | undefined) => state === 'due' || state === 'past_life';

/** Checks the test-lane form before sending, with the same limits as the server; keys are the server's paths. */
function checkResults(v: { corners: CornerDraft[]; odometer: string }): FieldErrors {
  const out: FieldErrors = {};
  v.corners.forEach((c, i) => {
    const a = num(c.adhesion);
    if (a !== null && !Number.isFinite(a)) out[`corners.${i}.adhesionPct`] = `Adhesion ${c.position} must be a number, 0–100 %.`;
    else if (a !== null && (a < 0 || a > 100)) out[`corners.${i}.adhesionPct`] = `Adhesion ${c.position} must be 0–100 %.`;
    if (!c.verdict) out[`corners.${i}.verdict`] = `Choose a verdict for ${c.position}: the wear model flags this corner, so there is no default.`;
  });
  if (!isNumber(v.odometer) || Number(v.odometer.replace(',', '.')) < 0) out.odometerKm = 'Odometer must be a number of km, 0 or more.';
  return out;
}

/** Left–right adhesion difference per axle from the form, flagged over the limit. */
function differences(corners: CornerDraft[], limit: number) {
  const axles = [...new Set(corners.map((c) => c.axleIndex))];
  return axles.map((a) => {
    const l = corners.find((c) => c.axleIndex === a && c.position.endsWith('L'));
    const r = corners.find((c) => c.axleIndex === a && c.position.endsWith('R'));
    const lv = l ? num(l.adhesion) : null;
    const rv = r ? num(r.adhesion) : null;
    const d = lv !== null && rv !== null && Number.isFinite(lv) && Number.isFinite(rv) ? Math.abs(lv - rv) : null;
    return { axleIndex: a, d, flagged: d !== null && d > limit };
  });
}

export function InspectionRecord({ inspection, options, today, onWorkSaved }: { inspection: InspectionDetail; options: WorkshopOptions; today: string; onWorkSaved: (id: number) => void }) {
  const open = ['scheduled', 'due', 'overdue'].includes(inspection.status);
  const results = useDraft<{ corners: CornerDraft[]; odometer: string; notes: string; followUp?: string; amplitude: string }>(`rb-draft:inspection:${inspection.id}:results`, () => ({
    corners: inspection.predicted.map((c) => {
      const r = inspection.results.find((x) => x.position === c.position);
      return { position: c.position, axleIndex: c.axleIndex, adhesion: r?.adhesionPct == null ? '' : String(r.adhesionPct), phase: r?.phaseDeg == null ? '' : String(r.phaseDeg), findings: r?.findings ?? [], verdict: r?.verdict ?? (flagged(c.state) ? '' : 'ok') };
    }),
    odometer: String(Math.round(inspection.odometerKm ?? inspection.vehicle.odometerKm)),
    notes: inspection.notes ?? '',
    followUp: inspection.followUpOn ?? '',
    amplitude: String(inspection.resultsAt ? inspection.plateAmplitudeMm : options.lanePlateAmplitudeMm),
  }));
  const work = useDraft<{ parts: PartDraft[]; summary: string; labour: string; odometer: string; date: string; notes: string }>(`rb-draft:inspection:${inspection.id}:work`, () => ({
    parts: inspection.predicted.map((c) => ({ position: c.position, damper: false, spring: false, partDescription: '', partNumber: '', cost: '', removalReason: options.removalReasons[0] })),
    summary: '',
    labour: '',
    odometer: String(Math.round(inspection.odometerKm ?? inspection.vehicle.odometerKm)),
    date: today,
    notes: '',
  }));
  const save = useRecordResults(inspection.id);
  const upload = useUploadAttachment(inspection.id);
  const recordWork = useRecordWork();
  const [uploadKind, setUploadKind] = useState<'photo' | 'printout'>('photo');
  const [resultErrors, setResultErrors] = useState<FieldErrors>({});
  const [workErrors, setWorkErrors] = useState<FieldErrors>({});
  const [saved, setSaved] = useState<string | null>(null);
  const resultsForm = useRef<HTMLFormElement>(null);
  const workForm = useRef<HTMLFormElement>(null);
  const diffs = differences(results.value.corners, options.laneFlagPoints);
  const setCorner = (i: number, patch: Partial<CornerDraft>) => results.setValue((v) => ({ ...v, corners: v.corners.map((c, k) => (k === i ? { ...c, ...patch } : c)) }));
  const setPart = (i: number, patch: Partial<PartDraft>) => work.setValue((v) => ({ ...v, parts: v.parts.map((c, k) => (k === i ? { ...c, ...patch } : c)) }));
  const cornerLabel = (path: string, corners: { position: string }[]) => {
    const m = /^corners\.(\d+)\.(adhesionPct|verdict|findings|position)/.exec(path);
    const pos = m ? corners[Number(m[1])]?.position : undefined;
    if (m && pos) return m[2] === 'adhesionPct' ? `Adhesion ${pos}` : m[2] === 'verdict' ? `Verdict ${pos}` : m[2] === 'findings' ? `Findings ${pos}` : `Corner ${pos}`;
    return ({ odometerKm: 'Odometer', notes: 'Notes' } as Record<string, string>)[path];
  };

  const checkAgain = results.value.corners.some((c) => c.verdict === CHECK_AGAIN);
  const submitResults = (complete: boolean) => {
    setSaved(null);
    const found = checkResults(results.value);
    setResultErrors(found);
    if (Object.keys(found).length) {
      focusFirstError(resultsForm.current, found);
      return;
    }
    const body: ResultsInput = {
      odometerKm: Number(results.value.odometer.replace(',', '.')),
      notes: results.value.notes.trim() || null,
      complete,
      followUpOn: checkAgain ? results.value.followUp || null : null,
      plateAmplitudeMm: num(results.value.amplitude ?? '') ?? undefined,
      // the draft holds what was picked as text; the contract's rules check it before it is sent
      corners: results.value.corners.map((c) => ({ position: c.position, adhesionPct: num(c.adhesion), phaseDeg: num(c.phase ?? ''), findings: c.findings as Corner['findings'], verdict: c.verdict as Corner['verdict'] })),
    };
    const corners = results.value.corners;
    save.mutate(body, {
      onSuccess: () => {
        results.clear();
        setSaved(complete ? 'Results saved and the inspection closed.' : `Results saved at ${new Date().toLocaleTimeString('en-GB', { hour: '2-digit', minute: '2-digit' })}.`);
      },
      onError: (err) => {
        const f = serverPathErrors(err, (path) => cornerLabel(path, corners));
        setResultErrors(f);
        focusFirstError(resultsForm.current, f);
      },
    });
  };

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
          results.clear();
          onWorkSaved(w.id);
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
    <>
      <Caution className="mb-4">
        Predictions support, and never replace, the inspection by a qualified mechanic; follow the manufacturer&apos;s requirements and local regulations.
      </Caution>
      <Section title="Predicted state of each corner" description="From the wear model (or a km estimate before the first nightly run).">
        <CornerChips corners={inspection.predicted} />
      </Section>

      {open ? (
        <Section title="Test lane and visual check">
          {results.restored ? (
            <Notice tone="info" title="Draft restored" className="mb-3">
              Your unsaved entries for this inspection were brought back. <button type="button" className="link" onClick={results.dismiss}>OK</button>
            </Notice>
          ) : null}
          <form
            ref={resultsForm}
            aria-label="Test-lane results"
            noValidate
            onSubmit={(e) => {
              e.preventDefault();
              submitResults(false);
            }}
          >
            <p className="mb-3 text-sm">
              Record the adhesion %, the minimum phase angle (phase-shift method: the least angle between plate movement and tyre force between the body and wheel-hop
              resonances; commonly read as a fail below {PHASE_FAIL_BELOW_DEG}°), or both. With both, the damping estimate uses the better-conditioned reading and says which.
            </p>
            {/heavy/i.test(inspection.vehicle.vehicleClass ?? '') ? (
              <Notice tone="info" title="A light-vehicle method" className="mb-3">
                The adhesion (EUSAMA) and phase-shift tests are made for light vehicles. This vehicle is {inspection.vehicle.vehicleClass}: treat the figures and the damping
                estimated from them with care, and follow the heavy-vehicle tester&apos;s own procedure.
              </Notice>
            ) : null}
            <label className="mb-3 block max-w-md text-sm font-medium">
              Plate amplitude of this lane [mm, zero-to-peak]
              <input
                className={inputCls}
                inputMode="decimal"
                aria-label="Plate amplitude [mm]"
                value={results.value.amplitude ?? ''}
                onChange={(e) => results.setValue((v) => ({ ...v, amplitude: e.target.value }))}
              />
              <span className="mt-1 block font-normal text-slate">
                Half the plate&apos;s stroke: a 6 mm stroke is a 3 mm amplitude (the lane&apos;s setting is {mm(options.lanePlateAmplitudeMm)} mm). Each adhesion is turned into a damping at this amplitude.
              </span>
            </label>
            {resultErrors.plateAmplitudeMm ? <p className="text-sm text-overdue">{resultErrors.plateAmplitudeMm}</p> : null}
            <div className="grid gap-3 md:grid-cols-2">
              {results.value.corners.map((c, i) => (
                <fieldset key={c.position} className="rounded-md border border-line p-3">
                  <legend className="px-1 font-semibold">Corner {c.position}</legend>
                  <TextField
                    label="Adhesion [%]"
                    name={`corners.${i}.adhesionPct`}
                    inputMode="decimal"
                    aria-label={`Adhesion ${c.position} [%]`}
                    value={c.adhesion}
                    error={resultErrors[`corners.${i}.adhesionPct`]}
                    onChange={(e) => setCorner(i, { adhesion: e.target.value })}
                  />
                  <TextField
                    label="Minimum phase [°]"
                    name={`corners.${i}.phaseDeg`}
                    inputMode="decimal"
                    aria-label={`Minimum phase ${c.position} [°]`}
                    value={c.phase ?? ''}
                    error={resultErrors[`corners.${i}.phaseDeg`]}
                    onChange={(e) => setCorner(i, { phase: e.target.value })}
                  />
                  <div className="mt-2 grid gap-1">
                    {options.findings.map((f) => (
                      <label key={f} className="flex min-h-9 items-center gap-2 text-sm">
                        <input
                          type="checkbox"
                          className="size-5"
                          checked={c.findings.includes(f)}
                          onChange={(e) => setCorner(i, { findings: e.target.checked ? [...c.findings, f] : c.findings.filter((x) => x !== f) })}
                        />
                        {FINDING_LABELS[f] ?? f}
                      </label>
                    ))}
                  </div>
                  <SelectField
                    className="mt-2"
                    label="Verdict"
                    name={`corners.${i}.verdict`}
                    aria-label={`Verdict ${c.position}`}
                    hint={flagged(inspection.predicted[i]?.state) ? 'The wear model flags this corner: your verdict, no default.' : undefined}
                    value={c.verdict}
                    error={resultErrors[`corners.${i}.verdict`]}
                    onChange={(e) => setCorner(i, { verdict: e.target.value })}
                    options={[...(c.verdict ? [] : [{ value: '', label: 'Choose a verdict…' }]), ...options.verdicts.map((v) => ({ value: v, label: VERDICT_LABELS[v] ?? v }))]}
                  />
                </fieldset>
              ))}
            </div>
            <ul className="mt-3 space-y-1" aria-label="Left–right difference per axle">
              {diffs.map((d) => (
                <li key={d.axleIndex} className="text-sm">
                  Axle {d.axleIndex + 1}: left–right difference {d.d === null ? '—' : `${formatNumber(d.d, 1)} points`}{' '}
                  {d.flagged ? <StatusBadge tone="overdue">large: over {options.laneFlagPoints} points</StatusBadge> : d.d !== null ? <StatusBadge tone="ok">within {options.laneFlagPoints} points</StatusBadge> : null}
                </li>
              ))}
            </ul>
            <div className="mt-3 grid gap-3 md:grid-cols-2">
              <TextField
                label="Odometer [km]"
                name="odometerKm"
                inputMode="numeric"
                value={results.value.odometer}
                error={resultErrors.odometerKm}
                onChange={(e) => results.setValue((v) => ({ ...v, odometer: e.target.value }))}
              />
              <label className="block text-sm font-medium">
                Notes
                <textarea name="notes" className={`${inputCls} min-h-20 py-2`} value={results.value.notes} onChange={(e) => results.setValue((v) => ({ ...v, notes: e.target.value }))} />
              </label>
            </div>
            {checkAgain ? (
              <div className="mt-3 max-w-md">
                <label className="block text-sm font-medium">
                  Check again by (optional)
                  <input
                    type="date"
                    className={inputCls}
                    aria-label="Check again by"
                    value={results.value.followUp ?? ''}
                    min={dayAfter(today, (d) => addDays(d, 1))}
                    max={dayAfter(today, (d) => addYears(d, 1))}
                    onChange={(e) => results.setValue((v) => ({ ...v, followUp: e.target.value }))}
                  />
                </label>
                <p className="text-sm text-slate">
                  A corner is to be checked again soon: the follow-up inspection is booked for this day (left empty: {formatDate(dayAfter(today, (d) => addDays(d, 30)))}).
                </p>
                {resultErrors.followUpOn ? <p className="text-sm text-overdue">{resultErrors.followUpOn}</p> : null}
              </div>
            ) : null}
            {inspection.followUpOn ? <p className="mt-2 text-sm">Follow-up set for {formatDate(inspection.followUpOn)}.</p> : null}
            {resultErrors.notes ? <p className="mt-1 text-sm text-overdue">{resultErrors.notes}</p> : null}
            {Object.keys(resultErrors).length ? (
              <Notice tone="error" className="mt-3" title="Not saved">
                {resultErrors._ ?? 'Check the fields marked in red, then save again.'}
              </Notice>
            ) : save.error ? (
              <Notice tone="error" className="mt-3" title="Not saved">
                {(save.error as Error).message}
              </Notice>
            ) : null}
            {saved ? (
              <Notice tone="ok" className="mt-3">
                {saved}
              </Notice>
            ) : null}
            <div className="mt-3 flex flex-wrap gap-2">
              <Button type="submit" variant="primary" size="lg" busy={save.isPending}>
                Save results
              </Button>
              <Button size="lg" onClick={() => submitResults(true)} disabled={save.isPending}>
                Save and close (no parts needed)
              </Button>
            </div>
          </form>
        </Section>
      ) : null}

      <Section title="Photos and test-lane printout" description={`JPEG, PNG or WebP photos; the printout as a PDF or an image; at most ${formatNumber(options.attachmentMaxBytes / 1024 / 1024)} MB each.`}>
        {open ? (
          <div className="flex flex-wrap items-end gap-3">
            <label className="text-sm font-medium">
              Kind
              <select className={inputCls} value={uploadKind} onChange={(e) => setUploadKind(e.target.value as 'photo' | 'printout')}>
                <option value="photo">Photo</option>
                <option value="printout">Test-lane printout</option>
              </select>
            </label>
            <label className="text-sm font-medium">
              File
              <input
                type="file"
                aria-label="Attach a file"
                accept="image/jpeg,image/png,image/webp,application/pdf"
                className="block min-h-11"
                onChange={(e) => {
                  const f = e.target.files?.[0];
                  if (f) upload.mutate({ file: f, kind: uploadKind });
                  e.target.value = '';
                }}
              />
            </label>
            {upload.isPending ? <span className="text-sm text-slate">Uploading…</span> : null}
          </div>
        ) : null}
        {upload.error ? <p role="alert" className="mt-2 text-sm text-overdue">{(upload.error as Error).message}</p> : null}
        <ul className="mt-3 flex flex-wrap gap-3" aria-label="Attachments">
          {inspection.attachments.map((a) => (
            <li key={a.id} className="rounded border border-line p-2 text-sm">
              {a.mimeType.startsWith('image/') ? <img src={a.url} alt={`${a.kind}: ${a.originalName}`} className="mb-1 h-24 w-32 object-cover" /> : null}
              <a className="link" href={a.url} target="_blank" rel="noreferrer">
                {a.kind === 'photo' ? 'Photo' : 'Printout'}: {a.originalName}
              </a>{' '}
              <span className="tabular text-slate">({formatNumber(a.sizeBytes / 1024, 1)} kB)</span>
            </li>
          ))}
          {!inspection.attachments.length ? <li className="text-sm text-slate">Nothing attached yet.</li> : null}
        </ul>
      </Section>

      {inspection.results.length ? <ResultsTable results={inspection.results} plateAmplitudeMm={inspection.plateAmplitudeMm} /> : null}

      {open ? (
        <Section title="Record work" description="Tick the parts you replaced. Saving retires the old dampers, fits the new ones and closes this inspection, all at once.">
          {work.restored ? (
            <Notice tone="info" title="Draft restored" className="mb-3">
              Your unsaved work record was brought back. <button type="button" className="link" onClick={work.dismiss}>OK</button>
            </Notice>
          ) : null}
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
            {Object.keys(workErrors).length ? (
              <Notice tone="error" className="mt-3" title="Not saved">
                {workErrors._ ?? 'Check the fields marked in red, then save again.'}
              </Notice>
            ) : recordWork.error ? (
              <Notice tone="error" className="mt-3" title="Not saved">
                {(recordWork.error as Error).message}
              </Notice>
            ) : null}
            <Button type="submit" variant="primary" size="lg" className="mt-3" busy={recordWork.isPending}>
              Save work record and close inspection
            </Button>
          </form>
        </Section>
      ) : null}
    </>
  );
}

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
