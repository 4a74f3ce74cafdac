import { CircleMarker, Tooltip } from 'react-leaflet';
import { useRideReportGroups } from '../api/get-ride-report-groups';
import { severityWord } from './report-status';

const COLOUR: Record<number, string> = { 1: '#B7791F', 2: '#D9622B', 3: '#B3261E' };

/** New ride reports on the map, one marker per segment; size by count, colour and word by worst severity. */
export function RideReportLayer({ onSelect }: { onSelect?: (segmentId: number) => void }) {
  const groups = useRideReportGroups('new');
  if (!groups.data) return null;
  return (
    <>
      {groups.data.items.map((g) => (
        <CircleMarker
          key={g.segmentId}
          center={[g.mid[1], g.mid[0]]}
          radius={7 + Math.min(8, g.count * 2)}
          pathOptions={{ color: '#1E2A32', weight: 2, dashArray: g.maxSeverity >= 3 ? undefined : '3 2', fillColor: COLOUR[g.maxSeverity] ?? '#D9622B', fillOpacity: 0.85 }}
          eventHandlers={{ click: () => onSelect?.(g.segmentId) }}
        >
          <Tooltip direction="top" offset={[0, -8]}>
            {g.count} new report{g.count === 1 ? '' : 's'} · worst: {severityWord(g.maxSeverity)} · {g.routeName}, segment {g.seq + 1}
          </Tooltip>
        </CircleMarker>
      ))}
    </>
  );
}
