import { Bar, CartesianGrid, ComposedChart, Legend, ResponsiveContainer, Scatter, Tooltip, XAxis, YAxis } from 'recharts';
import { Link } from 'react-router';
import { EmptyState } from '@/components/ui/empty-state';
import { FigureCard } from '@/components/ui/figure-card';
import { Section } from '@/components/ui/section';
import { SimpleTable, type SimpleColumn } from '@/components/ui/simple-table';
import { StatusShape } from '@/components/ui/status-badge';
import { formatDate, formatNumber } from '@/lib/format';
import type { BacktestPoint, LifeBacktest } from '../api/get-life-backtest';

/** Share of removals a P10–P90 range should hold when the scatter is right. */
const NOMINAL_INSIDE = 0.8;

const pct = (x: number | null, digits = 0) => (x === null ? '—' : formatNumber(x, digits));

/** Each removal in date order: the predicted P10–P90 as a bar, the predicted median and the actual life as points. */
function BacktestChart({ points }: { points: BacktestPoint[] }) {
  const data = points.map((p, i) => ({
    n: i + 1,
    label: `${formatDate(p.removedAt)} · damper ${p.damperId}`,
    range: [p.p10Km, p.p90Km] as [number, number],
    median: p.predictedMedianKm,
    actual: p.actualKm,
  }));
  const label = 'Predicted against actual life of each removal for wear, in date order';
  return (
    <figure aria-label={label}>
      <figcaption className="mb-1 text-sm font-medium">Each column is one removal for wear, oldest first: the grey bar is the predicted P10–P90, the dark dot the predicted median, the orange diamond the life it actually had.</figcaption>
      <ResponsiveContainer width="100%" height={320}>
        <ComposedChart data={data} margin={{ top: 8, right: 16, bottom: 28, left: 16 }}>
          <CartesianGrid stroke="#e3ded3" vertical={false} />
          <XAxis dataKey="n" label={{ value: 'removal, in date order', position: 'bottom', offset: 8 }} />
          <YAxis tickFormatter={(v: number) => formatNumber(v / 1000)} label={{ value: 'life [1,000 km]', angle: -90, position: 'insideLeft' }} />
          <Tooltip
            labelFormatter={(_, items) => String((items?.[0]?.payload as { label?: string } | undefined)?.label ?? '')}
            formatter={(v, name) => [Array.isArray(v) ? `${formatNumber(Number(v[0]))}–${formatNumber(Number(v[1]))} km` : `${formatNumber(Number(v))} km`, String(name)]}
          />
          <Bar dataKey="range" name="predicted P10–P90" fill="#5B6B73" fillOpacity={0.3} stroke="#5B6B73" isAnimationActive={false} barSize={14} />
          <Scatter dataKey="median" name="predicted median" fill="#1E2A32" isAnimationActive={false} />
          <Scatter dataKey="actual" name="actual" fill="#D9622B" shape="diamond" isAnimationActive={false} />
          <Legend verticalAlign="top" />
        </ComposedChart>
      </ResponsiveContainer>
    </figure>
  );
}

/** The back-test page's body: how far the life predictions can be trusted, for one spec. */
export function LifeBacktestView({ bt, vehiclePath, fleetNumberOf }: { bt: LifeBacktest; vehiclePath: (id: number) => string; fleetNumberOf: (id: number) => string | undefined }) {
  const n = bt.points.length;
  if (!n) {
    return (
      <EmptyState title="No removal for wear on record for this spec yet">
        The back-test replays each removal for wear against what the model predicted before it. Record replacements with their removal reason on the work record, and they
        appear here.
      </EmptyState>
    );
  }
  const columns: SimpleColumn<BacktestPoint>[] = [
    { key: 'at', header: 'Removed', rowHeader: true, cell: (p) => formatDate(p.removedAt) },
    {
      key: 'v',
      header: 'Vehicle · damper',
      cell: (p) => (
        <>
          <Link className="link" to={vehiclePath(p.vehicleId)}>
            {fleetNumberOf(p.vehicleId) ?? `vehicle ${p.vehicleId}`}
          </Link>{' '}
          · damper {p.damperId}
        </>
      ),
    },
    { key: 'act', header: 'Actual life', unit: 'km', numeric: true, cell: (p) => formatNumber(p.actualKm) },
    { key: 'med', header: 'Predicted median', unit: 'km', numeric: true, cell: (p) => formatNumber(p.predictedMedianKm) },
    { key: 'rng', header: 'Predicted P10–P90', unit: 'km', numeric: true, cell: (p) => `${formatNumber(p.p10Km)}–${formatNumber(p.p90Km)}` },
    { key: 'err', header: 'Error of the median', unit: '%', numeric: true, cell: (p) => formatNumber(p.errorPct) },
    {
      key: 'in',
      header: 'Inside P10–P90',
      cell: (p) => (
        <span className="inline-flex items-center gap-1.5">
          <StatusShape tone={p.inside ? 'ok' : 'watch'} />
          {p.inside ? 'inside' : p.actualKm < p.p10Km ? 'shorter' : 'longer'}
        </span>
      ),
    },
    { key: 'tr', header: 'Learned from', unit: 'removals', numeric: true, cell: (p) => formatNumber(p.trainedOn) },
  ];
  return (
    <>
      <div className="grid gap-3 sm:grid-cols-3">
        <FigureCard
          label="Median error of the predicted life"
          value={pct(bt.mdape)}
          unit="%"
          footer={`The prior alone: ${pct(bt.prior.mdape)} %. Half the removals were predicted closer than this.`}
        />
        <FigureCard
          label="Removals inside the predicted P10–P90"
          value={pct(bt.insideShare === null ? null : bt.insideShare * 100)}
          unit="%"
          footer={`The prior alone: ${pct(bt.prior.insideShare === null ? null : bt.prior.insideShare * 100)} %. A range that is right holds about ${formatNumber(NOMINAL_INSIDE * 100)} %.`}
        />
        <FigureCard label="Removals for wear replayed" value={formatNumber(n)} unit={n === 1 ? 'removal' : 'removals'} footer="Each predicted from what was known the day before it." />
      </div>
      <p className="mt-3 text-sm text-ink">{summary(bt)}</p>
      <Section title="Predicted and actual life" className="mt-6">
        <BacktestChart points={bt.points} />
      </Section>
      <Section title="Each removal">
        <SimpleTable label="Back-test: predicted and actual life of each removal for wear" columns={columns} rows={bt.points} getRowKey={(p) => `${p.damperId}-${p.removedAt}`} />
      </Section>
      <Section title="Method">
        <p className="text-sm text-ink">{bt.method}</p>
      </Section>
    </>
  );
}

/** The figures in one plain sentence, with a word on how far to trust them. */
function summary(bt: LifeBacktest): string {
  if (bt.mdape === null || bt.insideShare === null) return '';
  const n = bt.points.length;
  const better = bt.prior.mdape !== null && bt.mdape < bt.prior.mdape;
  const few = n < 10 ? ` With only ${n} removals on record, these figures are themselves uncertain.` : '';
  return (
    `Trained only on what was known before each removal, the model's median missed the actual life by ${pct(bt.mdape)} % or less for half the removals ` +
    `(${better ? 'better than' : 'no better than'} the prior alone, ${pct(bt.prior.mdape)} %), and ${pct(bt.insideShare * 100)} % of removals fell inside its P10–P90 range. ` +
    `Plan on the range, not the median date.${few}`
  );
}
