import 'leaflet/dist/leaflet.css';
import { useEffect, useState } from 'react';
import L from 'leaflet';
import { Link } from 'react-router';
import { MapContainer, Polyline, useMap } from 'react-leaflet';
import { BaseLayer } from '@/components/map/base-layer';
import { Button } from '@/components/ui/button';
import { EmptyState } from '@/components/ui/empty-state';
import { ErrorState } from '@/components/ui/error-state';
import { LoadingState } from '@/components/ui/loading-state';
import { Notice } from '@/components/ui/notice';
import { RoughnessClassBadge, RoughnessLegend } from '@/components/ui/roughness';
import { Section } from '@/components/ui/section';
import { SimpleTable } from '@/components/ui/simple-table';
import { isApiError } from '@/lib/api-client';
import { cx } from '@/lib/class-names';
import { formatDateTime, formatNumber } from '@/lib/format';
import { acceptedClassText } from '@/lib/ride-decision';
import { useRideReportGroups, type RideReportGroup } from '../api/get-ride-report-groups';
import { useRideReports } from '../api/get-ride-reports';
import { useRideScale } from '../api/get-ride-scale';
import { useAcceptRideReport, type AcceptResult } from '../api/accept-ride-report';
import { useDismissRideReport } from '../api/dismiss-ride-report';
import { photoUrl, type RideReport } from '../api/ride-report-keys';
import { RideReportLayer } from './ride-report-layer';
import { ReportStatusBadge, SeverityBadge } from './report-status';

const gd = (v: number | null) => (v === null ? '—' : `${formatNumber(v * 1e6, 0)} × 10⁻⁶ m³`);

function FitGroups({ groups, selected }: { groups: RideReportGroup[]; selected: RideReportGroup | null }) {
  const map = useMap();
  useEffect(() => {
    const b = L.latLngBounds([]);
    for (const g of selected ? [selected] : groups) for (const [lon, lat] of g.coords) b.extend([lat, lon]);
    if (b.isValid()) map.fitBounds(b, { padding: [30, 30], maxZoom: selected ? 15 : 13 });
  }, [map, groups, selected]);
  return null;
}

function ReportCard({ r, onDone }: { r: RideReport; onDone: (msg: { tone: 'ok' | 'error'; text: string }) => void }) {
  const scale = useRideScale();
  const accept = useAcceptRideReport();
  const dismiss = useDismissRideReport();
  const [dismissing, setDismissing] = useState(false);
  const [reason, setReason] = useState('');
  const [reasonError, setReasonError] = useState<string | null>(null);
  const felt = (k: string) => scale.data?.felt.find((f) => f.key === k)?.label ?? k;
  const afterAccept = (res: AcceptResult) =>
    onDone({
      tone: 'ok',
      text: `Accepted report #${r.id}. ${r.routeName}, segment ${(r.segmentSeq ?? 0) + 1}: ${acceptedClassText(res.report)}, Gd(n0) ${gd(res.segmentBefore.gdN0)} → ${gd(res.segmentAfter.gdN0)}. The driver is told by e-mail if they want it.`,
    });
  return (
    <li className="rounded-md border border-line bg-surface p-3" data-testid="review-report">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <span className="font-medium text-ink">
          {r.driverName ?? 'A driver'}
          {r.fleetNumber ? <span className="text-slate"> · {r.fleetNumber}</span> : null}
        </span>
        <SeverityBadge level={r.severity} />
      </div>
      <p className="text-sm text-slate">
        {formatDateTime(r.reportedAt)} · placed {formatNumber(r.snapDistanceM, 0)} m from the {r.positionSource === 'gps' ? 'phone’s position' : 'tapped point'}
        {r.accuracyM !== null ? ` (±${formatNumber(r.accuracyM, 0)} m)` : ''}
      </p>
      {r.felt.length ? <p className="mt-1 text-sm text-ink">Felt: {r.felt.map(felt).join(', ')}</p> : null}
      {r.note ? <p className="mt-1 text-sm text-ink">“{r.note}”</p> : null}
      {r.hasPhoto ? (
        <a href={photoUrl(r.id)} target="_blank" rel="noreferrer" className="mt-2 block w-fit">
          <img src={photoUrl(r.id)} alt={`Photo with report #${r.id}`} className="h-28 max-w-full rounded border border-line object-cover" />
        </a>
      ) : null}
      {dismissing ? (
        <div className="mt-3 flex flex-col gap-2">
          <label className="text-sm font-medium text-ink" htmlFor={`reason-${r.id}`}>
            Why is it dismissed? (the driver sees this)
          </label>
          <input id={`reason-${r.id}`} value={reason} onChange={(e) => setReason(e.target.value)} maxLength={500} className="h-11 rounded-md border border-line-strong bg-surface px-3" placeholder="e.g. resurfaced on 20 November" />
          {reasonError ? <p className="text-sm text-overdue">{reasonError}</p> : null}
          <div className="flex gap-2">
            <Button
              variant="danger"
              busy={dismiss.isPending}
              onClick={() => {
                if (reason.trim().length < 3) return setReasonError('Say briefly why (at least 3 characters).');
                dismiss.mutate({ id: r.id, reason }, { onSuccess: () => onDone({ tone: 'ok', text: `Dismissed report #${r.id}.` }), onError: (e) => setReasonError(isApiError(e) ? (e.fields.reason ?? e.message) : 'Not saved.') });
              }}
            >
              Dismiss report
            </Button>
            <Button variant="quiet" onClick={() => setDismissing(false)}>
              Back
            </Button>
          </div>
        </div>
      ) : (
        <div className="mt-3 flex flex-wrap gap-2">
          <Button variant="primary" busy={accept.isPending} onClick={() => accept.mutate({ id: r.id, note: null }, { onSuccess: afterAccept, onError: (e) => onDone({ tone: 'error', text: e.message }) })}>
            Accept
          </Button>
          <Button variant="secondary" onClick={() => setDismissing(true)}>
            Dismiss…
          </Button>
        </div>
      )}
    </li>
  );
}

function GroupReports({ group, onDone }: { group: RideReportGroup; onDone: (m: { tone: 'ok' | 'error'; text: string }) => void }) {
  const list = useRideReports({ status: 'new', segmentId: group.segmentId, pageSize: 50, sort: '-severity' });
  if (list.isPending) return <LoadingState label="Loading the reports…" />;
  if (list.error) return <ErrorState error={list.error} what="the reports" />;
  return (
    <ul className="mt-3 flex flex-col gap-3">
      {list.data.items.map((r) => (
        <ReportCard key={r.id} r={r} onDone={onDone} />
      ))}
    </ul>
  );
}

/** The manager's review of drivers' reports: new ones grouped by segment, on a list and a map; accept or dismiss each. */
export function ReviewBoard({ routePath, initialReportId }: { routePath: (id: number) => string; initialReportId?: number | null }) {
  const groups = useRideReportGroups('new');
  const scale = useRideScale();
  const decided = useRideReports({ pageSize: 10, sort: '-reportedAt', status: undefined });
  const [selected, setSelected] = useState<number | null>(null);
  const [message, setMessage] = useState<{ tone: 'ok' | 'error'; text: string } | null>(null);

  useEffect(() => {
    if (selected === null && initialReportId && groups.data) {
      const g = groups.data.items.find((x) => x.reportIds.includes(initialReportId));
      if (g) setSelected(g.segmentId);
    }
  }, [initialReportId, groups.data, selected]);

  if (groups.isPending) return <LoadingState label="Loading drivers’ reports…" />;
  if (groups.error) return <ErrorState error={groups.error} what="drivers’ reports" onRetry={() => void groups.refetch()} />;
  const sel = groups.data.items.find((g) => g.segmentId === selected) ?? null;
  const recent = (decided.data?.items ?? []).filter((r) => r.status !== 'new');

  return (
    <div className="flex flex-col gap-6">
      {message ? (
        <Notice tone={message.tone} title={message.tone === 'ok' ? 'Done' : 'Not done'}>
          <span data-testid="review-message">{message.text}</span>
        </Notice>
      ) : null}
      <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_minmax(0,1.1fr)]">
        <Section title={`New reports by segment (${groups.data.total})`} description="Worst first. Open a segment to see each report, its photo, and decide.">
          {!groups.data.items.length ? (
            <EmptyState title="Nothing to review">New reports from drivers appear here and on the map.</EmptyState>
          ) : (
            <ul className="flex flex-col gap-2" aria-label="Segments with new reports">
              {groups.data.items.map((g) => (
                <li key={g.segmentId} className={cx('rounded-md border bg-surface p-3', g.segmentId === selected ? 'border-accent' : 'border-line')}>
                  <button type="button" className="flex w-full flex-wrap items-center justify-between gap-2 text-left" aria-expanded={g.segmentId === selected} onClick={() => setSelected(g.segmentId === selected ? null : g.segmentId)}>
                    <span>
                      <span className="block font-semibold text-ink">{g.routeName}</span>
                      <span className="block text-sm text-slate">
                        Segment {g.seq + 1}, {formatNumber(g.startM / 1000, 1)}–{formatNumber(g.endM / 1000, 1)} km · {g.count} report{g.count === 1 ? '' : 's'}
                      </span>
                    </span>
                    <span className="flex items-center gap-2">
                      <RoughnessClassBadge value={g.isoClass} />
                      <SeverityBadge level={g.maxSeverity} />
                    </span>
                  </button>
                  {g.segmentId === selected ? (
                    <>
                      <p className="mt-2 text-sm text-slate" data-testid="segment-roughness">
                        Now: class {g.isoClass ?? '—'}, Gd(n0) {gd(g.gdN0)}. <Link className="link" to={routePath(g.routeId)}>Open the route</Link>
                      </p>
                      <GroupReports group={g} onDone={setMessage} />
                    </>
                  ) : null}
                </li>
              ))}
            </ul>
          )}
        </Section>
        <div className="min-w-0">
          <div className="h-72 overflow-hidden rounded-md border border-line lg:h-[28rem]" data-testid="review-map">
            <MapContainer preferCanvas center={[52.56, -1.4]} zoom={10} className="h-full w-full">
              <BaseLayer />
              {groups.data.items.map((g) => (
                <Polyline key={g.segmentId} positions={g.coords.map(([lon, lat]) => [lat, lon] as [number, number])} pathOptions={{ color: g.segmentId === selected ? '#D9622B' : '#1E2A32', weight: g.segmentId === selected ? 7 : 4 }} />
              ))}
              <RideReportLayer onSelect={setSelected} />
              <FitGroups groups={groups.data.items} selected={sel} />
            </MapContainer>
          </div>
          <p className="mt-2 text-xs text-slate">Markers: one per segment; larger with more reports; solid outline when the worst is severe. Click one to open it.</p>
          <RoughnessLegend className="mt-2" unknown={false} />
        </div>
      </div>
      {scale.data ? <Notice title="How an accepted report changes the road">{scale.data.estimateRule} A newer survey or hand-set class replaces it.</Notice> : null}
      <Section title="Recent decisions">
        {recent.length ? (
          <SimpleTable
            label="Recent decisions"
            rows={recent}
            columns={[
              { key: 'when', header: 'Reported', cell: (r) => formatDateTime(r.reportedAt) },
              { key: 'where', header: 'Where', rowHeader: true, cell: (r) => `${r.routeName}, segment ${(r.segmentSeq ?? 0) + 1}` },
              { key: 'by', header: 'Driver', cell: (r) => r.driverName ?? '—' },
              { key: 'status', header: 'Decision', cell: (r) => <ReportStatusBadge status={r.status} /> },
              { key: 'why', header: 'Result', cell: (r) => (r.status === 'accepted' ? acceptedClassText(r) : r.dismissReason) },
            ]}
          />
        ) : (
          <p className="text-sm text-slate">No decisions yet.</p>
        )}
      </Section>
    </div>
  );
}
