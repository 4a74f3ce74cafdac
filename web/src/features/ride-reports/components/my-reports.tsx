import { Link } from 'react-router';
import { EmptyState } from '@/components/ui/empty-state';
import { ErrorState } from '@/components/ui/error-state';
import { LoadingState } from '@/components/ui/loading-state';
import { formatDateTime, formatNumber } from '@/lib/format';
import { useRideReports } from '../api/get-ride-reports';
import { useRideScale } from '../api/get-ride-scale';
import { photoUrl } from '../api/ride-report-keys';
import { ReportStatusBadge, SeverityBadge } from './report-status';

/** A driver's own reports, newest first, with what became of each. */
export function MyReports({ reportPath }: { reportPath: string }) {
  const list = useRideReports({ pageSize: 50, sort: '-reportedAt' });
  const scale = useRideScale();
  if (list.isPending) return <LoadingState label="Loading your reports…" />;
  if (list.error) return <ErrorState error={list.error} what="your reports" onRetry={() => void list.refetch()} />;
  if (!list.data.items.length)
    return (
      <EmptyState title="No reports yet" action={<Link className="link" to={reportPath}>Report a rough stretch</Link>}>
        When a stretch of road rides badly, report it from the road — when it is safe to do so.
      </EmptyState>
    );
  const felt = (k: string) => scale.data?.felt.find((f) => f.key === k)?.label ?? k;
  return (
    <ul className="flex flex-col gap-3" aria-label="My reports">
      {list.data.items.map((r) => (
        <li key={r.id} className="rounded-md border border-line bg-surface p-3" data-testid="my-report">
          <div className="flex flex-wrap items-center justify-between gap-2">
            <span className="font-semibold text-ink">{r.routeName}</span>
            <ReportStatusBadge status={r.status} />
          </div>
          <p className="text-sm text-slate">
            Segment {(r.segmentSeq ?? 0) + 1}, {formatNumber((r.segmentStartM ?? 0) / 1000, 1)}–{formatNumber((r.segmentEndM ?? 0) / 1000, 1)} km · {formatDateTime(r.reportedAt)}
          </p>
          <div className="mt-2 flex flex-wrap items-center gap-2 text-sm">
            <SeverityBadge level={r.severity} />
            {r.felt.map((k) => (
              <span key={k} className="rounded-full border border-line px-2 py-0.5 text-xs text-ink">{felt(k)}</span>
            ))}
          </div>
          {r.note ? <p className="mt-2 text-sm text-ink">“{r.note}”</p> : null}
          {r.hasPhoto ? (
            <a href={photoUrl(r.id)} target="_blank" rel="noreferrer" className="mt-2 block w-fit rounded">
              <img src={photoUrl(r.id)} alt={`Your photo with the report on ${r.routeName}, ${formatDateTime(r.reportedAt)}`} loading="lazy" className="h-28 max-w-full rounded border border-line object-cover" />
            </a>
          ) : null}
          {r.status === 'accepted' ? (
            <p className="mt-2 text-sm text-ink">Accepted{r.decidedByName ? ` by ${r.decidedByName}` : ''}. It is now part of the road record: this segment’s roughness class is {r.segmentClass ?? '—'}{r.classBefore && r.classBefore !== r.segmentClass ? ` (was ${r.classBefore})` : ''}.</p>
          ) : null}
          {r.status === 'dismissed' ? <p className="mt-2 text-sm text-ink">Not added{r.decidedByName ? ` by ${r.decidedByName}` : ''}: {r.dismissReason}</p> : null}
        </li>
      ))}
    </ul>
  );
}
