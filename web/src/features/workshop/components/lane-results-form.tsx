import { useRef, useState } from 'react';
import { addDays, addYears, format, parseISO } from 'date-fns';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { Section } from '@/components/ui/section';
import { StatusBadge } from '@/components/ui/status-badge';
import { focusFirstError, serverPathErrors, type FieldErrors } from '@/lib/form-errors';
import { formatDate, formatNumber } from '@/lib/format';
import { useRecordResults, type ResultsInput } from '../api/record-results';
import { PHASE_FAIL_BELOW_DEG, type InspectionDetail, type WorkshopOptions } from '../api/types';
import { useDraft } from '../hooks/use-draft';
import { flagged, LaneCornerInputs, type CornerDraft } from './lane-corner-inputs';
import { DraftRestoredNotice, inputCls, isNumber, mm, NotSavedNotice, num } from './record-form-parts';

/** The verdict "keep, check again soon": it asks for a follow-up inspection. */
const CHECK_AGAIN = 'monitor';
type Corner = ResultsInput['corners'][number];
const dayAfter = (day: string, f: (d: Date) => Date) => format(f(parseISO(day)), 'yyyy-MM-dd');

interface ResultsDraft { corners: CornerDraft[]; odometer: string; notes: string; followUp?: string; amplitude: string }

/**
 * The test-lane form's entries, kept as a draft in the browser: the recorded results when there
 * are any, otherwise blank readings, "Keep in service" where the wear model does not flag the corner.
 */
export function useLaneResultsDraft(inspection: InspectionDetail, options: WorkshopOptions) {
  return useDraft<ResultsDraft>(`rb-draft:inspection:${inspection.id}:results`, () => ({
    corners: inspection.predicted.map((c) => {
      const r = inspection.results.find((x) => x.position === c.position);
      return { position: c.position, axleIndex: c.axleIndex, adhesion: r?.adhesionPct == null ? '' : String(r.adhesionPct), phase: r?.phaseDeg == null ? '' : String(r.phaseDeg), findings: r?.findings ?? [], verdict: r?.verdict ?? (flagged(c.state) ? '' : 'ok') };
    }),
    odometer: String(Math.round(inspection.odometerKm ?? inspection.vehicle.odometerKm)),
    notes: inspection.notes ?? '',
    followUp: inspection.followUpOn ?? '',
    amplitude: String(inspection.resultsAt ? inspection.plateAmplitudeMm : options.lanePlateAmplitudeMm),
  }));
}

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

/** The field a server path belongs to, by its label, so its message reads as a sentence. */
function cornerLabel(path: string, corners: { position: string }[]) {
  const m = /^corners\.(\d+)\.(adhesionPct|verdict|findings|position)/.exec(path);
  const pos = m ? corners[Number(m[1])]?.position : undefined;
  if (m && pos) return m[2] === 'adhesionPct' ? `Adhesion ${pos}` : m[2] === 'verdict' ? `Verdict ${pos}` : m[2] === 'findings' ? `Findings ${pos}` : `Corner ${pos}`;
  return ({ odometerKm: 'Odometer', notes: 'Notes' } as Record<string, string>)[path];
}

/** The test lane and visual check of an open inspection: readings per corner, odometer, notes, follow-up. */
export function LaneResultsForm({
  inspection,
  options,
  today,
  draft: results,
}: {
  inspection: InspectionDetail;
  options: WorkshopOptions;
  today: string;
  draft: ReturnType<typeof useLaneResultsDraft>;
}) {
  const save = useRecordResults(inspection.id);
  const [resultErrors, setResultErrors] = useState<FieldErrors>({});
  const [saved, setSaved] = useState<string | null>(null);
  const resultsForm = useRef<HTMLFormElement>(null);
  const diffs = differences(results.value.corners, options.laneFlagPoints);
  const setCorner = (i: number, patch: Partial<CornerDraft>) => results.setValue((v) => ({ ...v, corners: v.corners.map((c, k) => (k === i ? { ...c, ...patch } : c)) }));

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

  return (
    <Section title="Test lane and visual check">
      {results.restored ? <DraftRestoredNotice onDismiss={results.dismiss}>Your unsaved entries for this inspection were brought back.</DraftRestoredNotice> : null}
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
            <LaneCornerInputs
              key={c.position}
              corner={c}
              i={i}
              flaggedByModel={flagged(inspection.predicted[i]?.state)}
              options={options}
              errors={resultErrors}
              onChange={(patch) => setCorner(i, patch)}
            />
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
        <NotSavedNotice errors={resultErrors} failure={save.error as Error | null} />
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
  );
}
