import { useSpeedAdvice } from '../api/get-speed-advice';
import { useSegmentRoute } from '../api/get-segment-route';
import { AdviceAssumptions } from './route-speed-advice';

/** The advised speed for one segment (default ride and damper limits, laden), for the map's segment panel. */
export function SegmentSpeedAdvice({ segmentId }: { segmentId: number | null }) {
  const seg = useSegmentRoute(segmentId);
  const q = useSpeedAdvice(seg.data?.segment.routeId ?? null, { segmentId: segmentId ?? undefined });
  if (segmentId === null || !q.data) return null;
  const s = q.data.segments.find((x) => x.id === segmentId);
  if (!s) return null;
  return (
    <section aria-label="Speed advice for the segment" className="rounded-md border border-line bg-surface p-3 text-sm" data-testid="segment-speed-advice">
      <h3 className="font-semibold text-ink">Speed advice</h3>
      <p className="mt-1 text-ink">
        {s.belowMinimum ? (
          <>
            <strong>Road needs attention</strong> for {q.data.spec.name}: {q.data.attention}
          </>
        ) : s.advisedKmh === null ? (
          'No roughness on record, so no advice.'
        ) : (
          <>
            Up to <strong className="tabular-nums">{s.advisedKmh} km/h</strong> for {q.data.spec.name}, {q.data.load.case}; limited by {s.limitedBy}.
          </>
        )}
      </p>
      <AdviceAssumptions advice={q.data} className="mt-2" />
      <p className="mt-2 text-xs text-slate">{q.data.method}</p>
      <p className="mt-2 text-xs text-slate">{q.data.caution}</p>
    </section>
  );
}
