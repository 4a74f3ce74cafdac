import { CartesianGrid, Line, LineChart, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { formatNumber } from '@/lib/format';
import type { SpeedAdvice } from '../api/get-speed-advice';

/**
 * Seat acceleration and damper duty against speed on one segment, with both limits. Damper duty
 * is the busiest damper's mean power as a multiple of its own power on class B at 80 km/h, so the
 * limit is one line for every axle.
 */
export function DutySpeedChart({ advice }: { advice: SpeedAdvice }) {
  const c = advice.chart;
  if (!c) return null;
  const top = Math.max(advice.comfort.limit * 1.3, ...c.points.map((p) => p.seatWeightedAccel));
  const multiple = advice.damper.multiple;
  return (
    <figure aria-label="Duty against speed">
      <div className="h-64 w-full">
        <ResponsiveContainer>
          <LineChart data={c.points} margin={{ top: 12, right: 8, bottom: 20, left: 4 }}>
            <CartesianGrid stroke="#0001" />
            <XAxis dataKey="speedKmh" type="number" domain={[10, advice.rangeKmh[1]]} tickCount={7} label={{ value: 'speed [km/h]', position: 'insideBottom', offset: -12, fontSize: 12 }} />
            <YAxis yAxisId="a" domain={[0, top]} width={50} tickFormatter={(v: number) => formatNumber(v, 1)} label={{ value: 'seat a_w [m/s²]', angle: -90, position: 'insideLeft', offset: 0, dx: 8, fontSize: 12, textAnchor: 'middle' }} />
            <YAxis yAxisId="p" orientation="right" width={54} tickFormatter={(v: number) => formatNumber(v, 0)} label={{ value: 'damper [× class B]', angle: 90, position: 'insideRight', offset: 0, dx: -8, fontSize: 12, textAnchor: 'middle' }} />
            <Tooltip formatter={(v, name) => (typeof v === 'number' ? (String(name).startsWith('Seat') ? `${formatNumber(v, 2)} m/s²` : `${formatNumber(v, 1)} ×`) : v)} labelFormatter={(v) => `${v} km/h`} />
            <ReferenceLine yAxisId="a" y={advice.comfort.limit} stroke="#1E2A32" strokeDasharray="6 3" label={{ value: `ride ${formatNumber(advice.comfort.limit, 2)} m/s²`, position: 'insideTopLeft', fontSize: 11 }} />
            <ReferenceLine yAxisId="a" x={advice.rangeKmh[0]} stroke="#8A1C1C" strokeDasharray="1 3" label={{ value: `floor ${advice.rangeKmh[0]} km/h`, position: 'insideTopLeft', fontSize: 11 }} />
            {multiple !== null ? <ReferenceLine yAxisId="p" y={multiple} stroke="#D9622B" strokeDasharray="2 3" label={{ value: `damper ${multiple}×`, position: 'insideBottomRight', fontSize: 11 }} /> : null}
            <Line yAxisId="a" dataKey="seatWeightedAccel" name="Seat weighted acceleration" stroke="#1E2A32" strokeWidth={2} dot={false} isAnimationActive={false} />
            <Line yAxisId="p" dataKey="damperPowerRatio" name="Damper power, busiest damper" stroke="#D9622B" strokeWidth={2} dot={false} isAnimationActive={false} />
          </LineChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="text-xs text-slate">
        Segment {c.seq + 1} (class {c.isoClass ?? '—'}, Gd(n0) {formatNumber(c.gdN0 * 1e6, 0)} × 10⁻⁶ m³), {advice.load.case}. Dark line and dashed line: ISO 2631-1 Wk-weighted acceleration at the seat ({formatNumber(advice.seat.factor, 2)} × the floor over the front axle) and the ride limit (left scale). Orange line
        {multiple !== null ? ' and dotted line' : ''}: mean power of the busiest damper as a multiple of its own power on class B at 80 km/h{multiple !== null ? ', and the damper limit' : `; the limit is an absolute ${advice.damper.absoluteW} W`} (right scale).
      </figcaption>
    </figure>
  );
}
