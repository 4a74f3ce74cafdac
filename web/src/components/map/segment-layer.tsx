import 'leaflet/dist/leaflet.css';
import './map.css';
import { useEffect, useState } from 'react';
import L from 'leaflet';
import { useMap } from 'react-leaflet';
import { isRoughnessClass, ROAD_OUTLINE_COLOUR, roughnessColours, UNKNOWN_ROUGHNESS_COLOUR } from '@/lib/roughness';

const SELECTED_OUTLINE = '#D9622B';

export interface SegmentLines {
  id: number[];
  isoClass: (string | null)[];
  coords: [number, number][][];
}

/**
 * One canvas for every line and marker on a map. Leaflet's canvas renderer finds what was
 * clicked only among the layers it draws itself, and a second canvas on top (say, for depot
 * markers) would swallow every click meant for the roads below; with one shared canvas, a click
 * goes to whatever is drawn at that spot. Pass it as the map's `renderer`.
 */
export function sharedCanvas(): L.Canvas {
  // tolerance: a road line a few pixels wide can be hit within 6 px of it, with a finger too
  return L.canvas({ padding: 0.3, tolerance: 6 });
}

/** The shared canvas for one map (kept for the life of the component that holds the map). */
export function useSharedCanvas(): L.Canvas {
  return useState(sharedCanvas)[0];
}

/**
 * Draws every segment as its own polyline on the map's canvas (no SVG nodes, so tens of thousands
 * of segments stay smooth), coloured by ISO 8608 class over a light outline; segments without a
 * known class are dashed. Clicking one reports its id.
 */
export function SegmentLayer({ data, onSelect, selectedId, weight = 4, fit = false }: { data: SegmentLines; onSelect?: (id: number) => void; selectedId?: number | null; weight?: number; fit?: boolean }) {
  const map = useMap();
  useEffect(() => {
    // The map's own canvas when it has one (see sharedCanvas), so markers drawn later share it.
    const renderer = map.options.renderer instanceof L.Canvas ? map.options.renderer : sharedCanvas();
    const outlines = L.layerGroup();
    const lines = L.layerGroup();
    const bounds = L.latLngBounds([]);
    for (let i = 0; i < data.id.length; i++) {
      const cls = data.isoClass[i];
      const known = isRoughnessClass(cls);
      const selected = data.id[i] === selectedId;
      const latlngs = data.coords[i].map(([lon, lat]) => L.latLng(lat, lon));
      for (const p of latlngs) bounds.extend(p);
      const w = selected ? weight + 3 : weight;
      outlines.addLayer(
        L.polyline(latlngs, { renderer, color: selected ? SELECTED_OUTLINE : ROAD_OUTLINE_COLOUR, weight: w + (selected ? 5 : 3), opacity: 1, lineCap: 'round', lineJoin: 'round', interactive: false }),
      );
      const line = L.polyline(latlngs, {
        renderer,
        color: known ? roughnessColours[cls] : UNKNOWN_ROUGHNESS_COLOUR,
        weight: w,
        opacity: 1,
        lineCap: known ? 'round' : 'butt',
        lineJoin: 'round',
        dashArray: known ? undefined : `${w * 1.5} ${w}`,
        interactive: Boolean(onSelect),
      });
      if (onSelect) line.on('click', () => onSelect(data.id[i]));
      lines.addLayer(line);
    }
    // outlines first, so every coloured line lies on top of all of them
    outlines.addTo(map);
    lines.addTo(map);
    // Lines sit under markers added before them (a canvas draws in the order layers arrive).
    map.eachLayer((layer) => {
      if (layer instanceof L.CircleMarker) layer.bringToFront();
    });
    if (fit && bounds.isValid()) map.fitBounds(bounds, { padding: [16, 16] });
    return () => {
      outlines.remove();
      lines.remove();
    };
  }, [map, data, onSelect, selectedId, weight, fit]);
  return null;
}
