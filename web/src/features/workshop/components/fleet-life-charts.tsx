import { CartesianGrid, Line, LineChart, ResponsiveContainer, Scatter, ScatterChart, XAxis, YAxis, Tooltip, Legend, ComposedChart } from 'recharts';
import { Facts } from '@/components/ui/facts';
import { Section } from '@/components/ui/section';
import { formatNumber } from '@/lib/format';
import type { FitView, FleetLife } from '../api/get-fleet-life';

const toLife = (v: number, unit: string) => (unit === 'J' ? v / 1e6 : v);
const unitLabel = (unit: string) => (unit === 'J' ? 'MJ' : unit);

/** Weibull probability plot (ln t against ln(−ln(1−F))) and the survival curve of one fit. */
function FitCharts({ view, title }: { view: FitView; title: string }) {
  const u = unitLabel(view.unit);
  const f = view.fit;
  const pts = view.points.map((p) => ({ x: Math.log(toLife(p.life, view.unit)), y: Math.log(-Math.log(1 - p.unreliability)) }));
  const line = f
    ? [Math.min(...view.points.map((p) => p.life), f.b10 / 2), Math.max(...view.points.map((p) => p.life), f.scale * 1.5)].map((t) => ({
        x: Math.log(toLife(t, view.unit)),
        y: f.shape * (Math.log(t) - Math.log(f.scale)),
      }))
    : [];
  const tick = (v: number) => formatNumber(Math.exp(v), 0);
  const yTicks = [0.01, 0.02, 0.05, 0.1, 0.2, 0.5, 0.632, 0.9, 0.99].map((F) => Math.log(-Math.log(1 - F)));
  const xs = [...pts.map((p) => p.x), ...line.map((p) => p.x)];
  const xTicks = [1, 2, 5].flatMap((m) => [1e2, 1e3, 1e4, 1e5, 1e6].map((e) => Math.log(m * e))).filter((x) => xs.length && x >= Math.min(...xs) - 0.3 && x <= Math.max(...xs) + 0.3).sort((a, b) => a - b);
  return (
    <Section title={title} level={3}>
      {f ? (
        <Facts
          items={[
            { label: 'Shape β', value: `${formatNumber(f.shape, 2)}${f.bounds ? ` (${formatNumber(f.bounds.shape[0], 2)}–${formatNumber(f.bounds.shape[1], 2)})` : ''}`, numeric: true },
            { label: `Scale η [${u}]`, value: `${formatNumber(toLife(f.scale, view.unit))}${f.bounds ? ` (${formatNumber(toLife(f.bounds.scale[0], view.unit))}–${formatNumber(toLife(f.bounds.scale[1], view.unit))})` : ''}`, numeric: true },
            { label: `B10 life [${u}]`, value: `${formatNumber(toLife(f.b10, view.unit))}${f.bounds ? ` (${formatNumber(toLife(f.bounds.b10[0], view.unit))}–${formatNumber(toLife(f.bounds.b10[1], view.unit))})` : ''}`, numeric: true },
            { label: 'Failures / suspensions', value: `${f.failures} / ${f.suspensions}`, numeric: true },
          ]}
        />
      ) : (
        <p className="text-sm text-slate">No fit yet: {view.reason}</p>
      )}
      {f?.bounds ? <p className="mt-1 text-xs text-slate">Bounds: {Math.round(f.bounds.level * 100)} % two-sided, {f.bounds.method}.</p> : null}
      {view.excluded ? <p className="text-xs text-slate">{view.excluded} damper(s) left out (no usable life in {u}).</p> : null}
      {view.points.length ? (
      <div className="mt-3 grid gap-4 lg:grid-cols-2">
        <figure>
          <figcaption className="mb-1 text-sm font-medium">Weibull probability plot (removals, median ranks)</figcaption>
          <ResponsiveContainer width="100%" height={260}>
            <ComposedChart margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
              <CartesianGrid stroke="#e3ded3" />
              <XAxis type="number" dataKey="x" domain={['dataMin', 'dataMax']} ticks={xTicks} tickFormatter={tick} label={{ value: `life [${u}] (log scale)`, position: 'bottom', offset: 4 }} />
              <YAxis type="number" dataKey="y" domain={[yTicks[0], yTicks[yTicks.length - 1]]} ticks={yTicks} width={56} tickFormatter={(v: number) => `${formatNumber((1 - Math.exp(-Math.exp(v))) * 100, 0)} %`} label={{ value: 'removed [%]', angle: -90, position: 'insideLeft' }} />
              <Scatter name="removals" data={pts} fill="#D9622B" isAnimationActive={false} />
              <Line name="fit" data={line} dataKey="y" stroke="#1E2A32" dot={false} isAnimationActive={false} />
              <Legend verticalAlign="top" />
            </ComposedChart>
          </ResponsiveContainer>
        </figure>
        <figure>
          <figcaption className="mb-1 text-sm font-medium">Survival: share of dampers still in service</figcaption>
          <ResponsiveContainer width="100%" height={260}>
            <LineChart data={view.curve.map((c) => ({ life: toLife(c.life, view.unit), survival: c.survival * 100 }))} margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
              <CartesianGrid stroke="#e3ded3" />
              <XAxis type="number" dataKey="life" tickFormatter={(v: number) => formatNumber(v)} label={{ value: `life [${u}]`, position: 'bottom', offset: 4 }} />
              <YAxis domain={[0, 100]} tickFormatter={(v: number) => `${v} %`} />
              <Tooltip formatter={(v) => `${formatNumber(Number(v), 1)} %`} labelFormatter={(v) => `${formatNumber(Number(v))} ${u}`} />
              <Line dataKey="survival" name="in service [%]" stroke="#2E7D4F" dot={false} isAnimationActive={false} />
            </LineChart>
          </ResponsiveContainer>
        </figure>
      </div>
      ) : null}
    </Section>
  );
}

export function FleetLifeView({ life }: { life: FleetLife }) {
  return (
    <>
      <Section title="Life used by the nightly job" description={life.blend.rule}>
        <p className="text-sm">
          {life.blend.used
            ? `Fleet-blended: weight ${formatNumber(life.blend.weight * 100)} % on ${life.blend.failures} removals (fleet mean ${formatNumber(life.blend.fleetMeanKm)} km).`
            : `Rated life: ${life.blend.failures} removal(s) for wear so far; the fleet's own life is blended in from ${life.blend.minRemovals}.`}{' '}
          {life.blend.axles.map((a) => `Axle ${a.axleIndex + 1}: ${formatNumber(a.usedKm)} km (rated ${formatNumber(a.ratedKm)} km)`).join('; ')}.
        </p>
      </Section>
      <FitCharts view={life.km} title="Life in distance" />
      <FitCharts view={life.energy} title="Life in damper energy" />
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
