import { CartesianGrid, Line, LineChart, ReferenceArea, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { ROUGHNESS_CLASSES, roughnessColours } from '@/lib/roughness';
import { formatNumber } from '@/lib/format';
import type { RouteSegment } from '../api/get-route';

/**
 * IRI = K·√Gd(n0) for ISO 8608 w = 2 roads, K ≈ 542.7 (m/km)/√m³: the golden car as the app
 * computes IRI (250 mm moving average on a finely sampled profile), the physics engine's
 * iriPerSqrtGdConstant (docs/methods.md "IRI and Gd(n0)"). Used to draw the class bands in IRI.
 */
const K = 542.7;
const BOUNDS = [0, 32e-6, 128e-6, 512e-6, 2048e-6, 8192e-6, 32768e-6, 131072e-6, 524288e-6].map((g) => K * Math.sqrt(g));

/** IRI along the route with ISO 8608 class bands behind it. Stated classes show their class-mean equivalent. */
export function IriChart({ segments }: { segments: RouteSegment[] }) {
  const data = segments.map((s) => ({
    km: Math.round(((s.startM + s.endM) / 2 / 1000) * 1000) / 1000,
    measured: s.iri,
    equivalent: s.iri === null && s.gdN0 !== null ? K * Math.sqrt(s.gdN0) : null,
  }));
  if (data.every((d) => d.measured === null && d.equivalent === null)) {
    // bare axes would look like a smooth road: say that nothing is known yet
    return (
      <figure aria-label="IRI along the route" className="flex h-64 items-center justify-center rounded-md border border-dashed border-line-strong p-4">
        <figcaption className="max-w-sm text-center text-sm text-slate">
          No survey yet: this route’s roughness is not known. Upload a profile survey, set a class by hand, or accept drivers’ reports on it, and
          its IRI will show here.
        </figcaption>
      </figure>
    );
  }
  const top = Math.max(8, ...data.map((d) => d.measured ?? d.equivalent ?? 0)) * 1.1;
  return (
    <figure aria-label="IRI along the route">
      <div className="h-64 w-full">
        <ResponsiveContainer>
          <LineChart data={data} margin={{ top: 8, right: 16, bottom: 20, left: 8 }}>
            {ROUGHNESS_CLASSES.map((c, i) =>
              BOUNDS[i] < top ? <ReferenceArea key={c} y1={BOUNDS[i]} y2={Math.min(BOUNDS[i + 1], top)} fill={roughnessColours[c]} fillOpacity={0.22} ifOverflow="hidden" label={{ value: c, position: 'insideLeft', fontSize: 11, fill: '#333' }} /> : null,
            )}
            <CartesianGrid stroke="#0001" vertical={false} />
            <XAxis dataKey="km" type="number" domain={[0, 'dataMax']} tickFormatter={(v: number) => formatNumber(v, 0)} label={{ value: 'distance along the route [km]', position: 'insideBottom', offset: -12, fontSize: 12 }} />
            <YAxis domain={[0, top]} tickFormatter={(v: number) => formatNumber(v, 0)} label={{ value: 'IRI [m/km]', angle: -90, position: 'insideLeft', fontSize: 12 }} />
            <Tooltip formatter={(v) => (typeof v === 'number' ? `${formatNumber(v, 2)} m/km` : v)} labelFormatter={(v) => `${formatNumber(Number(v), 2)} km`} />
            <Line dataKey="measured" name="IRI, measured" stroke="#1f2a36" strokeWidth={1.5} dot={false} isAnimationActive={false} connectNulls={false} />
            <Line dataKey="equivalent" name="IRI equivalent of the stated class" stroke="#b4531f" strokeDasharray="4 3" strokeWidth={1.5} dot={false} isAnimationActive={false} connectNulls={false} />
          </LineChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="text-xs text-slate">
        Solid line: IRI measured by profile survey (golden-car method). Dashed: IRI equivalent of a stated class (ISO 8608 w = 2). Bands: ISO 8608 classes A–H.
      </figcaption>
    </figure>
  );
}
