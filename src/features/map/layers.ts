import type { CircleLayerSpecification, FillLayerSpecification, LineLayerSpecification, RasterLayerSpecification, SymbolLayerSpecification } from 'maplibre-gl';
import { MAP_COLORS as C } from './palette';
import { RING_IMAGE } from './pin-rings';
import { FONT_MEDIUM } from './style';
import { WASP_FILL_PAINT, WASP_LINE_PAINT } from './wasp-style';

/*
 * The map's overlay layers as typed constants: ids, sources and paint in one place, so the map
 * component, click handling and the browser test all use the same names.
 */

export const SOURCE_IDS = { pins: 'report-pins', wasp: 'wasp-areas', frost: 'frost-stations', season: 'season-surface' } as const;

type Layer<T> = Omit<T, 'source'> & { source: string };

/*
 * Pins are symbols, drawn above every base-map label: MapLibre places symbols from the top layer
 * down, so a town name that would sit under a pin gives way (icon-allow-overlap keeps every pin;
 * icon-ignore-placement stays false, so the pins block the labels beneath them).
 */
const pinText: SymbolLayerSpecification['layout'] = {
  'text-font': [FONT_MEDIUM],
  'text-allow-overlap': true,
  'text-ignore-placement': true,
  'icon-image': RING_IMAGE,
  'icon-allow-overlap': true,
  'icon-padding': 1,
};

export const PIN_CLUSTER_LAYER: Layer<SymbolLayerSpecification> = {
  id: 'pins-clusters',
  type: 'symbol',
  source: SOURCE_IDS.pins,
  filter: ['==', ['get', 'kind'], 'cluster'],
  layout: {
    ...pinText,
    'icon-size': ['interpolate', ['linear'], ['sqrt', ['get', 'reports']], 1, 0.95, 5, 1.2, 20, 1.7, 60, 2.1],
    'text-field': ['to-string', ['get', 'reports']],
    'text-size': ['interpolate', ['linear'], ['sqrt', ['get', 'reports']], 1, 11, 20, 14],
    'symbol-sort-key': ['get', 'reports'],
  },
  paint: { 'text-color': C.fig900 },
};

export const PIN_CELL_LAYER: Layer<SymbolLayerSpecification> = {
  id: 'pins-cells',
  type: 'symbol',
  source: SOURCE_IDS.pins,
  filter: ['==', ['get', 'kind'], 'cell'],
  layout: {
    ...pinText,
    'icon-size': ['case', ['>', ['get', 'reports'], 1], 0.85, 0.62],
    'text-field': ['case', ['>', ['get', 'reports'], 1], ['to-string', ['get', 'reports']], ''],
    'text-size': 10.5,
  },
  paint: { 'text-color': C.fig900 },
};

export const WASP_FILL_LAYER: Layer<FillLayerSpecification> = {
  id: 'wasp-areas-fill',
  type: 'fill',
  source: SOURCE_IDS.wasp,
  paint: WASP_FILL_PAINT,
};

export const WASP_OUTLINE_LAYER: Layer<LineLayerSpecification> = {
  id: 'wasp-areas-outline',
  type: 'line',
  source: SOURCE_IDS.wasp,
  paint: WASP_LINE_PAINT,
};

/** The season surface (season-surface.ts draws its tiles), on the land only: under the sea, lakes, borders and labels. */
export const SEASON_SURFACE_LAYER: Layer<RasterLayerSpecification> = {
  id: 'season-surface',
  type: 'raster',
  source: SOURCE_IDS.season,
  paint: { 'raster-opacity': 0.9, 'raster-resampling': 'linear', 'raster-fade-duration': 0 },
};
/** The base-map layer the season surface is drawn beneath: the sea, so the surface stops at the coast. */
export const SEASON_SURFACE_BEFORE = 'sea';

/** The stations behind the season surface: small marks where its evidence stands. */
export const FROST_STATION_LAYER: Layer<CircleLayerSpecification> = {
  id: 'frost-stations',
  type: 'circle',
  source: SOURCE_IDS.frost,
  minzoom: 4,
  paint: {
    'circle-color': C.paper,
    'circle-radius': ['interpolate', ['linear'], ['zoom'], 4, 2.5, 9, 4.5],
    'circle-stroke-color': C.ink,
    'circle-stroke-opacity': 0.7,
    'circle-stroke-width': 1.4,
  },
};

/** Layers a click can land on, topmost first. */
export const CLICKABLE_LAYER_IDS = [PIN_CLUSTER_LAYER.id, PIN_CELL_LAYER.id, FROST_STATION_LAYER.id, WASP_FILL_LAYER.id] as const;
