import { SimpleTable } from '@/components/ui/simple-table';
import { formatNumber } from '@/lib/format';
import { axleLabel, bodyBounceHz, dampingRatio, wheelHopHz, type SpecAxle } from '@/lib/suspension';

/**
 * A spec's corner parameters per axle, with units, and the figures an engineer checks them by
 * (body bounce, body damping ratio, wheel hop): the two-mass model's modes as the server sends
 * them, the same the spec editor shows; one-mass approximations, marked ≈, only where it did not.
 */
export function SpecCornerTable({ axles, label = 'Corner parameters per axle' }: { axles: SpecAxle[]; label?: string }) {
  const exact = axles.every((a) => a.modes);
  return (
    <SimpleTable
      label={label}
      rows={axles}
      getRowKey={(a) => a.axleIndex}
      columns={[
        { key: 'axle', header: 'Axle', rowHeader: true, cell: (a) => axleLabel(a.label) },
        { key: 'ms', header: 'Sprung mass', unit: 'kg', numeric: true, cell: (a) => formatNumber(a.corner.sprungMassKg) },
        { key: 'mu', header: 'Unsprung mass', unit: 'kg', numeric: true, cell: (a) => formatNumber(a.corner.unsprungMassKg) },
        { key: 'ks', header: 'Spring rate', unit: 'kN/m', numeric: true, cell: (a) => formatNumber(a.corner.springRateNPerM / 1000, 1) },
        { key: 'cs', header: 'Damping', unit: 'N·s/m', numeric: true, cell: (a) => formatNumber(a.corner.dampingNsPerM) },
        { key: 'kt', header: 'Tyre rate', unit: 'kN/m', numeric: true, cell: (a) => formatNumber(a.corner.tireRateNPerM / 1000, 0) },
        { key: 'life', header: 'Rated life', unit: 'km', numeric: true, cell: (a) => formatNumber(a.ratedDamperLifeKm) },
        { key: 'fb', header: exact ? 'Body bounce' : 'Body bounce ≈', unit: 'Hz', numeric: true, cell: (a) => formatNumber(a.modes?.bodyHz ?? bodyBounceHz(a.corner), 2) },
        { key: 'zeta', header: exact ? 'Body damping ratio' : 'Body damping ratio ≈', unit: '%', numeric: true, cell: (a) => formatNumber((a.modes?.bodyDampingRatio ?? dampingRatio(a.corner)) * 100, 0) },
        { key: 'fw', header: exact ? 'Wheel hop' : 'Wheel hop ≈', unit: 'Hz', numeric: true, cell: (a) => formatNumber(a.modes?.wheelHz ?? wheelHopHz(a.corner), 1) },
      ]}
      footer={
        exact
          ? 'Values per corner, at the wheel. Body bounce, body damping ratio and wheel hop are the modes of the two-mass model the wear model uses, as the spec editor shows them.'
          : 'Values per corner, at the wheel. Figures marked ≈ are one-mass approximations for a quick check; the wear model uses the full two-mass equations.'
      }
    />
  );
}
