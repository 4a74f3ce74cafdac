import './work-record-print.css';
import { Button } from '@/components/ui/button';
import { Facts } from '@/components/ui/facts';
import { SimpleTable } from '@/components/ui/simple-table';
import { formatDate, formatNumber } from '@/lib/format';
import type { WorkRecord } from '../api/types';

/** A work record laid out to print on one page (see the print rules in index.css: `.print-sheet`). */
export function WorkRecordSheet({ record }: { record: WorkRecord }) {
  return (
    <article className="print-sheet" aria-label={`Work record ${record.id}`}>
      <div className="mb-4 flex items-start justify-between gap-3">
        <div>
          <h1 className="text-2xl font-semibold">Work record {record.id}</h1>
          <p className="text-slate">
            {record.vehicle.fleetNumber} · {record.vehicle.plate} · {record.vehicle.specName} · {record.vehicle.depotName}
          </p>
        </div>
        <Button className="no-print" onClick={() => window.print()}>
          Print
        </Button>
      </div>
      <Facts
        items={[
          { label: 'Date', value: formatDate(record.performedAt) },
          { label: 'Odometer [km]', value: formatNumber(record.odometerKm), numeric: true },
          { label: 'Mechanic', value: record.mechanic?.name ?? '—' },
          { label: 'Labour [h]', value: formatNumber(record.labourHours, 1), numeric: true },
          { label: 'Parts [£]', value: formatNumber(record.partsCost, 2), numeric: true },
          { label: 'Inspection', value: record.inspectionId ? `#${record.inspectionId}` : '—' },
        ]}
      />
      <p className="my-3">{record.summary}</p>
      <SimpleTable
        label="Parts replaced"
        rows={record.items}
        getRowKey={(i) => `${i.position}-${i.component}`}
        columns={[
          { key: 'p', header: 'Corner', cell: (i) => i.position, rowHeader: true },
          { key: 'c', header: 'Part', cell: (i) => i.component },
          { key: 'd', header: 'Description', cell: (i) => i.partDescription },
          { key: 'n', header: 'Part number', cell: (i) => i.partNumber ?? '—' },
          { key: 'r', header: 'Removed because', cell: (i) => i.removalReason },
          { key: 'cost', header: 'Cost', unit: '£', numeric: true, cell: (i) => formatNumber(i.cost, 2) },
        ]}
      />
      {record.notes ? <p className="mt-3 text-sm">{record.notes}</p> : null}
      <p className="mt-6 text-sm text-slate">Signed (mechanic): ______________________ Date: ____________</p>
    </article>
  );
}
