import { CartesianGrid, Line, LineChart, ResponsiveContainer, Scatter, ScatterChart, XAxis, YAxis, Tooltip, Legend, ComposedChart } from 'recharts';
import { Link } from 'react-router';
import { Caution } from '@/components/ui/caution';
import { Facts } from '@/components/ui/facts';
import { Notice } from '@/components/ui/notice';
import { Section } from '@/components/ui/section';
import { SentenceList } from '@/components/ui/sentence-list';
import { SimpleTable, type SimpleColumn } from '@/components/ui/simple-table';
import { formatNumber } from '@/lib/format';
import type { LifeTableRow, SpecLife } from '../api/get-fleet-life';

/** Factor by which the model's and the fleet's mean lives may differ before the server warns. */
const DISAGREEMENT_FACTOR = 1.5;

/** Weibull probability plot (ln t against ln(−ln(1−F))) and the survival curve of the fleet's km fit. */
function FleetKmCharts({ view }: { view: SpecLife['fleetKm'] }) {
  const f = view.fit;
  const pts = view.points.map((p) => ({ x: Math.log(p.life), y: Math.log(-Math.log(1 - p.unreliability)) }));
  const lo = Math.min(...view.points.map((p) => p.life), f ? f.b10 / 2 : Infinity);
  const hi = Math.max(...view.points.map((p) => p.life), f ? f.scale * 1.5 : 0);
  const line = f ? [lo, hi].map((t) => ({ x: Math.log(t), y: f.shape * (Math.log(t) - Math.log(f.scale)) })) : [];
  // survival S(t) = exp(−(t/η)^β) of the fit, from 0 to past the longest life on record
  const curve = f ? Array.from({ length: 61 }, (_, i) => (i / 60) * hi).map((t) => ({ life: t, survival: Math.exp(-((t / f.scale) ** f.shape)) * 100 })) : [];
  const tick = (v: number) => formatNumber(Math.exp(v), 0);
  const yTicks = [0.01, 0.02, 0.05, 0.1, 0.2, 0.5, 0.632, 0.9, 0.99].map((F) => Math.log(-Math.log(1 - F)));
  const xs = [...pts.map((p) => p.x), ...line.map((p) => p.x)];
  const xTicks = [1, 2, 5].flatMap((m) => [1e2, 1e3, 1e4, 1e5, 1e6].map((e) => Math.log(m * e))).filter((x) => xs.length && x >= Math.min(...xs) - 0.3 && x <= Math.max(...xs) + 0.3).sort((a, b) => a - b);
  return (
    <>
      {f ? (
        <Facts
          items={[
            { label: 'Mean life [km]', value: formatNumber(f.mean), numeric: true },
            { label: 'B10 life [km]', value: `${formatNumber(f.b10)}${f.bounds ? ` (${formatNumber(f.bounds.b10[0])}–${formatNumber(f.bounds.b10[1])})` : ''}`, numeric: true },
            { label: 'Scale η [km]', value: `${formatNumber(f.scale)}${f.bounds ? ` (${formatNumber(f.bounds.scale[0])}–${formatNumber(f.bounds.scale[1])})` : ''}`, numeric: true },
            { label: 'Shape β', value: `${formatNumber(f.shape, 2)}${f.bounds ? ` (${formatNumber(f.bounds.shape[0], 2)}–${formatNumber(f.bounds.shape[1], 2)})` : ''}`, numeric: true },
            { label: 'Removals for wear / still running', value: `${f.failures} / ${f.suspensions}`, numeric: true },
          ]}
        />
      ) : (
        <p className="text-sm text-slate">No fit in km yet: {view.reason}</p>
      )}
      {f?.bounds ? <p className="mt-1 text-xs text-slate">Ranges: {Math.round(f.bounds.level * 100)} % two-sided, {f.bounds.method}.</p> : null}
      {view.points.length ? (
        <div className="mt-3 grid gap-4 lg:grid-cols-2">
          <figure aria-label="Weibull probability plot of the removals in km">
            <figcaption className="mb-1 text-sm font-medium">Weibull probability plot (removals for wear, median ranks)</figcaption>
            <ResponsiveContainer width="100%" height={260}>
              <ComposedChart margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
                <CartesianGrid stroke="#e3ded3" />
                <XAxis type="number" dataKey="x" domain={['dataMin', 'dataMax']} ticks={xTicks} tickFormatter={tick} label={{ value: 'life [km] (log scale)', position: 'bottom', offset: 4 }} />
                <YAxis type="number" dataKey="y" domain={[yTicks[0], yTicks[yTicks.length - 1]]} ticks={yTicks} width={72} tickFormatter={(v: number) => `${formatNumber((1 - Math.exp(-Math.exp(v))) * 100, 0)} %`} label={{ value: 'removed [%]', angle: -90, position: 'insideLeft' }} />
                <Scatter name="removals" data={pts} fill="#D9622B" isAnimationActive={false} />
                <Line name="fit" data={line} dataKey="y" stroke="#1E2A32" dot={false} isAnimationActive={false} />
                <Legend verticalAlign="top" />
              </ComposedChart>
            </ResponsiveContainer>
          </figure>
          {curve.length ? (
            <figure aria-label="Share of dampers still in service against km">
              <figcaption className="mb-1 text-sm font-medium">Survival: share of dampers still in service</figcaption>
              <ResponsiveContainer width="100%" height={260}>
                <LineChart data={curve} margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
                  <CartesianGrid stroke="#e3ded3" />
                  <XAxis type="number" dataKey="life" tickFormatter={(v: number) => formatNumber(v)} label={{ value: 'life [km]', position: 'bottom', offset: 4 }} />
                  <YAxis domain={[0, 100]} tickFormatter={(v: number) => `${v} %`} />
                  <Tooltip formatter={(v) => `${formatNumber(Number(v), 1)} %`} labelFormatter={(v) => `${formatNumber(Number(v))} km`} />
                  <Line dataKey="survival" name="in service [%]" stroke="#2E7D4F" dot={false} isAnimationActive={false} />
                </LineChart>
              </ResponsiveContainer>
            </figure>
          ) : null}
        </div>
      ) : null}
    </>
  );
}

const lifeColumns: SimpleColumn<LifeTableRow>[] = [
  { key: 'cls', header: 'Road', rowHeader: true, cell: (r) => `ISO 8608 class ${r.cls}` },
  { key: 'sev', header: 'Road severity', unit: '×', numeric: true, cell: (r) => formatNumber(r.severity, 1) },
  { key: 'med', header: 'Median life', unit: 'km', numeric: true, cell: (r) => formatNumber(r.medianKm) },
  { key: 'range', header: 'P10–P90', unit: 'km', numeric: true, cell: (r) => `${formatNumber(r.p10Km)}–${formatNumber(r.p90Km)}` },
  { key: 'prior', header: 'Prior median', unit: 'km', numeric: true, cell: (r) => formatNumber(r.priorMedianKm) },
  { key: 'vs', header: 'Against the prior', unit: '%', numeric: true, cell: (r) => `${r.medianKm >= r.priorMedianKm ? '+' : '−'}${formatNumber(Math.abs(r.medianKm / r.priorMedianKm - 1) * 100)}` },
];

/** The model against what the fleet's removals alone say, with the plain-words warning when they disagree. */
function Comparison({ c, reason }: { c: SpecLife['comparison']; reason: string | null }) {
  return (
    <>
      <Facts
        items={[
          { label: "Model: mean life on these dampers' own roads [km]", value: formatNumber(c.modelMeanKm), numeric: true },
          { label: "Fleet's removals: mean life [km]", value: formatNumber(c.fleetMeanKm), numeric: true },
          { label: 'Model ÷ fleet', value: c.ratio === null ? '—' : `${formatNumber(c.ratio, 2)}×`, numeric: true },
        ]}
        className="lg:grid-cols-3"
      />
      <div className="mt-3">
        {c.disagrees && c.warning ? (
          <Caution title="The model and the fleet disagree">{c.warning}</Caution>
        ) : c.ratio !== null ? (
          <Notice tone="ok">
            The model and the fleet&apos;s removal history agree within a factor {DISAGREEMENT_FACTOR} (the model&apos;s mean is {formatNumber(Math.abs(c.ratio - 1) * 100)} %{' '}
            {c.ratio >= 1 ? 'longer' : 'shorter'}).
          </Notice>
        ) : (
          <Notice>Not enough removals to compare the model with the fleet yet{reason ? `: ${reason}` : ''}.</Notice>
        )}
      </div>
    </>
  );
}

/** The damper-life page's body: the fitted life model of a spec and everything it rests on. */
export function FleetLifeView({ life, backtestTo }: { life: SpecLife; backtestTo: string }) {
  const m = life.model;
  const rated = life.ratedKm[0]?.ratedKm;
  const sameRating = life.ratedKm.every((a) => a.ratedKm === rated);
  return (
    <>
      <Section
        title="Life per road"
        description={m.note.charAt(0).toUpperCase() + m.note.slice(1) + '.'}
        actions={
          <Link className="link text-sm" to={backtestTo}>
            How good are these predictions? → back-test
          </Link>
        }
      >
        <Facts
          items={[
            {
              label: 'Learned from',
              value: m.source === 'fleet' ? `${m.failures} removals for wear, ${m.suspensions} still running or removed for other reasons` : "the trade's prior alone: no removal for wear on record yet",
            },
            { label: 'Shorter per ISO class step', value: `${formatNumber(m.classStepFactor, 2)}× (prior ${formatNumber(life.prior.classStepFactor, 2)}×)`, numeric: true },
            { label: 'Weibull shape', value: `${formatNumber(m.shape, 1)} (prior ${formatNumber(life.prior.shape, 1)})`, numeric: true },
            { label: 'Dampers with duty records', value: `${life.dampers.withRecords} of ${life.dampers.total}`, numeric: true },
          ]}
          className="mb-4 lg:grid-cols-4"
        />
        <SimpleTable
          label="Damper life per ISO 8608 road class at 80 km/h"
          columns={lifeColumns}
          rows={life.lifeTable}
          getRowKey={(r) => r.cls}
          footer={
            <>
              A damper that spends its whole life on that road at 80 km/h, unladen
              {rated ? `, for a rated life of ${formatNumber(rated)} km${sameRating ? '' : ' (axle 1; other axles in proportion to their rated km)'}` : ''}. P10: one damper in ten is worn out by then; P90: nine in ten.
              Severity 1 is class B at 80 km/h, the road the rated km is stated on.
            </>
          }
        />
      </Section>
      <Section title="The model against the fleet's history" description="The model's mean life on the roads each damper actually drove, against the mean life the removals alone give.">
        <Comparison c={life.comparison} reason={life.fleetKm.reason} />
      </Section>
      <Section
        title="What the removals alone say"
        description="Weibull fit in km by maximum likelihood to every removal for wear, with dampers still fitted or removed for other reasons counted as running (right-censored). It ignores the roads: it is the check on the model, not the model."
      >
        <FleetKmCharts view={life.fleetKm} />
      </Section>
      <Section title="Assumptions">
        <SentenceList items={life.assumptions} className="list-disc space-y-1 pl-5 text-sm text-ink" />
      </Section>
    </>
  );
}

/** Predicted against measured damping with the 1:1 line. */
export function ModelCheckChart({ points }: { points: { predictedNsPerM: number; measuredNsPerM: number; fleetNumber: string; position: string }[] }) {
  const max = Math.max(1000, ...points.flatMap((p) => [p.predictedNsPerM, p.measuredNsPerM])) * 1.05;
  return (
    <figure>
      <figcaption className="mb-1 text-sm font-medium">Each point is one corner at one inspection; on the line, the model was exact.</figcaption>
      <ResponsiveContainer width="100%" height={360}>
        <ScatterChart margin={{ top: 8, right: 16, bottom: 28, left: 16 }}>
          <CartesianGrid stroke="#e3ded3" />
          <XAxis type="number" dataKey="x" domain={[0, max]} tickFormatter={(v: number) => formatNumber(v)} label={{ value: 'measured damping [N·s/m]', position: 'bottom', offset: 8 }} />
          <YAxis type="number" dataKey="y" domain={[0, max]} tickFormatter={(v: number) => formatNumber(v)} label={{ value: 'predicted [N·s/m]', angle: -90, position: 'insideLeft' }} />
          <Tooltip formatter={(v) => `${formatNumber(Number(v))} N·s/m`} />
          <Scatter name="1:1 line" data={[{ x: 0, y: 0 }, { x: max, y: max }]} line={{ stroke: '#5B6B73', strokeDasharray: '4 4' }} shape={() => <g />} isAnimationActive={false} />
          <Scatter name="corners" data={points.map((p) => ({ x: p.measuredNsPerM, y: p.predictedNsPerM }))} fill="#D9622B" isAnimationActive={false} />
          <Legend verticalAlign="top" />
        </ScatterChart>
      </ResponsiveContainer>
    </figure>
  );
}
