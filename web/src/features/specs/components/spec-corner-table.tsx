import { SimpleTable } from '@/components/ui/simple-table';
import { formatNumber } from '@/lib/format';
import { axleLabel, bodyBounceHz, dampingRatio, wheelHopHz, type SpecAxle } from '@/lib/suspension';

/**
 * A spec's corner parameters per axle, with units, and the figures an engineer checks them by
 * (body bounce, wheel hop, damping ratio), marked as approximations.
 */
export function SpecCornerTable({ axles, label = 'Corner parameters per axle' }: { axles: SpecAxle[]; label?: string }) {
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
        { key: 'fb', header: 'Body bounce ≈', unit: 'Hz', numeric: true, cell: (a) => formatNumber(bodyBounceHz(a.corner), 2) },
        { key: 'fw', header: 'Wheel hop ≈', unit: 'Hz', numeric: true, cell: (a) => formatNumber(wheelHopHz(a.corner), 1) },
        { key: 'zeta', header: 'Damping ratio ≈', unit: '%', numeric: true, cell: (a) => formatNumber(dampingRatio(a.corner) * 100, 0) },
      ]}
      footer="Values per corner, at the wheel. Figures marked ≈ are one-mass approximations for a quick check; the wear model uses the full two-mass equations."
    />
  );
}
