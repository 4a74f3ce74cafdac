import { useState } from 'react';
import { Caution } from '@/components/ui/caution';
import { ErrorState } from '@/components/ui/error-state';
import { LoadingState } from '@/components/ui/loading-state';
import { Section } from '@/components/ui/section';
import { SimpleTable } from '@/components/ui/simple-table';
import { RoughnessClassBadge } from '@/components/ui/roughness';
import { formatNumber } from '@/lib/format';
import { useSpeedAdvice } from '../api/get-speed-advice';
import { useSpecChoices } from '../api/get-specs-brief';
import { DutySpeedChart } from './duty-speed-chart';

export function SpeedAdviceControls({
  comfort,
  setComfort,
  powerLimitW,
  setPowerLimitW,
  specId,
  setSpecId,
  canPickSpec,
  bands,
}: {
  comfort: string;
  setComfort: (v: string) => void;
  powerLimitW: number;
  setPowerLimitW: (v: number) => void;
  specId: number | undefined;
  setSpecId: (v: number | undefined) => void;
  canPickSpec: boolean;
  bands: { key: string; label: string; range: string }[];
}) {
  const specs = useSpecChoices(canPickSpec);
  return (
    <div className="flex flex-wrap gap-3 text-sm">
      {canPickSpec ? (
        <label className="flex flex-col gap-1">
          <span className="font-medium text-ink">Suspension spec</span>
          <select className="h-10 rounded-md border border-line-strong bg-surface px-2" value={specId ?? ''} onChange={(e) => setSpecId(e.target.value ? Number(e.target.value) : undefined)}>
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
        <span className="font-medium text-ink">Comfort band (ISO 2631-1)</span>
        <select className="h-10 rounded-md border border-line-strong bg-surface px-2" value={comfort} onChange={(e) => setComfort(e.target.value)}>
          {bands.map((b) => (
            <option key={b.key} value={b.key}>
              {b.label} ({b.range})
            </option>
          ))}
        </select>
      </label>
      <label className="flex flex-col gap-1">
        <span className="font-medium text-ink">Damper power limit [W]</span>
        <input className="h-10 w-28 rounded-md border border-line-strong bg-surface px-2 text-right tabular-nums" type="number" min={5} max={5000} step={10} value={powerLimitW} onChange={(e) => setPowerLimitW(Math.max(5, Number(e.target.value) || 5))} />
      </label>
    </div>
  );
}

/** Speed advice along a route: per segment, with the chart of duty against speed. */
export function RouteSpeedAdvice({ routeId, canPickSpec }: { routeId: number; canPickSpec: boolean }) {
  const [comfort, setComfort] = useState('fairly');
  const [powerLimitW, setPowerLimitW] = useState(150);
  const [specId, setSpecId] = useState<number | undefined>(undefined);
  const [segmentId, setSegmentId] = useState<number | undefined>(undefined);
  const q = useSpeedAdvice(routeId, { comfort, powerLimitW, specId, segmentId });
  return (
    <Section title="Speed advice" description="The highest speed at which the ride stays within the chosen comfort band and each damper within the chosen power.">
      <Caution title="Advice for planning">{q.data?.caution ?? 'Posted limits, the road and weather conditions, the load and the driver’s judgement always come first.'}</Caution>
      {q.isPending ? (
        <LoadingState label="Working out speeds…" />
      ) : q.error ? (
        <ErrorState error={q.error} what="the speed advice" />
      ) : (
        <div className="mt-3 flex flex-col gap-4">
          <SpeedAdviceControls comfort={comfort} setComfort={setComfort} powerLimitW={powerLimitW} setPowerLimitW={setPowerLimitW} specId={specId} setSpecId={setSpecId} canPickSpec={canPickSpec} bands={q.data.comfortBands} />
          <p className="text-sm text-ink">
            For <strong>{q.data.spec.name}</strong>: lowest advised speed on this route{' '}
            <strong className="tabular-nums">{q.data.summary.lowestKmh === null ? '—' : q.data.summary.lowestKmh < q.data.rangeKmh[0] ? `under ${q.data.rangeKmh[0]} km/h` : `${q.data.summary.lowestKmh} km/h`}</strong>; {q.data.summary.segmentsBelowPosted} segment{q.data.summary.segmentsBelowPosted === 1 ? '' : 's'} advised below the speed normally driven.
          </p>
          <DutySpeedChart advice={q.data} />
          <p className="-mt-2 text-xs text-slate">The chart shows a typical segment of this route (median roughness); pick a segment number in the table to chart it.</p>
          <SimpleTable
            label="Advised speed per segment"
            rows={q.data.segments}
            getRowKey={(r) => r.id}
            className="max-h-96 overflow-y-auto"
            columns={[
              { key: 'seq', header: 'Segment', rowHeader: true, cell: (r) => <button type="button" className="link" onClick={() => setSegmentId(r.id)} title="Show this segment in the chart">{r.seq + 1}</button> },
              { key: 'km', header: 'From', unit: 'km', numeric: true, cell: (r) => formatNumber(r.startM / 1000, 1) },
              { key: 'class', header: 'Class', cell: (r) => <RoughnessClassBadge value={r.isoClass} /> },
              { key: 'posted', header: 'Usual speed', unit: 'km/h', numeric: true, cell: (r) => formatNumber(r.postedKmh, 0) },
              { key: 'advised', header: 'Advised up to', unit: 'km/h', numeric: true, cell: (r) => (r.advisedKmh === null ? '—' : r.belowMinimum ? `< ${q.data.rangeKmh[0]}` : String(r.advisedKmh)) },
              { key: 'by', header: 'Limited by', cell: (r) => r.limitedBy },
            ]}
          />
          <p className="text-xs text-slate">{q.data.method}</p>
        </div>
      )}
    </Section>
  );
}
