import '../worker';
import 'maplibre-gl/dist/maplibre-gl.css';
import '../map.css';
import { useQuery } from '@tanstack/react-query';
import type { Feature, FeatureCollection, Point } from 'geojson';
import type { LngLat, Map as MapLibreMap, MapGeoJSONFeature } from 'maplibre-gl';
import { forwardRef, useCallback, useEffect, useImperativeHandle, useMemo, useRef, useState, type KeyboardEvent } from 'react';
import MapGL, { Layer, Marker, NavigationControl, ScaleControl, Source, type MapLayerMouseEvent, type MapRef } from 'react-map-gl/maplibre';
import { snapToGrid } from '@shared/domain/public-grid';
import type { PinFilters } from '@shared/schemas/pins';
import { mapQueries } from '../api';
import {
  CLICKABLE_LAYER_IDS,
  FROST_STATION_LAYER,
  PIN_CELL_LAYER,
  PIN_CLUSTER_LAYER,
  SEASON_SURFACE_BEFORE,
  SEASON_SURFACE_LAYER,
  SOURCE_IDS,
  WASP_FILL_LAYER,
  WASP_OUTLINE_LAYER,
} from '../layers';
import { provideRingImages } from '../pin-rings';
import { registerSeasonProtocol, SEASON_SOURCE, seasonSurfaceValueAt } from '../season-surface';
import { estimateViewport, type Viewport } from '../first-view';
import { createBaseStyle } from '../style';
import { toBbox, type MapView, type OverlayName } from '../url-state';
import { MapDetails } from './map-details';
import { CellPopup, PointPopup, StationPopup, WaspAreaPopup } from './map-popups';
import { useUnits } from '../../units/use-units';

registerSeasonProtocol();

export interface AtlasMapHandle {
  flyTo: (view: MapView) => void;
}

type PopupState =
  | { kind: 'cell'; lat: number; lon: number; reports: number; ripened: number; unripe: number }
  | { kind: 'point'; lat: number; lon: number }
  | { kind: 'station'; lat: number; lon: number; name: string; days50: number | null }
  | { kind: 'wasp'; lat: number; lon: number; name: string; source: string; observedOn: string };

interface AtlasMapProps {
  initialView: MapView;
  filters: PinFilters;
  overlays: OverlayName[];
  onViewChange: (view: MapView) => void;
  onTotalChange?: (total: number | null) => void;
  /** The signed-in grower's home place, marked on the map (their own saved place, seen only by them). */
  home?: { lat: number; lon: number; name: string } | null;
}

function viewportOf(map: MapLibreMap): Viewport {
  const b = map.getBounds();
  return { bbox: toBbox(b.getWest(), b.getSouth(), b.getEast(), b.getNorth()), zoom: Math.floor(map.getZoom()) };
}

/**
 * The atlas map: our own base style and tiles, report pins clustered by the server, and the
 * switchable wasp-area and frost-free-season layers. Clicks open popups; a cluster zooms in.
 */
export const AtlasMap = forwardRef<AtlasMapHandle, AtlasMapProps>(function AtlasMap({ initialView, filters, overlays, onViewChange, onTotalChange, home }, ref) {
  const units = useUnits();
  const mapRef = useRef<MapRef>(null);
  // Until the map has loaded, the window's estimate: the pins main.tsx asked for at start-up.
  const [viewport, setViewport] = useState<Viewport | null>(() => estimateViewport(initialView, window.innerWidth, window.innerHeight));
  const [popup, setPopup] = useState<PopupState | null>(null);
  const [cursor, setCursor] = useState<string>('');
  const mapStyle = useMemo(() => createBaseStyle(window.location.origin), []);

  useImperativeHandle(ref, () => ({
    flyTo: (view) => mapRef.current?.flyTo({ center: [view.lon, view.lat], zoom: view.zoom, essential: true }),
  }));

  const pins = useQuery({ ...mapQueries.pins(viewport?.bbox ?? '', viewport?.zoom ?? 0, filters), enabled: viewport !== null });
  const showWasp = overlays.includes('wasp');
  const showFrost = overlays.includes('frost');
  const wasp = useQuery({ ...mapQueries.waspAreas(), enabled: showWasp });
  const stations = useQuery({ ...mapQueries.stations(), enabled: showFrost });

  useEffect(() => onTotalChange?.(pins.data?.totalReports ?? null), [pins.data?.totalReports, onTotalChange]);
  // A popup about a cell belongs to the filters it was opened with (compared by value: the URL
  // gives a new filters object whenever the view moves).
  const filtersKey = JSON.stringify(filters);
  useEffect(() => setPopup((p) => (p?.kind === 'cell' ? null : p)), [filtersKey]);

  const stationData = useMemo<FeatureCollection<Point>>(
    () => ({
      type: 'FeatureCollection',
      features: (stations.data?.stations ?? [])
        .filter((s) => s.days50 !== null)
        .map((s): Feature<Point> => ({ type: 'Feature', geometry: { type: 'Point', coordinates: [s.lon, s.lat] }, properties: { id: s.id, name: s.name, days50: s.days50 } })),
    }),
    [stations.data],
  );

  const onMoveEnd = useCallback(() => {
    const map = mapRef.current?.getMap();
    if (!map) return;
    setViewport(viewportOf(map));
    const c = map.getCenter();
    onViewChange({ lat: c.lat, lon: c.wrap().lng, zoom: map.getZoom() });
  }, [onViewChange]);

  // The ring images are drawn on demand by a resolver set at 'load': the pins layer comes after it, or
  // with the first view's pins already fetched (main.tsx) it would ask for images nobody can draw yet.
  const [loaded, setLoaded] = useState(false);

  const onLoad = useCallback(() => {
    const map = mapRef.current?.getMap();
    if (!map) return;
    provideRingImages(map);
    setLoaded(true);
    setViewport(viewportOf(map));
    // For browser tests and debugging: the live map instance and the season surface's reading.
    const w = window as unknown as { syconiumMap?: MapLibreMap; syconiumSeasonAt?: typeof seasonSurfaceValueAt };
    w.syconiumMap = map;
    w.syconiumSeasonAt = seasonSurfaceValueAt;
  }, []);

  /** Open what lies at a point: zoom into a cluster, or a popup for a cell, station, area or empty spot. */
  const openAt = useCallback((feature: MapGeoJSONFeature | undefined, at: LngLat) => {
    const map = mapRef.current?.getMap();
    const { lat, lng } = at.wrap();
    if (!map || !feature) {
      setPopup({ kind: 'point', lat, lon: lng });
      return;
    }
    const props = feature.properties as Record<string, unknown>;
    const [fLon, fLat] = feature.geometry.type === 'Point' ? (feature.geometry.coordinates as [number, number]) : [lng, lat];
    switch (feature.layer.id) {
      case PIN_CLUSTER_LAYER.id:
        setPopup(null);
        map.easeTo({ center: [fLon, fLat], zoom: Math.max(map.getZoom() + 1, Number(props.expansionZoom)), duration: 600 });
        return;
      case PIN_CELL_LAYER.id:
        // On a phone the details open as a sheet over the lower part of the map: lift the pin above it.
        if (window.matchMedia('(max-width: 767px)').matches) map.easeTo({ center: [fLon, fLat], offset: [0, -map.getContainer().clientHeight * 0.28], duration: 300 });
        // Rendered positions are rounded by the tiling; snapping gives back the exact cell centre.
        setPopup({ kind: 'cell', lat: snapToGrid(fLat), lon: snapToGrid(fLon), reports: Number(props.reports), ripened: Number(props.ripened), unripe: Number(props.unripe) });
        return;
      case FROST_STATION_LAYER.id:
        setPopup({ kind: 'station', lat: fLat, lon: fLon, name: String(props.name), days50: props.days50 === null ? null : Number(props.days50) });
        return;
      case WASP_FILL_LAYER.id:
        setPopup({ kind: 'wasp', lat, lon: lng, name: String(props.name), source: String(props.source), observedOn: String(props.observedOn) });
        return;
      default:
        setPopup({ kind: 'point', lat, lon: lng });
    }
  }, []);

  const onClick = useCallback((event: MapLayerMouseEvent) => openAt(event.features?.[0], event.lngLat), [openAt]);

  const interactiveLayerIds = useMemo(
    () => CLICKABLE_LAYER_IDS.filter((id) => (id === FROST_STATION_LAYER.id ? showFrost : id === WASP_FILL_LAYER.id ? showWasp : true)),
    [showFrost, showWasp],
  );

  // Keyboard: MapLibre already pans with the arrow keys and zooms with + and -; Enter opens what
  // lies under the cross at the centre, as a click there would.
  const [keyboardFocus, setKeyboardFocus] = useState(false);
  const onKeyDown = useCallback(
    (event: KeyboardEvent<HTMLDivElement>) => {
      const map = mapRef.current?.getMap();
      if (event.key !== 'Enter' || !map || event.target !== map.getCanvas()) return;
      event.preventDefault();
      const centre = map.project(map.getCenter());
      const box: [[number, number], [number, number]] = [
        [centre.x - 18, centre.y - 18],
        [centre.x + 18, centre.y + 18],
      ];
      const layers = interactiveLayerIds.filter((id) => map.getLayer(id));
      openAt(map.queryRenderedFeatures(box, { layers })[0], map.getCenter());
    },
    [interactiveLayerIds, openAt],
  );

  return (
    <div
      className="absolute inset-0"
      onKeyDown={onKeyDown}
      onFocus={(e) => setKeyboardFocus(e.target instanceof HTMLCanvasElement && e.target.matches(':focus-visible'))}
      onBlur={() => setKeyboardFocus(false)}
    >
      <MapGL
        ref={mapRef}
        mapStyle={mapStyle}
        initialViewState={{ latitude: initialView.lat, longitude: initialView.lon, zoom: initialView.zoom }}
        minZoom={1}
        maxZoom={14}
        dragRotate={false}
        pitchWithRotate={false}
        touchPitch={false}
        attributionControl={false}
        locale={{ 'Map.Title': 'Atlas map. Arrow keys move it, plus and minus zoom, Enter opens what lies at the centre.' }}
        interactiveLayerIds={interactiveLayerIds}
        cursor={cursor}
        onMouseEnter={() => setCursor('pointer')}
        onMouseLeave={() => setCursor('')}
        onLoad={onLoad}
        onMoveEnd={onMoveEnd}
        onClick={onClick}
        style={{ position: 'absolute', inset: 0 }}
      >
        <NavigationControl position="top-right" showCompass={false} />
        <ScaleControl position="bottom-right" unit={units.prefs.distance === 'mi' ? 'imperial' : 'metric'} maxWidth={110} />

        {/* Layer order, whichever layer is switched on first: the season surface under the water
            and labels, wasp areas and climate stations under the report pins, the pins on top. */}
        {loaded && (
          <Source id={SOURCE_IDS.pins} type="geojson" data={(pins.data ?? { type: 'FeatureCollection', features: [] }) as FeatureCollection}>
            <Layer {...PIN_CELL_LAYER} />
            <Layer {...PIN_CLUSTER_LAYER} />
          </Source>
        )}
        {showFrost && (
          <Source id={SOURCE_IDS.season} {...SEASON_SOURCE}>
            <Layer {...SEASON_SURFACE_LAYER} beforeId={SEASON_SURFACE_BEFORE} />
          </Source>
        )}
        {loaded && showWasp && wasp.data && (
          <Source id={SOURCE_IDS.wasp} type="geojson" data={wasp.data as FeatureCollection}>
            <Layer {...WASP_FILL_LAYER} beforeId={PIN_CELL_LAYER.id} />
            <Layer {...WASP_OUTLINE_LAYER} beforeId={PIN_CELL_LAYER.id} />
          </Source>
        )}
        {loaded && showFrost && (
          <Source id={SOURCE_IDS.frost} type="geojson" data={stationData}>
            <Layer {...FROST_STATION_LAYER} beforeId={PIN_CELL_LAYER.id} />
          </Source>
        )}

        {home && (
          <Marker latitude={home.lat} longitude={home.lon} anchor="bottom">
            <div className="pointer-events-none flex flex-col items-center" data-testid="home-marker">
              <span className="mb-0.5 rounded bg-paper/95 px-1.5 py-0.5 text-[11px] font-medium whitespace-nowrap text-leaf-700 shadow-sm">{home.name} (your home place)</span>
              <svg width="22" height="24" viewBox="0 0 22 24" aria-hidden="true">
                <path d="M11 23 C11 23 20 15 20 9.5 A9 9 0 0 0 2 9.5 C2 15 11 23 11 23z" fill="#3d5e39" stroke="#faf6ef" strokeWidth="1.5" />
                <path d="M6.5 10.5 L11 6.5 L15.5 10.5 V14 H6.5z" fill="#faf6ef" />
              </svg>
            </div>
          </Marker>
        )}
        {popup && (
          <MapDetails latitude={popup.lat} longitude={popup.lon} onClose={() => setPopup(null)} titleId="map-details-title">
            {popup.kind === 'cell' && <CellPopup lat={popup.lat} lon={popup.lon} reports={popup.reports} ripened={popup.ripened} unripe={popup.unripe} filters={filters} titleId="map-details-title" />}
            {popup.kind === 'point' && <PointPopup lat={popup.lat} lon={popup.lon} showSeason={showFrost} titleId="map-details-title" />}
            {popup.kind === 'station' && <StationPopup name={popup.name} days50={popup.days50} titleId="map-details-title" />}
            {popup.kind === 'wasp' && <WaspAreaPopup name={popup.name} source={popup.source} observedOn={popup.observedOn} lat={popup.lat} lon={popup.lon} titleId="map-details-title" />}
          </MapDetails>
        )}
      </MapGL>
      {keyboardFocus && (
        <div aria-hidden className="pointer-events-none absolute top-1/2 left-1/2 h-6 w-6 -translate-x-1/2 -translate-y-1/2">
          <span className="absolute top-1/2 left-0 h-0.5 w-full -translate-y-1/2 bg-fig-700/70" />
          <span className="absolute top-0 left-1/2 h-full w-0.5 -translate-x-1/2 bg-fig-700/70" />
        </div>
      )}
    </div>
  );
});
