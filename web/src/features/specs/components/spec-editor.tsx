import { useCallback, useEffect, useState } from 'react';
import { CartesianGrid, Legend, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { z } from 'zod';
import { specBody } from '@contracts/specs';
import { Button } from '@/components/ui/button';
import { Caution } from '@/components/ui/caution';
import { SelectField, TextField } from '@/components/ui/field';
import { Section } from '@/components/ui/section';
import { StatusShape } from '@/components/ui/status-badge';
import { isApiError } from '@/lib/api-client';
import { sentence } from '@/lib/form-errors';
import { formatNumber } from '@/lib/format';
import type { SuspensionSpec } from '@/lib/suspension';
import { fromText, useSchemaForm } from '@/lib/use-schema-form';
import { useSaveSpec, useSpecPresets, useSpecPreview, type AxleForm, type CornerPreview, type SpecPresets } from '../api/spec-editor-api';

type FigureKey = keyof Omit<AxleForm, 'label'>;
/** An axle as the server's rules read it (the rated life may be left out there). */
type AxleInput = z.input<typeof specBody.shape.axles>[number];

/**
 * The corner's figures as the form shows them: spring and tyre rates in kN/m, as the spec list
 * shows them (`scale` converts to the N/m the server takes).
 */
const FIELDS: { key: FigureKey; label: string; unit: string; scale?: number; typicalKey?: string }[] = [
  { key: 'sprungMassKg', label: 'Sprung mass per corner', unit: 'kg', typicalKey: 'sprungMassKg' },
  { key: 'unsprungMassKg', label: 'Unsprung mass per corner', unit: 'kg', typicalKey: 'unsprungMassKg' },
  { key: 'springRateNPerM', label: 'Spring rate at the wheel', unit: 'kN/m', scale: 1000, typicalKey: 'springRateNPerM' },
  { key: 'dampingNsPerM', label: 'Damping at the wheel', unit: 'N·s/m', typicalKey: 'dampingNsPerM' },
  { key: 'tireRateNPerM', label: 'Tyre rate', unit: 'kN/m', scale: 1000, typicalKey: 'tireRateNPerM' },
  { key: 'ratedDamperLifeKm', label: 'Rated damper life', unit: 'km' },
];

const labels: Record<string, string> = {
  name: 'Name',
  vehicleClass: 'Vehicle class',
  description: 'Description',
  seatFactor: 'SEAT value',
  cabFactor: 'Cab suspension factor',
  label: 'Axle label',
  ...Object.fromEntries(FIELDS.map((f) => [f.key, f.label])),
};

/** A figure as typed: blank and anything that is not a number are named on the field. */
const figure = (label: string) => fromText(z.number({ message: 'must be a number' }), `${label} is required.`);

/** One axle as typed (the form's units), turned into the server's axle (SI units, an unnamed axle called "axle"). */
const axleFigures = z
  .object({ label: z.string(), ...(Object.fromEntries(FIELDS.map((f) => [f.key, figure(f.label)])) as Record<FigureKey, ReturnType<typeof figure>>) })
  .transform((a) => ({ label: a.label || 'axle', ...(Object.fromEntries(FIELDS.map((f) => [f.key, a[f.key] * (f.scale ?? 1)])) as Omit<AxleInput, 'label'>) }));

/** The server's spec rules (server/contracts/specs.ts) over the form's text fields. */
const specForm = z.object({
  name: specBody.shape.name,
  vehicleClass: specBody.shape.vehicleClass,
  description: specBody.shape.description,
  seatFactor: fromText(specBody.shape.seatFactor),
  cabFactor: fromText(specBody.shape.cabFactor),
  axles: z.array(axleFigures).pipe(specBody.shape.axles),
});

type Draft = { name: string; vehicleClass: string; description: string; seatFactor: string; cabFactor: string; axles: Record<string, string>[] };

const toDraftAxle = (a: AxleForm): Record<string, string> => ({
  label: a.label,
  ...Object.fromEntries(FIELDS.map((f) => [f.key, String(Math.round((a[f.key] / (f.scale ?? 1)) * 1e6) / 1e6)])),
});

function fromSpec(s: SuspensionSpec): Draft {
  return {
    name: s.name,
    vehicleClass: s.vehicleClass,
    description: s.description ?? '',
    seatFactor: s.seat?.seatFactor == null ? '' : String(s.seat.seatFactor),
    cabFactor: s.seat?.cabFactor == null ? '' : String(s.seat.cabFactor),
    axles: s.axles.map((a) => toDraftAxle({ label: a.label, ...a.corner, ratedDamperLifeKm: a.ratedDamperLifeKm })),
  };
}

function useDebounced<T>(value: T, ms: number): T {
  const [v, setV] = useState(value);
  useEffect(() => {
    const t = setTimeout(() => setV(value), ms);
    return () => clearTimeout(t);
  }, [value, ms]);
  return v;
}

/** Create or edit a spec; modes and the frequency response update as you type. */
export function SpecEditor({ spec, onSaved }: { spec: SuspensionSpec | null; onSaved: (id: number) => void }) {
  const presets = useSpecPresets();
  // each figure is checked as it is typed: the modes and Save follow the figures
  const form = useSchemaForm(specForm, labels, (spec ? fromSpec(spec) : { name: '', vehicleClass: 'light commercial', description: '', seatFactor: '', cabFactor: '', axles: [] }) as never, { mode: 'onChange' });
  const d = form.watch() as unknown as Draft;
  const draftAxles = d.axles ?? [];
  const vehicleClass = d.vehicleClass;
  const { reset, getValues } = form;
  /** Puts a preset's axles (and its vehicle class) in the form, checked afresh. */
  const startFrom = useCallback((vc: string, axles: AxleForm[]) => reset({ ...getValues(), vehicleClass: vc, axles: axles.map(toDraftAxle) } as never, { keepDefaultValues: true }), [reset, getValues]);
  useEffect(() => {
    if (!spec && draftAxles.length === 0 && presets.data) {
      const p = presets.data.presets.find((x) => x.vehicleClass === vehicleClass) ?? presets.data.presets[0];
      startFrom(vehicleClass, p.axles);
    }
  }, [spec, presets.data, draftAxles.length, vehicleClass, startFrom]);
  const typed = specForm.shape.axles.safeParse(draftAxles);
  const axles = typed.success ? typed.data : null;
  const body = useDebounced(axles && axles.length ? { vehicleClass, axles } : null, 250);
  const preview = useSpecPreview(body);
  const save = useSaveSpec(spec?.id ?? null);
  const previewFields = preview.error && isApiError(preview.error) ? preview.error.fields : {};
  /** The field's error: as typed or refused on saving (the form's), else what the preview's model refused. */
  const fieldError = (k: string) => form.errorOf(k as never) ?? (previewFields[k] ? sentence(labels[k.split('.').at(-1) ?? k], previewFields[k]) : undefined);
  const problems = typed.success ? 0 : new Set(typed.error.issues.map((i) => i.path.join('.'))).size;
  const saveBlocked = !axles ? `Save is off until every figure is a number: ${problems === 1 ? 'one field is' : `${problems} fields are`} marked in red.` : null;
  const previewBroken = Boolean(preview.error);
  const typical = presets.data?.typical[vehicleClass];

  const onSubmit = form.handleSubmit((v) =>
    save.mutate(
      { name: v.name, vehicleClass: v.vehicleClass, description: v.description || null, seatFactor: v.seatFactor ?? null, cabFactor: v.cabFactor ?? null, axles: v.axles },
      { onSuccess: (r) => onSaved(r.spec.id), onError: (err) => form.showServerErrors(err) },
    ),
  );

  return (
    <form className="flex flex-col gap-6" noValidate onSubmit={onSubmit}>
      <div className="grid gap-3 sm:grid-cols-3">
        <TextField label="Name" {...form.register('name')} error={fieldError('name')} />
        <SelectField label="Vehicle class" {...form.register('vehicleClass')} error={fieldError('vehicleClass')} options={(presets.data?.vehicleClasses ?? [vehicleClass]).map((c) => ({ value: c, label: c }))} />
        <TextField label="Description" aside="(optional)" {...form.register('description')} error={fieldError('description')} />
      </div>
      <div className="grid gap-3 sm:grid-cols-3">
        <TextField
          label="Seat SEAT value"
          aside={`(optional; empty = ${vehicleClass === 'heavy goods' ? '0.75, suspension seat' : '0.95, conventional seat'})`}
          inputMode="decimal"
          {...form.register('seatFactor')}
          error={fieldError('seatFactor')}
        />
        <TextField label="Cab suspension factor" aside="(optional, trucks; empty = none)" inputMode="decimal" {...form.register('cabFactor')} error={fieldError('cabFactor')} />
        <p className="text-sm text-slate sm:self-end">
          Drivers&apos; exposure is carried from the modelled floor to the seat by these factors (SEAT: conventional seats 0.8–1.1, suspension seats 0.6–0.9; Griffin 1990) and by
          √((1 + ρ)/2) for the two front wheel tracks, taken as correlated ρ = 0.5.
        </p>
      </div>
      {presets.data ? <PresetPicker presets={presets.data} onPick={(p) => startFrom(p.vehicleClass, p.axles)} /> : null}
      {draftAxles.map((a, i) => (
        <Section key={i} title={`Axle ${i + 1}: ${a.label || 'unnamed'}`} description="Per corner (one wheel station), at the wheel.">
          <div className="grid gap-4 xl:grid-cols-[minmax(0,1fr)_minmax(0,1.1fr)]">
            <div className="grid gap-3 sm:grid-cols-2">
              <TextField label="Axle label" {...form.register(`axles.${i}.label` as never)} error={fieldError(`axles.${i}.label`)} />
              {FIELDS.map((f) => {
                const r = f.typicalKey ? typical?.[f.typicalKey] : null;
                return (
                  <TextField
                    key={f.key}
                    label={`${f.label} [${f.unit}]`}
                    inputMode="decimal"
                    {...form.register(`axles.${i}.${f.key}` as never)}
                    hint={r ? `Typical ${formatNumber(r[0] / (f.scale ?? 1))}–${formatNumber(r[1] / (f.scale ?? 1))} ${f.unit}` : f.key === 'ratedDamperLifeKm' ? 'Common practice: 80 000–100 000 km for vans' : undefined}
                    error={fieldError(`axles.${i}.${f.key}`)}
                  />
                );
              })}
            </div>
            <CornerResult p={axles && !previewBroken ? preview.data?.axles[i] : undefined} stale={preview.isFetching} reason={!axles ? 'Fix the values marked in red to see this corner’s modes.' : previewBroken ? 'These values do not make a suspension the model can solve: see the fields marked in red.' : undefined} />
          </div>
        </Section>
      ))}
      {presets.data ? <p className="text-xs text-slate">Typical ranges: {presets.data.typicalSource}.</p> : null}
      <Caution>These figures describe the model, not the vehicle. Follow the vehicle and damper makers’ data and have suspensions checked by a qualified mechanic.</Caution>
      <div className="flex items-center gap-3">
        <Button type="submit" variant="primary" busy={save.isPending} disabled={!axles} aria-describedby={saveBlocked ? 'spec-save-blocked' : undefined}>
          {spec ? 'Save changes' : 'Create spec'}
        </Button>
        {saveBlocked ? (
          <p id="spec-save-blocked" className="text-sm text-slate">
            {saveBlocked}
          </p>
        ) : null}
        {save.error ? <p role="alert" className="text-sm text-overdue">{save.error.message}</p> : null}
        {save.isSuccess && !saveBlocked ? <p role="status" className="text-sm text-ok">Saved.</p> : null}
      </div>
    </form>
  );
}

function PresetPicker({ presets, onPick }: { presets: SpecPresets; onPick: (p: SpecPresets['presets'][number]) => void }) {
  return (
    <div className="flex flex-wrap items-center gap-2 text-sm">
      <span className="text-slate">Start from a preset:</span>
      {presets.presets.map((p) => (
        <Button key={p.key} size="sm" variant="secondary" onClick={() => onPick(p)} title={`Source: ${p.source}`}>
          {p.name}
        </Button>
      ))}
    </div>
  );
}

function CornerResult({ p, stale, reason }: { p: CornerPreview | undefined; stale: boolean; /** Why no figures show (blank rather than old ones). */ reason?: string }) {
  if (!p) return <p className="text-sm text-slate" data-testid="corner-modes-missing">{reason ?? 'Enter every value to see the corner’s modes.'}</p>;
  return (
    <div className={stale ? 'opacity-60' : undefined} data-testid="corner-modes">
      <dl className="grid grid-cols-2 gap-x-4 gap-y-1 text-sm sm:grid-cols-4">
        <div>
          <dt className="text-slate">Body bounce</dt>
          <dd className="tabular-nums font-medium" data-testid="body-hz">{formatNumber(p.modes.bodyHz, 2)} Hz</dd>
        </div>
        <div>
          <dt className="text-slate">Body damping ratio</dt>
          <dd className="tabular-nums font-medium" data-testid="body-zeta">{formatNumber(p.modes.bodyDampingRatio * 100, 0)} %</dd>
        </div>
        <div>
          <dt className="text-slate">Wheel hop</dt>
          <dd className="tabular-nums font-medium">{formatNumber(p.modes.wheelHz, 1)} Hz</dd>
        </div>
        <div>
          <dt className="text-slate">Wheel damping ratio</dt>
          <dd className="tabular-nums font-medium">{formatNumber(p.modes.wheelDampingRatio * 100, 0)} %</dd>
        </div>
      </dl>
      {p.hints.length ? (
        <ul className="mt-2 space-y-1 text-sm text-ink" aria-label="Outside the typical range">
          {p.hints.map((h) => (
            <li key={h} className="flex items-start gap-2">
              <StatusShape tone="watch" className="mt-1" />
              <span>{h}</span>
            </li>
          ))}
        </ul>
      ) : null}
      <figure className="mt-2" aria-label="Frequency response">
        <div className="h-56">
          <ResponsiveContainer>
            <LineChart data={p.response} margin={{ top: 6, right: 8, bottom: 18, left: 8 }}>
              <CartesianGrid stroke="#0001" />
              <XAxis dataKey="fHz" type="number" scale="log" domain={[0.3, 30]} ticks={[0.3, 1, 3, 10, 30]} label={{ value: 'frequency [Hz]', position: 'insideBottom', offset: -10, fontSize: 12 }} />
              <YAxis yAxisId="a" tickFormatter={(v: number) => formatNumber(v)} label={{ value: 'body accel. [(m/s²)/m]', angle: -90, position: 'insideLeft', fontSize: 11 }} />
              <YAxis yAxisId="t" orientation="right" tickFormatter={(v: number) => `${formatNumber(v / 1000)}k`} label={{ value: 'tyre load [N/m]', angle: 90, position: 'insideRight', fontSize: 11 }} />
              <Tooltip formatter={(v) => (typeof v === 'number' ? formatNumber(v, 0) : v)} labelFormatter={(v) => `${formatNumber(Number(v), 2)} Hz`} />
              <Legend verticalAlign="top" height={24} />
              <Line yAxisId="a" dataKey="bodyAccel" name="Body acceleration per m of road [(m/s²)/m]" stroke="#1f2a36" dot={false} isAnimationActive={false} />
              <Line yAxisId="t" dataKey="tireLoadN" name="Dynamic tyre load per m of road [N/m]" stroke="#b4531f" strokeDasharray="5 3" dot={false} isAnimationActive={false} />
            </LineChart>
          </ResponsiveContainer>
        </div>
      </figure>
    </div>
  );
}
