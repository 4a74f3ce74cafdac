import 'leaflet/dist/leaflet.css';
import { useEffect, useMemo } from 'react';
import L from 'leaflet';
import { CircleMarker, MapContainer, Polyline, useMap, useMapEvents } from 'react-leaflet';
import { BaseLayer } from '@/components/map/base-layer';
import { SegmentLayer, useSharedCanvas } from '@/components/map/segment-layer';
import { ScaleBar } from '@/components/map/map-context';
import { LoadingState } from '@/components/ui/loading-state';
import { useRoadLines } from '../api/get-road-lines';

function TapToPlace({ onPick }: { onPick: (lat: number, lon: number) => void }) {
  useMapEvents({ click: (e) => onPick(e.latlng.lat, e.latlng.lng) });
  return null;
}

function FollowPoint({ point, lines }: { point: { lat: number; lon: number } | null; lines: [number, number][][] }) {
  const map = useMap();
  useEffect(() => {
    if (point) {
      map.setView([point.lat, point.lon], Math.max(map.getZoom(), 14));
      return;
    }
    const b = L.latLngBounds([]);
    for (const line of lines) for (const [lon, lat] of line) b.extend([lat, lon]);
    if (b.isValid()) map.fitBounds(b, { padding: [10, 10] });
    // only on first draw and when the point changes
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [map, point?.lat, point?.lon]);
  return null;
}

/** Brings a highlighted route into view when it is first shown. */
function FitRoute({ lines }: { lines: [number, number][][] | null }) {
  const map = useMap();
  useEffect(() => {
    if (!lines?.length) return;
    const b = L.latLngBounds([]);
    for (const line of lines) for (const [lon, lat] of line) b.extend([lat, lon]);
    if (b.isValid()) map.fitBounds(b, { padding: [16, 16] });
  }, [map, lines]);
  return null;
}

interface PlacePickerProps {
  point: { lat: number; lon: number } | null;
  snapped: { lat: number; lon: number } | null;
  onPick: (lat: number, lon: number) => void;
  /** A route to draw outlined and bring into view (the nearest one, for a place far from every route). */
  highlightRouteId?: number | null;
}

/** A small map of our roads: tap where the rough stretch is. Shows the reported and the snapped point. */
export function PlacePicker({ point, snapped, onPick, highlightRouteId = null }: PlacePickerProps) {
  const lines = useRoadLines();
  const canvas = useSharedCanvas();
  const segments = lines.data?.segments;
  const highlighted = useMemo(
    () => (segments && highlightRouteId !== null ? segments.coords.filter((_, i) => segments.routeId[i] === highlightRouteId) : null),
    [segments, highlightRouteId],
  );
  if (lines.isPending) return <LoadingState label="Loading the road map…" />;
  if (!lines.data) return <p className="text-sm text-slate">The map could not be loaded. Use your position instead.</p>;
  return (
    <div className="h-64 overflow-hidden rounded-md border border-line" data-testid="place-picker">
      <MapContainer renderer={canvas} center={[52.56, -1.4]} zoom={10} className="h-full w-full" attributionControl={false} scrollWheelZoom={false}>
        <BaseLayer />
        <ScaleBar />
        <SegmentLayer data={lines.data.segments} weight={5} />
        <TapToPlace onPick={onPick} />
        <FollowPoint point={point} lines={lines.data.segments.coords} />
        {highlighted ? (
          <>
            <Polyline positions={highlighted.map((l) => l.map(([lon, lat]) => [lat, lon] as [number, number]))} pathOptions={{ color: '#D9622B', weight: 12, opacity: 0.9, interactive: false }} eventHandlers={{ add: (e) => (e.target as L.Polyline).bringToBack() }} />
            <FitRoute lines={highlighted} />
          </>
        ) : null}
        {point ? <CircleMarker center={[point.lat, point.lon]} radius={7} pathOptions={{ color: '#1E2A32', weight: 2, fillColor: '#FAF8F3', fillOpacity: 1 }} /> : null}
        {snapped ? <CircleMarker center={[snapped.lat, snapped.lon]} radius={6} pathOptions={{ color: '#D9622B', weight: 3, fillColor: '#D9622B', fillOpacity: 0.9 }} /> : null}
      </MapContainer>
    </div>
  );
}
