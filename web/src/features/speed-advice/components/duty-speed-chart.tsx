import { CartesianGrid, Line, LineChart, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { formatNumber } from '@/lib/format';
import type { SpeedAdvice } from '../api/get-speed-advice';

/** Weighted body acceleration and damper power against speed on one segment, with both limits. */
export function DutySpeedChart({ advice }: { advice: SpeedAdvice }) {
  const c = advice.chart;
  if (!c) return null;
  const top = Math.max(advice.comfort.limit * 1.3, ...c.points.map((p) => p.weightedAccel));
  return (
    <figure aria-label="Duty against speed">
      <div className="h-64 w-full">
        <ResponsiveContainer>
          <LineChart data={c.points} margin={{ top: 12, right: 8, bottom: 20, left: 4 }}>
            <CartesianGrid stroke="#0001" />
            <XAxis dataKey="speedKmh" type="number" domain={advice.rangeKmh} tickCount={7} label={{ value: 'speed [km/h]', position: 'insideBottom', offset: -12, fontSize: 12 }} />
            <YAxis yAxisId="a" domain={[0, top]} width={50} tickFormatter={(v: number) => formatNumber(v, 1)} label={{ value: 'a_w [m/s²]', angle: -90, position: 'insideLeft', offset: 0, dx: 8, fontSize: 12, textAnchor: 'middle' }} />
            <YAxis yAxisId="p" orientation="right" width={54} tickFormatter={(v: number) => formatNumber(v, 0)} label={{ value: 'power [W]', angle: 90, position: 'insideRight', offset: 0, dx: -8, fontSize: 12, textAnchor: 'middle' }} />
            <Tooltip formatter={(v, name) => (typeof v === 'number' ? (String(name).startsWith('Weighted') ? `${formatNumber(v, 2)} m/s²` : `${formatNumber(v, 0)} W`) : v)} labelFormatter={(v) => `${v} km/h`} />
            <ReferenceLine yAxisId="a" y={advice.comfort.limit} stroke="#1E2A32" strokeDasharray="6 3" label={{ value: `comfort ${advice.comfort.limit} m/s²`, position: 'insideTopLeft', fontSize: 11 }} />
            <ReferenceLine yAxisId="p" y={advice.powerLimitW} stroke="#D9622B" strokeDasharray="2 3" label={{ value: `power ${advice.powerLimitW} W`, position: 'insideBottomRight', fontSize: 11 }} />
            <Line yAxisId="a" dataKey="weightedAccel" name="Weighted body acceleration, front" stroke="#1E2A32" strokeWidth={2} dot={false} isAnimationActive={false} />
            <Line yAxisId="p" dataKey="damperPowerW" name="Damper power, busiest axle" stroke="#D9622B" strokeWidth={2} dot={false} isAnimationActive={false} />
          </LineChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="text-xs text-slate">
        Segment {c.seq + 1} (class {c.isoClass ?? '—'}, Gd(n0) {formatNumber(c.gdN0 * 1e6, 0)} × 10⁻⁶ m³). Dark line and dashed line: ISO 2631-1 Wk-weighted body acceleration over the front axle and the comfort limit (left scale). Orange line and dotted line: mean damper power of the busiest axle and the power limit (right scale).
      </figcaption>
    </figure>
  );
}
