import { useQuery } from '@tanstack/react-query';
import { useLayoutEffect, useRef, useState } from 'react';
import type { PinFilters } from '@shared/schemas/pins';
import { mapQueries } from '../api';
import { estimateViewport } from '../first-view';
import { MAP_COLORS as C } from '../palette';
import type { MapView } from '../url-state';

const WORLD_PX = 512;
const mercatorY = (lat: number) => Math.log(Math.tan(Math.PI / 4 + (lat * Math.PI) / 360));

/**
 * The first view's pins, drawn as plain SVG where the map will put them, while MapLibre (most of the
 * first visit's bytes) is still on its way over a weak signal: the grower sees at once where the
 * reports are. It lies under the map, which covers it as soon as it draws; it reads the same cached
 * pins answer the map then uses (asked for by main.tsx at start-up).
 */
export function PinPreview({ view, filters }: { view: MapView; filters: PinFilters }) {
  const ref = useRef<SVGSVGElement>(null);
  const [size, setSize] = useState<{ width: number; height: number } | null>(null);
  useLayoutEffect(() => {
    const box = ref.current?.getBoundingClientRect();
    if (box) setSize({ width: box.width, height: box.height });
  }, []);
  const { bbox, zoom } = estimateViewport(view, window.innerWidth, window.innerHeight);
  const pins = useQuery(mapQueries.pins(bbox, zoom, filters));
  const scale = WORLD_PX * 2 ** view.zoom;
  const place = (lon: number, lat: number) => ({
    x: (size?.width ?? 0) / 2 + ((lon - view.lon) / 360) * scale,
    y: (size?.height ?? 0) / 2 - ((mercatorY(lat) - mercatorY(view.lat)) / (2 * Math.PI)) * scale,
  });
  return (
    <svg ref={ref} aria-hidden="true" data-pin-preview="" className="absolute inset-0 h-full w-full" style={{ background: C.land }}>
      {size &&
        pins.data?.features.map((pin, i) => {
          const { x, y } = place(pin.geometry.coordinates[0], pin.geometry.coordinates[1]);
          const many = pin.properties.reports;
          const r = pin.properties.kind === 'cluster' ? Math.min(30, 9 + 4 * Math.sqrt(many)) : many > 1 ? 10 : 7;
          return (
            <g key={i}>
              <circle cx={x} cy={y} r={r} fill={pin.properties.kind === 'cluster' ? C.fig600 : C.fig500} stroke={C.paper} strokeWidth={2} opacity={0.9} />
              {many > 1 && (
                <text x={x} y={y} dy="0.35em" textAnchor="middle" fontSize={12} fontWeight={600} fill={C.paper}>
                  {many}
                </text>
              )}
            </g>
          );
        })}
    </svg>
  );
}
