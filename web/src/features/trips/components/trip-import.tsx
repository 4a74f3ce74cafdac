import { Button } from '@/components/ui/button';
import { FileRefusal } from '@/components/ui/file-refusal';
import { ScrollTable } from '@/components/ui/scroll-table';
import { CsvFileField } from '@/components/ui/field';
import { StatusBadge } from '@/components/ui/status-badge';
import { formatDateTime, formatNumber } from '@/lib/format';
import { useFileCheck } from '@/lib/use-file-check';
import { useImportTrips, type ImportReport } from '../api/import-trips';

export function TripLayoutHelp() {
  return (
    <details className="text-sm text-slate" open>
      <summary className="cursor-pointer font-medium text-ink">Trip file layout</summary>
      <p className="mt-1">
        A CSV text file (UTF-8, commas) with a header row naming the columns, in any order: <code>vehicle</code> (fleet number), <code>route</code> (route name as in Reboundry),{' '}
        <code>driver_email</code> (sign-in e-mail, may be empty), <code>start</code> and <code>end</code> (ISO 8601 date-times; without an offset they are UTC), <code>distance_km</code> [km],{' '}
        <code>mean_speed_kmh</code> [km/h], and optionally <code>payload_kg</code> [kg]. Up to 10 000 rows, 5 MB. The whole file is imported or none of it.
      </p>
      <pre className="mt-1 overflow-x-auto rounded bg-mist p-2 text-xs">vehicle,route,driver_email,start,end,distance_km,mean_speed_kmh,payload_kg{'\n'}CV-101,Tanner Way town loop,driver@reboundry.test,2026-11-02T07:30:00Z,2026-11-02T08:05:00Z,14.1,31.5,420</pre>
    </details>
  );
}

/** Check a telematics export row by row, then import all of it or nothing. */
export function TripImport() {
  const m = useImportTrips();
  const { file, report, setReport, saved: done, setSaved: setDone, pick } = useFileCheck<ImportReport, number>(() => m.reset());
  return (
    <div className="flex flex-col gap-3">
      <TripLayoutHelp />
      <div className="flex flex-wrap items-end gap-3">
        <CsvFileField label="Trip file (CSV)" onPick={pick} />
        <Button disabled={!file} busy={m.isPending && !report} onClick={() => file && m.mutate({ file, preview: true }, { onSuccess: (d) => setReport(d as ImportReport) })}>
          Check file
        </Button>
        <Button
          variant="primary"
          disabled={!file || !report || report.bad > 0}
          busy={m.isPending && Boolean(report)}
          onClick={() =>
            file &&
            m.mutate(
              { file, preview: false },
              {
                onSuccess: (d) => {
                  setDone((d as { imported: number }).imported);
                  setReport(null);
                },
              },
            )
          }
        >
          Import trips
        </Button>
      </div>
      <FileRefusal error={m.error} />
      {done !== null ? <p role="status" className="rounded-md border border-ok/40 bg-ok-tint p-3 text-sm">Imported {formatNumber(done)} trips. The nightly run adds them to damper wear.</p> : null}
      {report ? (
        <section aria-label="Import report">
          <p className="text-sm font-medium" role="status">
            {report.bad === 0 ? `All ${report.total} rows are fine. Press Import trips to add them.` : `${report.bad} of ${report.total} rows have problems. Nothing will be imported until the file is fixed.`}
          </p>
          <ScrollTable
            label="Rows of the trip file"
            height="max-h-96"
            head={[{ label: 'Row', numeric: true }, { label: 'Check' }, { label: 'Vehicle' }, { label: 'Route' }, { label: 'Start' }, { label: 'Distance [km]', numeric: true }, { label: 'Problems' }]}
          >
            {report.rows.map((r) => (
              <tr key={r.row} className="border-t border-line align-top">
                <td className="px-2 py-1 text-right tabular-nums">{r.row}</td>
                <td className="px-2 py-1">{r.ok ? <StatusBadge tone="ok">Fine</StatusBadge> : <StatusBadge tone="overdue">Problem</StatusBadge>}</td>
                <td className="px-2 py-1">{r.trip.fleetNumber}</td>
                <td className="px-2 py-1">{r.trip.routeName}</td>
                <td className="px-2 py-1 whitespace-nowrap">{formatDateTime(r.trip.startedAt)}</td>
                <td className="px-2 py-1 text-right tabular-nums">{formatNumber(r.trip.distanceKm, 1)}</td>
                <td className="px-2 py-1 text-overdue">{r.problems.join('; ')}</td>
              </tr>
            ))}
          </ScrollTable>
        </section>
      ) : null}
    </div>
  );
}
