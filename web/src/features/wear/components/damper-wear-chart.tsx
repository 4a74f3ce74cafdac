import { CartesianGrid, Line, LineChart, ReferenceArea, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { formatDate, formatNumber } from '@/lib/format';
import type { DamperWear } from '../api/get-vehicle-wear';

const day = (s: string) => Date.parse(`${s}T00:00:00Z`);
const DAY = 86_400_000;

/**
 * One damper's consumed life over time (solid), the predicted path to the inspection threshold
 * and end of life (dashed), the threshold as a line, and the P10–P90 range of the end-of-life
 * date as a shaded band (cut at the chart's horizon). Dates on the x axis, % of life on y.
 */
export function DamperWearChart({ damper, thresholdFraction }: { damper: DamperWear; thresholdFraction: number }) {
  const points = new Map<number, { t: number; used: number | null; predicted: number | null }>();
  for (const h of damper.history) points.set(day(h.day), { t: day(h.day), used: h.lifeUsedFraction * 100, predicted: null });
  // The projection is drawn up to end of life, but at most three years ahead (beyond that the
  // recorded history would shrink to nothing); a cut path ends on the straight line.
  const path = damper.path.map((p) => ({ t: day(p.day), v: p.lifeUsedFraction * 100 }));
  if (path.length) {
    const horizon = Math.max(path[0].t + 90 * DAY, Math.min(path[path.length - 1].t, path[0].t + 3 * 365 * DAY));
    for (let i = 0; i < path.length; i++) {
      let { t, v } = path[i];
      if (t > horizon) {
        const a = path[i - 1];
        v = a.v + ((v - a.v) * (horizon - a.t)) / (t - a.t);
        t = horizon;
      }
      const cur = points.get(t) ?? { t, used: null, predicted: null };
      cur.predicted = v;
      points.set(t, cur);
      if (t === horizon) break;
    }
  }
  const data = [...points.values()].sort((a, b) => a.t - b.t);
  // end of life between P10 and P90, drawn inside the time span shown
  const p = damper.prediction;
  const tMin = data.length ? data[0].t : 0;
  const tMax = data.length ? data[data.length - 1].t : 0;
  const p10 = p?.endOfLifeP10Date ? day(p.endOfLifeP10Date) : null;
  const p90 = p?.endOfLifeP90Date ? day(p.endOfLifeP90Date) : null;
  const band = p10 !== null && p90 !== null && p10 <= tMax && p90 >= tMin ? { x1: Math.max(p10, tMin), x2: Math.min(p90, tMax), cut: p90 > tMax } : null;
  const top = Math.max(105, ...data.map((d) => Math.max(d.used ?? 0, d.predicted ?? 0) * 1.05));
  // ticks every 20 % up to 120 %, then coarser, so a damper far past end of life keeps a readable axis
  const step = top <= 120 ? 20 : top <= 300 ? 50 : 100;
  const yMax = Math.ceil(top / step) * step;
  const ticks = Array.from({ length: yMax / step + 1 }, (_, i) => i * step);
  const label = `Consumed life of the ${damper.position} damper over time, with the predicted path`;
  return (
    <figure aria-label={label}>
      <div className="h-48 w-full">
        <ResponsiveContainer>
          <LineChart data={data} margin={{ top: 8, right: 12, bottom: 18, left: 2 }}>
            <CartesianGrid stroke="#0001" vertical={false} />
            <XAxis
              dataKey="t"
              type="number"
              scale="time"
              domain={['dataMin', 'dataMax']}
              tickFormatter={(v: number) => formatDate(new Date(v))}
              tick={{ fontSize: 11 }}
              minTickGap={40}
            />
            {/* the axis is wide enough for the title and three-digit ticks side by side; the title sits inside its left edge */}
            <YAxis domain={[0, yMax]} ticks={ticks} tickFormatter={(v: number) => formatNumber(v)} tick={{ fontSize: 11 }} width={54} label={{ value: 'life used [%]', angle: -90, position: 'insideLeft', offset: 0, dx: 8, fontSize: 11, textAnchor: 'middle' }} />
            <ReferenceLine y={thresholdFraction * 100} stroke="#D9622B" strokeDasharray="6 3" label={{ value: `inspect at ${formatNumber(thresholdFraction * 100)} %`, position: 'insideTopLeft', fontSize: 11, fill: '#9c441a' }} />
            {band ? (
              band.x2 > band.x1 ? (
                <ReferenceArea
                  x1={band.x1}
                  x2={band.x2}
                  fill="#B3261E"
                  fillOpacity={0.1}
                  stroke="#B3261E"
                  strokeOpacity={0.3}
                  ifOverflow="hidden"
                  label={{ value: `end of life P10–P90${band.cut ? ' →' : ''}`, position: 'insideBottomRight', fontSize: 11, fill: '#B3261E' }}
                />
              ) : (
                <ReferenceLine x={band.x1} stroke="#B3261E" strokeDasharray="2 2" label={{ value: 'end of life', position: 'insideBottom', fontSize: 11, fill: '#B3261E' }} />
              )
            ) : null}
            <ReferenceLine y={100} stroke="#B3261E" label={{ value: 'end of life', position: 'insideTopLeft', fontSize: 11, fill: '#B3261E' }} />
            <Tooltip
              labelFormatter={(v) => formatDate(new Date(Number(v)))}
              formatter={(v, name) => [typeof v === 'number' ? `${formatNumber(v, 1)} %` : String(v), name === 'used' ? 'life used' : 'predicted']}
            />
            <Line dataKey="used" name="used" stroke="#1E2A32" strokeWidth={2} dot={false} isAnimationActive={false} connectNulls />
            <Line dataKey="predicted" name="predicted" stroke="#1E2A32" strokeDasharray="5 4" strokeWidth={1.5} dot={{ r: 3 }} isAnimationActive={false} connectNulls />
          </LineChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="sr-only">
        {label}. Solid: from recorded trips. Dashed: projected at the last {p?.windowDays ?? 30} days’ rate.
        {p?.endOfLifeP10Date && p.endOfLifeP90Date ? ` Shaded: end of life between ${formatDate(p.endOfLifeP10Date)} (P10) and ${formatDate(p.endOfLifeP90Date)} (P90).` : ''}
      </figcaption>
    </figure>
  );
}
