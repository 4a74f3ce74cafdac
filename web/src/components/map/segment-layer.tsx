import { useEffect } from 'react';
import L from 'leaflet';
import { useMap } from 'react-leaflet';
import { isRoughnessClass, roughnessColours } from '@/lib/roughness';

const UNKNOWN = '#B9B4AA';

export interface SegmentLines {
  id: number[];
  isoClass: (string | null)[];
  coords: [number, number][][];
}

/**
 * Draws every segment as its own polyline on one shared canvas renderer (no SVG nodes, so tens
 * of thousands of segments stay smooth), coloured by ISO 8608 class. Clicking one reports its id.
 */
export function SegmentLayer({ data, onSelect, selectedId, weight = 4, fit = false }: { data: SegmentLines; onSelect?: (id: number) => void; selectedId?: number | null; weight?: number; fit?: boolean }) {
  const map = useMap();
  useEffect(() => {
    const renderer = L.canvas({ padding: 0.3, tolerance: 6 });
    const group = L.layerGroup();
    const bounds = L.latLngBounds([]);
    for (let i = 0; i < data.id.length; i++) {
      const cls = data.isoClass[i];
      const latlngs = data.coords[i].map(([lon, lat]) => L.latLng(lat, lon));
      for (const p of latlngs) bounds.extend(p);
      const line = L.polyline(latlngs, {
        renderer,
        color: isRoughnessClass(cls) ? roughnessColours[cls] : UNKNOWN,
        weight: data.id[i] === selectedId ? weight + 4 : weight,
        opacity: 0.95,
        lineCap: 'butt',
        interactive: Boolean(onSelect),
      });
      if (onSelect) line.on('click', () => onSelect(data.id[i]));
      group.addLayer(line);
    }
    group.addTo(map);
    if (fit && bounds.isValid()) map.fitBounds(bounds, { padding: [16, 16] });
    return () => {
      group.remove();
    };
  }, [map, data, onSelect, selectedId, weight, fit]);
  return null;
}
