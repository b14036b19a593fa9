import { bbox } from '@turf/turf';
import 'maplibre-gl/dist/maplibre-gl.css';
import { useEffect, useMemo, useRef, useState } from 'react';
import MapGl, { Layer, NavigationControl, Source, type LayerProps, type MapLayerMouseEvent, type MapRef } from 'react-map-gl/maplibre';
import { closeRing } from '@shared/domain/wasp-geometry';
import type { WaspAreaCollection, WaspAreaGeometry } from '@shared/schemas/wasp-areas';
import { NearMeButton } from '../../map/components/near-me-button';
import { createBaseStyle } from '../../map/style';
import { WASP_FILL_PAINT, WASP_LINE_PAINT } from '../../map/wasp-style';
import '../../map/worker';

export const WASP_AREA_FILL_LAYER = 'editor-wasp-area-fill';

const areaFill: LayerProps = {
  id: WASP_AREA_FILL_LAYER,
  type: 'fill',
  paint: WASP_FILL_PAINT,
};
const areaLine: LayerProps = {
  id: 'editor-wasp-area-line',
  type: 'line',
  paint: WASP_LINE_PAINT,
};
const draftFill: LayerProps = { id: 'editor-draft-fill', type: 'fill', filter: ['==', ['geometry-type'], 'Polygon'], paint: { 'fill-color': '#6b3a5b', 'fill-opacity': 0.2 } };
const draftLine: LayerProps = { id: 'editor-draft-line', type: 'line', filter: ['!=', ['geometry-type'], 'Point'], paint: { 'line-color': '#6b3a5b', 'line-width': 2 } };
const draftPoints: LayerProps = {
  id: 'editor-draft-points',
  type: 'circle',
  filter: ['==', ['geometry-type'], 'Point'],
  paint: { 'circle-radius': 5, 'circle-color': '#ffffff', 'circle-stroke-color': '#6b3a5b', 'circle-stroke-width': 2 },
};

interface WaspAreaMapProps {
  areas: WaspAreaCollection | undefined;
  selectedId: number | null;
  /** The outline being drawn (open ring) or an uploaded geometry to preview. */
  draftVertices: [number, number][];
  preview: WaspAreaGeometry | null;
  drawing: boolean;
  onAddVertex: (position: [number, number]) => void;
  onSelect: (id: number) => void;
  /** Camera target: fit the map to this geometry when it changes. */
  focus: WaspAreaGeometry | null;
}

/**
 * The editors' map: recorded areas (retired ones dashed), and the outline being drawn. While
 * drawing, each click adds a vertex; the ring closes itself. The wrapper's data-rendered-areas
 * lists the names MapLibre actually drew, so tests and assistive notes can tell what is shown.
 */
export function WaspAreaMap({ areas, selectedId, draftVertices, preview, drawing, onAddVertex, onSelect, focus }: WaspAreaMapProps) {
  const mapRef = useRef<MapRef>(null);
  const [rendered, setRendered] = useState('');
  const style = useMemo(() => createBaseStyle(window.location.origin), []);

  const areaData = useMemo(
    () => (areas ? { ...areas, features: areas.features.map((f) => ({ ...f, properties: { ...f.properties, selected: f.id === selectedId } })) } : { type: 'FeatureCollection' as const, features: [] }),
    [areas, selectedId],
  );
  const draftData = useMemo(() => {
    const features: GeoJSON.Feature[] = draftVertices.map((p) => ({ type: 'Feature', properties: {}, geometry: { type: 'Point', coordinates: p } }));
    if (draftVertices.length >= 3) features.push({ type: 'Feature', properties: {}, geometry: { type: 'Polygon', coordinates: [closeRing(draftVertices)] } });
    else if (draftVertices.length === 2) features.push({ type: 'Feature', properties: {}, geometry: { type: 'LineString', coordinates: draftVertices } });
    if (preview) features.push({ type: 'Feature', properties: {}, geometry: preview });
    return { type: 'FeatureCollection' as const, features };
  }, [draftVertices, preview]);

  // Open on the recorded areas (a few small outlines are hard to find on a whole-continent view).
  // Only once the map has loaded: moving the camera of a map still being built can throw.
  const [loaded, setLoaded] = useState(false);
  const fittedToAreas = useRef(false);
  useEffect(() => {
    const map = mapRef.current;
    if (!loaded || fittedToAreas.current || !map || !areas?.features.length) return;
    fittedToAreas.current = true;
    const [w, s, e, n] = bbox(areas);
    map.fitBounds([[w, s], [e, n]], { padding: 60, maxZoom: 7, duration: 0 });
  }, [loaded, areas]);

  useEffect(() => {
    const map = mapRef.current;
    if (!map || !focus) return;
    const [w, s, e, n] = bbox(focus);
    map.fitBounds([[w, s], [e, n]], { padding: 40, maxZoom: 9, duration: 400 });
  }, [focus]);

  function onClick(event: MapLayerMouseEvent) {
    if (drawing) {
      onAddVertex([Number(event.lngLat.lng.toFixed(5)), Number(event.lngLat.lat.toFixed(5))]);
      return;
    }
    const id = event.features?.[0]?.properties?.id;
    if (typeof id === 'number') onSelect(id);
  }

  function onIdle() {
    const map = mapRef.current?.getMap();
    if (!map?.getLayer(WASP_AREA_FILL_LAYER)) return;
    const names = new Set(map.queryRenderedFeatures({ layers: [WASP_AREA_FILL_LAYER] }).map((f) => String(f.properties?.name)));
    setRendered([...names].sort().join('|'));
  }

  return (
    <div className="relative h-[440px] overflow-hidden rounded-lg border border-fig-100" data-testid="wasp-area-map" data-rendered-areas={rendered}>
      <MapGl
        ref={mapRef}
        mapStyle={style}
        initialViewState={{ longitude: -100, latitude: 39, zoom: 2.6 }}
        interactiveLayerIds={drawing ? [] : [WASP_AREA_FILL_LAYER]}
        cursor={drawing ? 'crosshair' : 'grab'}
        onClick={onClick}
        onIdle={onIdle}
        onLoad={() => setLoaded(true)}
        doubleClickZoom={!drawing}
        attributionControl={false}
      >
        <NavigationControl position="top-right" showCompass={false} />
        <NearMeButton onFound={(p) => mapRef.current?.flyTo({ center: [p.lon, p.lat], zoom: 9 })} />
        <Source id="editor-wasp-areas" type="geojson" data={areaData}>
          <Layer {...areaFill} />
          <Layer {...areaLine} />
        </Source>
        <Source id="editor-draft" type="geojson" data={draftData}>
          <Layer {...draftFill} />
          <Layer {...draftLine} />
          <Layer {...draftPoints} />
        </Source>
      </MapGl>
      {drawing && (
        <p className="pointer-events-none absolute top-2 left-2 rounded bg-white/90 px-2 py-1 text-xs shadow">Click to add corners; the outline closes itself.</p>
      )}
    </div>
  );
}
