import { SelectField, TextField } from '@/components/ui/field';
import type { FieldErrors } from '@/lib/form-errors';
import { FINDING_LABELS, VERDICT_LABELS, type WorkshopOptions } from '../api/types';

/** One corner's entries on the test lane, as the form keeps them (text as typed). */
export interface CornerDraft { position: string; axleIndex: number; adhesion: string; phase?: string; findings: string[]; verdict: string }

/** Corners the wear model flags (due for inspection or past their life): the mechanic must choose a verdict. */
export const flagged = (state: string | undefined) => state === 'due' || state === 'past_life';

/** The test-lane readings, findings and verdict of corner `i`; error keys are the server's paths. */
export function LaneCornerInputs({
  corner: c,
  i,
  flaggedByModel,
  options,
  errors,
  onChange,
}: {
  corner: CornerDraft;
  i: number;
  flaggedByModel: boolean;
  options: WorkshopOptions;
  errors: FieldErrors;
  onChange: (patch: Partial<CornerDraft>) => void;
}) {
  return (
    <fieldset className="rounded-md border border-line p-3">
      <legend className="px-1 font-semibold">Corner {c.position}</legend>
      <TextField
        label="Adhesion [%]"
        name={`corners.${i}.adhesionPct`}
        inputMode="decimal"
        aria-label={`Adhesion ${c.position} [%]`}
        value={c.adhesion}
        error={errors[`corners.${i}.adhesionPct`]}
        onChange={(e) => onChange({ adhesion: e.target.value })}
      />
      <TextField
        label="Minimum phase [°]"
        name={`corners.${i}.phaseDeg`}
        inputMode="decimal"
        aria-label={`Minimum phase ${c.position} [°]`}
        value={c.phase ?? ''}
        error={errors[`corners.${i}.phaseDeg`]}
        onChange={(e) => onChange({ phase: e.target.value })}
      />
      <div className="mt-2 grid gap-1">
        {options.findings.map((f) => (
          <label key={f} className="flex min-h-9 items-center gap-2 text-sm">
            <input
              type="checkbox"
              className="size-5"
              checked={c.findings.includes(f)}
              onChange={(e) => onChange({ findings: e.target.checked ? [...c.findings, f] : c.findings.filter((x) => x !== f) })}
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
        hint={flaggedByModel ? 'The wear model flags this corner: your verdict, no default.' : undefined}
        value={c.verdict}
        error={errors[`corners.${i}.verdict`]}
        onChange={(e) => onChange({ verdict: e.target.value })}
        options={[...(c.verdict ? [] : [{ value: '', label: 'Choose a verdict…' }]), ...options.verdicts.map((v) => ({ value: v, label: VERDICT_LABELS[v] ?? v }))]}
      />
    </fieldset>
  );
}
