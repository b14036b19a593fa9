import '../../map/worker';
import 'maplibre-gl/dist/maplibre-gl.css';
import type { Feature, Polygon } from 'geojson';
import type { FillLayerSpecification, LineLayerSpecification } from 'maplibre-gl';
import { useMemo, useRef, useState } from 'react';
import MapGL, { Layer, Marker, NavigationControl, Source, type MapLayerMouseEvent, type MapRef } from 'react-map-gl/maplibre';
import { PUBLIC_GRID_STEP_DEG } from '@shared/domain/public-grid';
import { NearMeButton } from '../../map/components/near-me-button';
import { createBaseStyle } from '../../map/style';

const CELL_FILL_LAYER: Omit<FillLayerSpecification, 'source'> = { id: 'report-cell-fill', type: 'fill', paint: { 'fill-color': '#6b3a5b', 'fill-opacity': 0.18 } };
const CELL_LINE_LAYER: Omit<LineLayerSpecification, 'source'> = { id: 'report-cell-line', type: 'line', paint: { 'line-color': '#6b3a5b', 'line-width': 1.5 } };

/** The public grid cell around a cell centre, as a GeoJSON square. */
function cellPolygon(lat: number, lon: number): Feature<Polygon> {
  const h = PUBLIC_GRID_STEP_DEG / 2;
  const ring = [[lon - h, lat - h], [lon + h, lat - h], [lon + h, lat + h], [lon - h, lat + h], [lon - h, lat - h]];
  return { type: 'Feature', properties: {}, geometry: { type: 'Polygon', coordinates: [ring] } };
}

interface MiniMapProps {
  lat: number | null;
  lon: number | null;
  /** Draw the coarse public cell instead of a pin (for everyone but the owner). */
  cell?: boolean;
  zoom?: number;
  /** Where to open when there is no place yet (the grower's home garden), without a pin. */
  startAt?: { lat: number; lon: number } | null;
  onPick?: (point: { lat: number; lon: number }) => void;
  label: string;
  className?: string;
}

/** A small map on Syconium's own offline style: shows a report's place, or lets a grower click one. */
export default function MiniMap({ lat, lon, cell = false, zoom, startAt, onPick, label, className = 'h-56' }: MiniMapProps) {
  const mapStyle = useMemo(() => createBaseStyle(window.location.origin), []);
  const mapRef = useRef<MapRef>(null);
  // Where the map was moved to (for tests: Near me and panning show here).
  const [centreLon, setCentreLon] = useState('');
  const has = lat !== null && lon !== null && Number.isFinite(lat) && Number.isFinite(lon);
  const polygon = useMemo(() => (has && cell ? cellPolygon(lat, lon) : null), [has, cell, lat, lon]);
  const initialViewState = has
    ? { latitude: lat, longitude: lon, zoom: zoom ?? (cell ? 9.5 : 10) }
    : startAt
      ? { latitude: startAt.lat, longitude: startAt.lon, zoom: zoom ?? 11 }
      : { latitude: 40, longitude: -90, zoom: 2.5 };
  return (
    <div className={`relative overflow-hidden rounded-lg border border-fig-100 ${className}`} role="region" aria-label={label} data-testid="mini-map" data-centre-lon={centreLon}>
      <MapGL
        ref={mapRef}
        onMoveEnd={(e) => setCentreLon(e.viewState.longitude.toFixed(3))}
        mapStyle={mapStyle}
        initialViewState={initialViewState}
        attributionControl={false}
        dragRotate={false}
        cursor={onPick ? 'crosshair' : 'grab'}
        onClick={onPick ? (e: MapLayerMouseEvent) => onPick({ lat: Math.round(e.lngLat.lat * 1e5) / 1e5, lon: Math.round(e.lngLat.lng * 1e5) / 1e5 }) : undefined}
        style={{ position: 'absolute', inset: 0 }}
      >
        <NavigationControl position="top-right" showCompass={false} />
        <NearMeButton onFound={(p) => mapRef.current?.flyTo({ center: [p.lon, p.lat], zoom: 11 })} />
        {polygon && (
          <Source id="report-cell" type="geojson" data={polygon}>
            <Layer {...CELL_FILL_LAYER} />
            <Layer {...CELL_LINE_LAYER} />
          </Source>
        )}
        {has && !cell && (
          <Marker latitude={lat} longitude={lon} anchor="bottom">
            <svg width="22" height="30" viewBox="0 0 22 30" aria-hidden="true">
              <path d="M11 29C11 29 21 17.5 21 11A10 10 0 0 0 1 11C1 17.5 11 29 11 29z" fill="#6b3a5b" stroke="#fff" strokeWidth="1.5" />
              <circle cx="11" cy="11" r="3.5" fill="#f3d9a4" />
            </svg>
          </Marker>
        )}
      </MapGL>
    </div>
  );
}
