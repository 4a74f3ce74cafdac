import { StatusBadge, type StatusTone } from '@/components/ui/status-badge';
import { formatDate, formatNumber, formatPercent } from '@/lib/format';
import type { CornerState } from '../api/types';

const tone: Record<CornerState['state'], StatusTone> = { ok: 'ok', watch: 'watch', due: 'due', past_life: 'overdue' };
const words: Record<CornerState['state'], string> = { ok: 'within life', watch: 'watch', due: 'inspect', past_life: 'past life' };

/** Each corner's predicted state: life used, predicted damping, end of life with its range, and a worded badge. */
export function CornerChips({ corners }: { corners: CornerState[] }) {
  return (
    <ul className="grid grid-cols-2 gap-2" aria-label="Predicted state per corner">
      {corners.map((c) => (
        <li key={c.damperId} className="rounded border border-line px-2.5 py-1.5 text-sm">
          <div className="flex items-center justify-between gap-2">
            <span className="font-semibold">{c.position}</span>
            <StatusBadge tone={tone[c.state]}>{words[c.state]}</StatusBadge>
          </div>
          <div className="tabular text-slate">
            {formatPercent(c.lifeUsedFraction)} of life · {formatNumber(c.dampingNsPerM)} N·s/m
          </div>
          {c.endOfLifeDate ? (
            <div className="tabular text-xs text-slate">
              end of life {formatDate(c.endOfLifeDate)}
              {c.endOfLifeP10Date && c.endOfLifeP90Date && c.endOfLifeP10Date !== c.endOfLifeP90Date ? ` (P10–P90 ${formatDate(c.endOfLifeP10Date)} – ${formatDate(c.endOfLifeP90Date)})` : ''}
            </div>
          ) : null}
        </li>
      ))}
    </ul>
  );
}

export { tone as cornerTone, words as cornerWords };
