import { useState } from 'react';
import { Caution } from '@/components/ui/caution';
import { Section } from '@/components/ui/section';
import { SentenceList } from '@/components/ui/sentence-list';
import { SimpleTable } from '@/components/ui/simple-table';
import { RoughnessClassBadge } from '@/components/ui/roughness';
import { QueryState } from '@/components/ui/query-state';
import { formatNumber } from '@/lib/format';
import { useSpeedAdvice, type SpeedAdvice, type SpeedAdviceParams } from '../api/get-speed-advice';
import { useSpecChoices } from '../api/get-specs-brief';
import { DutySpeedChart } from './duty-speed-chart';

/** Default damper multiple shown before the first answer (the server's default is the same). */
const DEFAULT_MULTIPLE = 16;

export interface AdviceChoices {
  comfort: string;
  damperMultiple: number;
  load: 'laden' | 'unladen';
  exposureHours: number;
  specId: number | undefined;
}

export function SpeedAdviceControls({ value, onChange, canPickSpec, bands }: { value: AdviceChoices; onChange: (v: AdviceChoices) => void; canPickSpec: boolean; bands: { key: string; label: string; range: string }[] }) {
  const specs = useSpecChoices(canPickSpec);
  const set = (patch: Partial<AdviceChoices>) => onChange({ ...value, ...patch });
  const field = 'h-10 rounded-md border border-line-strong bg-surface px-2';
  return (
    <div className="flex flex-wrap gap-3 text-sm">
      {canPickSpec ? (
        <label className="flex flex-col gap-1">
          <span className="font-medium text-ink">Suspension spec</span>
          <select className={field} value={value.specId ?? ''} onChange={(e) => set({ specId: e.target.value ? Number(e.target.value) : undefined })}>
            <option value="">First spec</option>
            {specs.data?.items.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </select>
        </label>
      ) : null}
      <label className="flex flex-col gap-1">
        <span className="font-medium text-ink">Ride limit at the seat</span>
        <select className={field} value={value.comfort} onChange={(e) => set({ comfort: e.target.value })}>
          {bands.map((b) => (
            <option key={b.key} value={b.key}>
              {b.label} ({b.range})
            </option>
          ))}
        </select>
      </label>
      {value.comfort === 'daily-exposure' ? (
        <label className="flex flex-col gap-1">
          <span className="font-medium text-ink">Hours a day at this level</span>
          <input className={`${field} w-24 text-right tabular-nums`} type="number" min={0.25} max={24} step={0.5} value={value.exposureHours} onChange={(e) => set({ exposureHours: Math.min(24, Math.max(0.25, Number(e.target.value) || 8)) })} />
        </label>
      ) : null}
      <label className="flex flex-col gap-1">
        <span className="font-medium text-ink">Load</span>
        <select className={field} value={value.load} onChange={(e) => set({ load: e.target.value === 'unladen' ? 'unladen' : 'laden' })}>
          <option value="laden">Laden (typical payload)</option>
          <option value="unladen">Unladen</option>
        </select>
      </label>
      <label className="flex flex-col gap-1">
        <span className="font-medium text-ink">Damper limit [× own class-B power]</span>
        <input className={`${field} w-28 text-right tabular-nums`} type="number" min={1} max={50} step={1} value={value.damperMultiple} onChange={(e) => set({ damperMultiple: Math.min(50, Math.max(1, Number(e.target.value) || DEFAULT_MULTIPLE)) })} />
      </label>
    </div>
  );
}

/** The assumptions behind the figures, as the server states them. */
export function AdviceAssumptions({ advice, className = '' }: { advice: SpeedAdvice; className?: string }) {
  return (
    <div className={`text-xs text-slate ${className}`} data-testid="speed-advice-assumptions">
      <p className="font-medium text-ink">Assumptions behind these figures</p>
      <SentenceList items={advice.assumptions} className="mt-1 list-disc pl-4" />
    </div>
  );
}

const advisedText = (r: SpeedAdvice['segments'][number]) => (r.belowMinimum ? 'Road needs attention' : r.advisedKmh === null ? '—' : String(r.advisedKmh));

/** Speed advice along a route: per segment, with the chart of duty against speed. */
export function RouteSpeedAdvice({ routeId, canPickSpec }: { routeId: number; canPickSpec: boolean }) {
  const [choices, setChoices] = useState<AdviceChoices>({ comfort: 'fairly', damperMultiple: DEFAULT_MULTIPLE, load: 'laden', exposureHours: 8, specId: undefined });
  const [segmentId, setSegmentId] = useState<number | undefined>(undefined);
  const params: SpeedAdviceParams = {
    comfort: choices.comfort,
    damperMultiple: choices.damperMultiple,
    load: choices.load,
    specId: choices.specId,
    segmentId,
    ...(choices.comfort === 'daily-exposure' ? { exposureHours: choices.exposureHours } : {}),
  };
  const q = useSpeedAdvice(routeId, params);
  return (
    <Section title="Speed advice" description="The highest speed at which the driver’s seat stays within the chosen ride limit and each damper within the chosen multiple of its own everyday duty.">
      <Caution title="Advice for planning">{q.data?.caution ?? 'Posted limits, the road and weather conditions, the load and the driver’s judgement always come first.'}</Caution>
      <QueryState query={q} loading="Working out speeds…" what="the speed advice">
        {(data) => (
          <div className="mt-3 flex flex-col gap-4">
            <SpeedAdviceControls value={choices} onChange={setChoices} canPickSpec={canPickSpec} bands={data.comfortBands} />
            <p className="text-sm text-ink">
              For <strong>{data.spec.name}</strong>, {data.load.case}: advised{' '}
              <strong className="tabular-nums">
                {data.summary.lowestKmh === null ? '—' : data.summary.lowestKmh === data.summary.highestKmh ? `${data.summary.lowestKmh} km/h` : `${data.summary.lowestKmh}–${data.summary.highestKmh} km/h`}
              </strong>
              ; {data.summary.segmentsBelowPosted} segment{data.summary.segmentsBelowPosted === 1 ? '' : 's'} advised below the speed normally driven
              {data.summary.segmentsNeedingAttention ? (
                <>
                  , <strong>{data.summary.segmentsNeedingAttention} where the road needs attention</strong> (no advice under {data.rangeKmh[0]} km/h: report the segment)
                </>
              ) : null}
              .
            </p>
            <DutySpeedChart advice={data} />
            <p className="-mt-2 text-xs text-slate">The chart shows a typical segment of this route (median roughness); pick a segment number in the table to chart it.</p>
            <SimpleTable
              label="Advised speed per segment"
              rows={data.segments}
              className="max-h-96 overflow-y-auto"
              columns={[
                { key: 'seq', header: 'Segment', rowHeader: true, cell: (r) => <button type="button" className="link" onClick={() => setSegmentId(r.id)} title="Show this segment in the chart">{r.seq + 1}</button> },
                { key: 'km', header: 'From', unit: 'km', numeric: true, cell: (r) => formatNumber(r.startM / 1000, 1) },
                { key: 'class', header: 'Class', cell: (r) => <RoughnessClassBadge value={r.isoClass} /> },
                { key: 'posted', header: 'Usual speed', unit: 'km/h', numeric: true, cell: (r) => formatNumber(r.postedKmh, 0) },
                { key: 'advised', header: 'Advised up to', unit: 'km/h', numeric: true, cell: advisedText },
                { key: 'by', header: 'Limited by', cell: (r) => (r.limitedBy === 'damper power' && r.powerAxle ? `damper power (${r.powerAxle})` : r.limitedBy) },
              ]}
            />
            {data.summary.segmentsNeedingAttention ? <p className="text-sm text-ink">{data.attention}</p> : null}
            <AdviceAssumptions advice={data} />
            <p className="text-xs text-slate">{data.method}</p>
          </div>
        )}
      </QueryState>
    </Section>
  );
}
