import { useId, useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { Caution } from '@/components/ui/caution';
import { Notice } from '@/components/ui/notice';
import { RoughnessClassBadge } from '@/components/ui/roughness';
import { isApiError } from '@/lib/api-client';
import { formatNumber } from '@/lib/format';
import type { RouteSegment } from '../api/get-route';
import { useSetSpeeds, type SpeedEdit } from '../api/set-speeds';

const MIN = 5;
const MAX = 130;

const shown = (v: number | null) => (v === null ? '' : String(v));

/**
 * Typical speed per segment, with the route's speed as the placeholder where a segment has none
 * of its own. Changed rows are saved together: all of them or none, with the reason on each row.
 */
export function SegmentSpeeds({ routeId, segments, defaultSpeedKmh }: { routeId: number; segments: RouteSegment[]; defaultSpeedKmh: number }) {
  const [values, setValues] = useState<Record<number, string>>({});
  const [errors, setErrors] = useState<Record<number, string>>({});
  const save = useSetSpeeds(routeId);
  const [saved, setSaved] = useState<number | null>(null);
  const idBase = useId();
  const inputId = (seq: number) => `${idBase}-speed-${seq}`;
  /** Takes the person to the first row that needs a fix (it may be scrolled out of sight). */
  const focusRow = (rows: Record<number, string>) => {
    const first = Object.keys(rows).map(Number).sort((a, b) => a - b)[0];
    if (first !== undefined) window.setTimeout(() => document.getElementById(inputId(first))?.focus(), 0);
  };

  const valueOf = (s: RouteSegment) => values[s.seq] ?? shown(s.speedKmh);
  const changed = segments.filter((s) => values[s.seq] !== undefined && values[s.seq].trim() !== shown(s.speedKmh));

  function onSubmit(e: FormEvent) {
    e.preventDefault();
    setSaved(null);
    const found: Record<number, string> = {};
    const edits: SpeedEdit[] = [];
    for (const s of changed) {
      const raw = values[s.seq].trim().replace(',', '.');
      if (raw === '') {
        edits.push({ seq: s.seq, speedKmh: null });
        continue;
      }
      const n = Number(raw);
      if (!Number.isFinite(n)) found[s.seq] = 'Type a number in km/h, or leave empty for the route’s speed.';
      else if (n < MIN || n > MAX) found[s.seq] = `Speed must be between ${MIN} and ${MAX} km/h.`;
      else edits.push({ seq: s.seq, speedKmh: n });
    }
    setErrors(found);
    if (Object.keys(found).length) return focusRow(found);
    if (!edits.length) return;
    save.mutate(edits, {
      onSuccess: (r) => {
        setValues({});
        setSaved(r.updated);
      },
      onError: (err) => {
        if (!isApiError(err)) return;
        const rowErrors: Record<number, string> = {};
        for (const [key, message] of Object.entries(err.fields)) {
          const m = /^segments\.(\d+)\./.exec(key);
          const edit = m ? edits[Number(m[1])] : undefined;
          if (edit) rowErrors[edit.seq] = message.charAt(0).toUpperCase() + message.slice(1) + '.';
        }
        setErrors(rowErrors);
        focusRow(rowErrors);
      },
    });
  }

  const errorCount = Object.keys(errors).length;
  const generalError = save.error && (!isApiError(save.error) || Object.keys(save.error.fields).length === 0) ? save.error.message : null;

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3">
      <div className="relative max-h-[28rem] overflow-auto rounded-md border border-line bg-surface">
        <table className="w-full border-collapse text-sm">
          <caption className="sr-only">Typical speed per segment</caption>
          <thead className="sticky top-0 z-10 bg-mist">
            <tr className="border-b border-line-strong">
              <th scope="col" className="px-3 py-2 text-right font-semibold">Segment</th>
              <th scope="col" className="px-3 py-2 text-right font-semibold">
                From – to <span className="font-normal text-slate">(km)</span>
              </th>
              <th scope="col" className="px-3 py-2 text-left font-semibold">Class</th>
              <th scope="col" className="px-3 py-2 text-right font-semibold">
                Speed <span className="font-normal text-slate">(km/h)</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {segments.map((s) => {
              const err = errors[s.seq];
              const id = inputId(s.seq);
              return (
                <tr key={s.id} className="border-b border-line last:border-b-0 align-middle">
                  <th scope="row" className="px-3 py-1.5 text-right font-normal tabular">{s.seq + 1}</th>
                  <td className="px-3 py-1.5 text-right tabular whitespace-nowrap">
                    {formatNumber(s.startM / 1000, 2)}–{formatNumber(s.endM / 1000, 2)}
                  </td>
                  <td className="px-3 py-1.5">
                    <RoughnessClassBadge value={s.isoClass} />
                  </td>
                  <td className="px-3 py-1.5 text-right">
                    <input
                      id={id}
                      aria-label={`Speed on segment ${s.seq + 1} [km/h]`}
                      aria-invalid={err ? true : undefined}
                      aria-describedby={err ? `${id}-error` : undefined}
                      inputMode="decimal"
                      placeholder={`${formatNumber(defaultSpeedKmh)} (route)`}
                      value={valueOf(s)}
                      onChange={(e) => {
                        const v = e.target.value;
                        setValues((old) => ({ ...old, [s.seq]: v }));
                        setErrors((old) => {
                          const next = { ...old };
                          delete next[s.seq];
                          return next;
                        });
                      }}
                      className="h-8 w-32 scroll-mt-24 rounded-md border border-line-strong bg-surface px-2 text-right tabular placeholder:text-slate/80 aria-invalid:border-overdue pointer-coarse:h-11"
                    />
                    {err ? (
                      <p id={`${id}-error`} className="mt-1 text-xs text-overdue">
                        {err}
                      </p>
                    ) : null}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" variant="primary" busy={save.isPending} disabled={changed.length === 0}>
          Save {changed.length ? `${changed.length} ${changed.length === 1 ? 'speed' : 'speeds'}` : 'speeds'}
        </Button>
        <Button variant="quiet" disabled={changed.length === 0} onClick={() => { setValues({}); setErrors({}); }}>
          Undo changes
        </Button>
        {saved !== null ? <p role="status" className="text-sm text-ok">Saved speeds on {saved} {saved === 1 ? 'segment' : 'segments'}.</p> : null}
      </div>
      {errorCount ? (
        <Notice tone="error">
          Nothing was saved: {errorCount} {errorCount === 1 ? 'row needs' : 'rows need'} a fix (marked in the table). Empty means the route’s typical speed.
        </Notice>
      ) : null}
      {generalError ? <Notice tone="error">{generalError}</Notice> : null}
      <Caution title="Speed">These are typical speeds for the wear model, not advice. Drive to the road, the load and local limits.</Caution>
    </form>
  );
}
