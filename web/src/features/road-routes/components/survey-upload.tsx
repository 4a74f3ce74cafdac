import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { FileRefusal } from '@/components/ui/file-refusal';
import { CsvFileField, TextField } from '@/components/ui/field';
import { RoughnessClassBadge } from '@/components/ui/roughness';
import { ScrollTable } from '@/components/ui/scroll-table';
import { formatNumber } from '@/lib/format';
import { useFileCheck } from '@/lib/use-file-check';
import { useUploadSurvey, type SurveyResult } from '../api/upload-survey';

export function ProfileLayoutHelp() {
  return (
    <details className="text-sm text-slate" open>
      <summary className="cursor-pointer font-medium text-ink">Profile file layout</summary>
      <p className="mt-1">A CSV text file with the header <code>distance_m,elevation_m</code>, then one row per point: distance along the route in metres, elevation in metres. Distances rise in one even step of at most 0.3 m (0.25 m is usual); at least 20 m. Lines starting with # are skipped. Up to 40 MB.</p>
      <pre className="mt-1 rounded bg-mist p-2 text-xs">distance_m,elevation_m{'\n'}0.00,0.000000{'\n'}0.25,0.000412{'\n'}0.50,0.000371</pre>
    </details>
  );
}

/** Upload a longitudinal profile: preview IRI per segment, then save it as survey observations. */
export function SurveyUpload({ routeId, today }: { routeId: number; today: string }) {
  // empty: the server dates the survey today
  const [surveyedOn, setSurveyedOn] = useState('');
  const m = useUploadSurvey(routeId);
  const { file, report: preview, setReport: setPreview, saved, setSaved, pick } = useFileCheck<SurveyResult, number>(() => m.reset());

  const run = (previewOnly: boolean) => {
    if (!file) return;
    m.mutate(
      { file, preview: previewOnly, surveyedOn: surveyedOn || undefined },
      {
        onSuccess: (d) => {
          if (previewOnly) setPreview(d);
          else {
            setPreview(null);
            setSaved(d.segments.length);
          }
        },
      },
    );
  };

  return (
    <div className="flex flex-col gap-3">
      <ProfileLayoutHelp />
      <div className="flex flex-wrap items-end gap-3">
        <CsvFileField label="Profile file (CSV)" onPick={pick} />
        <TextField label="Surveyed on" aside="(default today)" type="date" value={surveyedOn} max={today} onChange={(e) => setSurveyedOn(e.target.value)} />
        <Button onClick={() => run(true)} disabled={!file} busy={m.isPending && !preview}>
          Preview IRI
        </Button>
        <Button variant="primary" onClick={() => run(false)} disabled={!file || !preview} busy={m.isPending && Boolean(preview)}>
          Save survey
        </Button>
      </div>
      <FileRefusal error={m.error} />
      {saved !== null ? (
        <p role="status" className="rounded-md border border-ok/40 bg-ok-tint p-3 text-sm">
          Survey saved: {saved} segments now carry the measured IRI where it is the newest value.
        </p>
      ) : null}
      {preview ? (
        <div>
          <p className="text-sm">
            {formatNumber(preview.summary.pointCount)} points every {formatNumber(preview.summary.dxM, 3)} m from {formatNumber(preview.summary.startM, 1)} m to {formatNumber(preview.summary.endM, 1)} m: IRI for {preview.summary.segmentCount} of {preview.summary.routeSegmentCount} segments. Nothing is saved until you press Save survey.
          </p>
          <ScrollTable
            label="Survey preview"
            height="max-h-72"
            head={[{ label: 'Segment' }, { label: 'From [km]', numeric: true }, { label: 'IRI [m/km]', numeric: true }, { label: 'Class' }, { label: 'Now' }]}
          >
            {preview.segments.map((s) => (
              <tr key={s.segmentId} className="border-t border-line">
                <td className="px-2 py-1">{s.seq + 1}</td>
                <td className="px-2 py-1 text-right tabular-nums">{formatNumber(s.startM / 1000, 2)}</td>
                <td className="px-2 py-1 text-right tabular-nums">{formatNumber(s.iri, 2)}</td>
                <td className="px-2 py-1"><RoughnessClassBadge value={s.isoClass} /></td>
                <td className="px-2 py-1 text-slate">{s.previous.isoClass ?? '—'}{s.previous.iri !== null ? ` (${formatNumber(s.previous.iri, 2)} m/km)` : ''}</td>
              </tr>
            ))}
          </ScrollTable>
        </div>
      ) : null}
    </div>
  );
}
