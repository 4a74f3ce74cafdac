import { Bar, BarChart, CartesianGrid, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { formatNumber } from '@/lib/format';
import type { ExposureDays } from '../api/get-exposure';

const colour = (a8: number, action: number, limit: number) => (a8 > limit ? '#B3261E' : a8 > action ? '#D9622B' : '#2E7D4F');

/** Daily A(8) as bars with the action and limit values as lines. */
export function ExposureChart({ data }: { data: ExposureDays }) {
  const days: { day: string; a8: number | null }[] = [];
  for (let t = Date.parse(`${data.from}T00:00:00Z`); t <= Date.parse(`${data.to}T00:00:00Z`); t += 86_400_000) {
    const day = new Date(t).toISOString().slice(0, 10);
    days.push({ day, a8: data.days.find((d) => d.day === day)?.a8 ?? null });
  }
  const top = Math.max(data.limitValue * 1.15, ...data.days.map((d) => d.a8 * 1.1));
  return (
    <figure aria-label="Daily exposure A(8) against the action and limit values">
      <div className="h-64 w-full">
        <ResponsiveContainer>
          <BarChart data={days} margin={{ top: 16, right: 12, bottom: 20, left: 4 }}>
            <CartesianGrid stroke="#0001" vertical={false} />
            <XAxis dataKey="day" tickFormatter={(d: string) => d.slice(8, 10)} interval="preserveStartEnd" minTickGap={12} label={{ value: 'day of month', position: 'insideBottom', offset: -12, fontSize: 12 }} />
            <YAxis domain={[0, top]} width={44} tickFormatter={(v: number) => formatNumber(v, 1)} label={{ value: 'A(8) [m/s²]', angle: -90, position: 'insideLeft', fontSize: 12, dy: 40 }} />
            <Tooltip formatter={(v) => (typeof v === 'number' ? `${formatNumber(v, 2)} m/s²` : 'no driving')} labelFormatter={(d) => String(d)} />
            <ReferenceLine y={data.actionValue} stroke="#B7791F" strokeDasharray="6 3" label={{ value: `action ${data.actionValue} m/s²`, position: 'insideTopLeft', fontSize: 11, fill: '#1E2A32' }} />
            <ReferenceLine y={data.limitValue} stroke="#B3261E" strokeWidth={2} label={{ value: `limit ${data.limitValue} m/s²`, position: 'insideTopLeft', fontSize: 11, fill: '#1E2A32' }} />
            <Bar dataKey="a8" name="A(8)" isAnimationActive={false} shape={(p: unknown) => {
              const { x, y, width, height, payload } = p as { x: number; y: number; width: number; height: number; payload: { a8: number | null } };
              if (payload.a8 === null) return <g />;
              return <rect x={x} y={y} width={width} height={height} fill={colour(payload.a8, data.actionValue, data.limitValue)} />;
            }} />
          </BarChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="text-xs text-slate">
        Bars: estimated daily exposure A(8) (green within the action value, orange above it, red above the limit value; exact values in the table). Dashed line: action value {data.actionValue} m/s². Solid line: limit value {data.limitValue} m/s² (Directive 2002/44/EC).
      </figcaption>
    </figure>
  );
}
