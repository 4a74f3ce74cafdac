import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { EmptyState } from '@/components/ui/empty-state';
import { ErrorState } from '@/components/ui/error-state';
import { LoadingState } from '@/components/ui/loading-state';
import { NewerOlder } from '@/components/ui/newer-older';
import { Notice } from '@/components/ui/notice';
import { cx } from '@/lib/class-names';
import { formatDateTime, formatNumber } from '@/lib/format';
import { useOutboxMessage } from '../api/get-outbox-message';
import { useOutbox } from '../api/get-outbox';

/** Mail the app sent, as the built-in mail catcher received it: a list and the chosen message. */
export function OutboxView() {
  const [page, setPage] = useState(1);
  const [selected, setSelected] = useState<number | null>(null);
  const list = useOutbox(page, '');
  const message = useOutboxMessage(selected);
  const [view, setView] = useState<'html' | 'text'>('html');

  if (list.isPending) return <LoadingState label="Loading the outbox…" />;
  if (list.error) return <ErrorState error={list.error} what="the outbox" onRetry={() => void list.refetch()} />;
  const data = list.data;

  return (
    <>
      <Notice className="mb-4" title={data.catches ? 'Mail stays on this machine' : 'Mail goes to a real server'}>
        E-mail goes through {data.transport}. Sent: {formatNumber(data.sent.sent)}, waiting: {formatNumber(data.sent.pending)},{' '}
        {data.sent.sending > 0 && <>being sent now: {formatNumber(data.sent.sending)}, </>}failed: {formatNumber(data.sent.failed)}.{' '}
        {data.catches ? 'Every message is kept here.' : 'Only messages caught by the built-in catcher are listed here.'}
      </Notice>
      {!data.items.length ? (
        <EmptyState title="No messages yet">Digests and assignment notes appear here after the nightly run sends them.</EmptyState>
      ) : (
        <div className="grid gap-4 lg:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]">
          <div>
            <ul className="divide-y divide-line rounded-md border border-line bg-surface" aria-label="Messages">
              {data.items.map((m) => (
                <li key={m.id}>
                  <button
                    type="button"
                    onClick={() => setSelected(m.id)}
                    aria-current={selected === m.id ? 'true' : undefined}
                    className={cx('block w-full px-3 py-2.5 text-left hover:bg-mist', selected === m.id && 'bg-mist')}
                  >
                    <span className="block truncate font-medium text-ink">{m.subject}</span>
                    <span className="block truncate text-sm text-slate">
                      To {m.to} · {formatDateTime(m.receivedAt)}
                    </span>
                  </button>
                </li>
              ))}
            </ul>
            <NewerOlder page={page} pageSize={50} total={data.total} onStep={(by) => setPage((p) => p + by)} count={`${formatNumber(data.total)} messages`} />
          </div>
          <div className="min-w-0 rounded-md border border-line bg-surface p-4">
            {selected === null ? (
              <p className="text-sm text-slate">Choose a message to read it.</p>
            ) : message.isPending ? (
              <LoadingState label="Loading the message…" />
            ) : message.error ? (
              <ErrorState error={message.error} what="the message" />
            ) : (
              <article aria-label="Message">
                <h2 className="text-lg font-semibold text-ink">{message.data.subject}</h2>
                <p className="text-sm text-slate">
                  From {message.data.from} to {message.data.to} · {formatDateTime(message.data.receivedAt)}
                </p>
                <div className="mt-3 flex gap-2" role="group" aria-label="Body">
                  <Button size="sm" variant={view === 'html' ? 'primary' : 'secondary'} onClick={() => setView('html')} disabled={!message.data.html}>
                    HTML
                  </Button>
                  <Button size="sm" variant={view === 'text' ? 'primary' : 'secondary'} onClick={() => setView('text')}>
                    Plain text
                  </Button>
                </div>
                {view === 'html' && message.data.html ? (
                  <iframe title="HTML body" sandbox="" srcDoc={message.data.html} className="mt-3 h-[32rem] w-full rounded border border-line bg-white" />
                ) : (
                  <pre className="mt-3 max-h-[32rem] overflow-auto text-sm whitespace-pre-wrap text-ink">{message.data.text}</pre>
                )}
              </article>
            )}
          </div>
        </div>
      )}
    </>
  );
}
