import { useEffect, useRef, useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { Button } from '@/components/ui/button';
import { EmptyState } from '@/components/ui/empty-state';
import { LoadingState } from '@/components/ui/loading-state';
import { NewerOlder } from '@/components/ui/newer-older';
import { Notice } from '@/components/ui/notice';
import { Section } from '@/components/ui/section';
import { SimpleTable, type SimpleColumn } from '@/components/ui/simple-table';
import { StatusBadge, type StatusTone } from '@/components/ui/status-badge';
import { QueryState } from '@/components/ui/query-state';
import { isApiError } from '@/lib/api-client';
import { formatDate, formatDateTime, formatNumber } from '@/lib/format';
import { useJobRun } from '../api/get-job-run';
import { useJobRuns, type JobRun } from '../api/get-job-runs';
import { useRunNightly } from '../api/run-nightly';

const statusTone: Record<string, StatusTone> = { running: 'watch', succeeded: 'ok', completed_with_errors: 'due', failed: 'overdue', cancelled: 'neutral' };
const statusLabel: Record<string, string> = { running: 'Running', succeeded: 'Succeeded', completed_with_errors: 'Done, with errors', failed: 'Failed', cancelled: 'Cancelled' };
const triggerLabel: Record<string, string> = { schedule: 'Schedule', cli: 'Command line', manual: 'Run now', test: 'Test', seed: 'After demo set-up' };
const phaseLabel: Record<string, string> = { starting: 'Starting', duty: 'Duty of trips', wear: 'Damper wear', predictions: 'Predictions', scheduling: 'Scheduling inspections', mail: 'Sending e-mail', finished: 'Finished' };

const n = (r: JobRun, k: string) => formatNumber(r.counts[k] ?? 0);

const columns: SimpleColumn<JobRun>[] = [
  { key: 'id', header: 'Run', rowHeader: true, cell: (r) => `#${r.id}` },
  { key: 'status', header: 'Status', cell: (r) => <StatusBadge tone={statusTone[r.status] ?? 'neutral'}>{statusLabel[r.status] ?? r.status}</StatusBadge> },
  { key: 'started', header: 'Started', cell: (r) => <span className="whitespace-nowrap">{formatDateTime(r.startedAt)}</span> },
  { key: 'by', header: 'Started by', cell: (r) => (r.requestedBy ? r.requestedBy.name : triggerLabel[r.trigger] ?? r.trigger) },
  { key: 'asOf', header: 'As of', cell: (r) => <span className="whitespace-nowrap">{formatDate(r.asOf)}</span> },
  { key: 'duration', header: 'Duration', unit: 's', numeric: true, cell: (r) => (r.durationS === null ? '…' : formatNumber(r.durationS, 1)) },
  { key: 'trips', header: 'Trips', numeric: true, cell: (r) => n(r, 'trips') },
  { key: 'segments', header: 'Segments', numeric: true, cell: (r) => n(r, 'segments') },
  { key: 'duties', header: 'Duty records', numeric: true, cell: (r) => n(r, 'dutyRecords') },
  { key: 'insp', header: 'Inspections created', numeric: true, cell: (r) => n(r, 'inspectionsCreated') },
  { key: 'mail', header: 'E-mails sent', numeric: true, cell: (r) => n(r, 'mailsSent') },
  { key: 'errors', header: 'Errors', numeric: true, cell: (r) => formatNumber(r.errorCount) },
];

function Progress({ runId }: { runId: number }) {
  const run = useJobRun(runId);
  const queryClient = useQueryClient();
  const wasRunning = useRef(false);
  const status = run.data?.status;
  useEffect(() => {
    // A finished run changes wear, inspections and mail everywhere: refetch what is cached.
    if (status === 'running') wasRunning.current = true;
    else if (status && wasRunning.current) {
      wasRunning.current = false;
      void queryClient.invalidateQueries();
    }
  }, [status, queryClient]);
  if (!run.data) return <LoadingState label="Starting the run…" />;
  const r = run.data;
  const pct = r.progressTotal > 0 ? Math.min(100, Math.round((r.progressDone / r.progressTotal) * 100)) : r.status === 'running' ? 0 : 100;
  return (
    <div className="rounded-md border border-line bg-surface p-4" aria-live="polite">
      <div className="flex flex-wrap items-center gap-3">
        <p className="font-semibold text-ink">Run #{r.id}</p>
        <StatusBadge tone={statusTone[r.status] ?? 'neutral'}>{statusLabel[r.status] ?? r.status}</StatusBadge>
        {r.status === 'running' ? <p className="text-sm text-slate">{phaseLabel[r.phase ?? ''] ?? r.phase}</p> : null}
      </div>
      {r.status === 'running' ? (
        <div className="mt-3">
          <div className="h-2 w-full overflow-hidden rounded-full bg-mist" role="progressbar" aria-valuenow={pct} aria-valuemin={0} aria-valuemax={100} aria-label="Progress of the run">
            <div className="h-full bg-accent transition-[width]" style={{ width: `${pct}%` }} />
          </div>
          <p className="mt-1 text-sm text-slate">
            {formatNumber(r.progressDone)} of {formatNumber(r.progressTotal)} {r.phase === 'duty' ? 'trips' : 'items'}. You can leave this page; the run carries on.
          </p>
        </div>
      ) : (
        <p className="mt-2 text-sm text-ink">
          {n(r, 'trips')} trips, {n(r, 'dutyRecords')} duty records, {n(r, 'inspectionsCreated')} inspections created, {n(r, 'mailsSent')} e-mails sent
          {r.durationS !== null ? ` in ${formatNumber(r.durationS, 1)} s` : ''}.{r.message ? ` ${r.message}` : ''}
        </p>
      )}
    </div>
  );
}

/** History of nightly runs, with "run now" and live progress. */
export function JobRuns() {
  const [page, setPage] = useState(1);
  const runs = useJobRuns(page);
  const start = useRunNightly();
  const [current, setCurrent] = useState<number | null>(null);
  const running = runs.data?.items.find((r) => r.status === 'running');
  const watching = current ?? running?.id ?? null;

  return (
    <>
      <Section
        title="Nightly damper-duty run"
        description="Turns new trips into damper duty, updates wear and predictions, schedules inspections and sends e-mail. It runs on its own every night; run it now after importing trips or changing roughness."
        actions={
          <Button
            variant="primary"
            busy={start.isPending}
            disabled={!!running}
            onClick={() => start.mutate({}, { onSuccess: (b) => setCurrent(b.runId) })}
          >
            Run now
          </Button>
        }
      >
        {start.error ? (
          <Notice tone="error" title="The run did not start" className="mb-3">
            {isApiError(start.error) ? start.error.message : 'Try again.'}
          </Notice>
        ) : null}
        {watching !== null ? <Progress runId={watching} /> : <p className="text-sm text-slate">No run in progress.</p>}
      </Section>

      <Section title="History">
        <QueryState query={runs} loading="Loading runs…" what="the run history" retry>
          {(data) =>
            !data.items.length ? (
              <EmptyState title="No runs yet">The first run happens tonight, or press “Run now”.</EmptyState>
            ) : (
              <>
                <SimpleTable label="Job runs" columns={columns} rows={data.items} />
                <NewerOlder page={page} pageSize={25} total={data.total} onStep={(by) => setPage((p) => p + by)} count={`${formatNumber(data.total)} run${data.total === 1 ? '' : 's'}`} />
                <RunErrors runs={data.items} />
              </>
            )
          }
        </QueryState>
      </Section>
    </>
  );
}

function RunErrors({ runs }: { runs: JobRun[] }) {
  const withErrors = runs.filter((r) => r.errorCount > 0 || r.message);
  if (!withErrors.length) return null;
  return (
    <div className="mt-6 space-y-2">
      <h3 className="text-base font-semibold text-ink">Errors and messages</h3>
      {withErrors.map((r) => (
        <RunErrorDetails key={r.id} run={r} />
      ))}
    </div>
  );
}

function RunErrorDetails({ run }: { run: JobRun }) {
  const [open, setOpen] = useState(false);
  const detail = useJobRun(open ? run.id : null);
  return (
    <details className="rounded-md border border-line bg-surface px-3 py-2" onToggle={(e) => setOpen((e.target as HTMLDetailsElement).open)}>
      <summary className="cursor-pointer text-sm text-ink">
        Run #{run.id}: {formatNumber(run.errorCount)} item error{run.errorCount === 1 ? '' : 's'}
        {run.message ? ` — ${run.message}` : ''}
      </summary>
      {detail.data ? (
        <ul className="mt-2 space-y-1 text-sm">
          {detail.data.errors.map((e, i) => (
            <li key={i}>
              <span className="font-medium">{e.item}</span>: {e.message}
            </li>
          ))}
        </ul>
      ) : open ? (
        <LoadingState label="Loading errors…" />
      ) : null}
    </details>
  );
}
