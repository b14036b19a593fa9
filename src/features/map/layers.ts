import type { CircleLayerSpecification, FillLayerSpecification, LineLayerSpecification, SymbolLayerSpecification } from 'maplibre-gl';
import { FROST_BANDS } from './frost-bands';
import { MAP_COLORS as C } from './palette';
import { FONT_MEDIUM } from './style';

/*
 * The map's overlay layers as typed constants: ids, sources and paint in one place, so the map
 * component, click handling and the browser test all use the same names.
 */

export const SOURCE_IDS = { pins: 'report-pins', wasp: 'wasp-areas', frost: 'frost-stations' } as const;

type Layer<T> = Omit<T, 'source'> & { source: string };

export const PIN_CLUSTER_LAYER: Layer<CircleLayerSpecification> = {
  id: 'pins-clusters',
  type: 'circle',
  source: SOURCE_IDS.pins,
  filter: ['==', ['get', 'kind'], 'cluster'],
  paint: {
    'circle-color': C.fig600,
    'circle-opacity': 0.88,
    'circle-radius': ['interpolate', ['linear'], ['sqrt', ['get', 'reports']], 1, 13, 5, 18, 20, 30],
    'circle-stroke-color': C.paper,
    'circle-stroke-width': 2,
  },
};

export const PIN_CLUSTER_COUNT_LAYER: Layer<SymbolLayerSpecification> = {
  id: 'pins-cluster-counts',
  type: 'symbol',
  source: SOURCE_IDS.pins,
  filter: ['==', ['get', 'kind'], 'cluster'],
  layout: {
    'text-field': ['to-string', ['get', 'reports']],
    'text-font': [FONT_MEDIUM],
    'text-size': 12.5,
    'text-allow-overlap': true,
    'text-ignore-placement': true,
  },
  paint: { 'text-color': '#ffffff' },
};

export const PIN_CELL_LAYER: Layer<CircleLayerSpecification> = {
  id: 'pins-cells',
  type: 'circle',
  source: SOURCE_IDS.pins,
  filter: ['==', ['get', 'kind'], 'cell'],
  paint: {
    'circle-color': C.fig500,
    'circle-radius': ['case', ['>', ['get', 'reports'], 1], 10, 7],
    'circle-stroke-color': C.paper,
    'circle-stroke-width': 2,
  },
};

export const PIN_CELL_COUNT_LAYER: Layer<SymbolLayerSpecification> = {
  id: 'pins-cell-counts',
  type: 'symbol',
  source: SOURCE_IDS.pins,
  filter: ['all', ['==', ['get', 'kind'], 'cell'], ['>', ['get', 'reports'], 1]],
  layout: {
    'text-field': ['to-string', ['get', 'reports']],
    'text-font': [FONT_MEDIUM],
    'text-size': 11,
    'text-allow-overlap': true,
    'text-ignore-placement': true,
  },
  paint: { 'text-color': '#ffffff' },
};

export const WASP_FILL_LAYER: Layer<FillLayerSpecification> = {
  id: 'wasp-areas-fill',
  type: 'fill',
  source: SOURCE_IDS.wasp,
  paint: { 'fill-color': C.leaf500, 'fill-opacity': 0.16 },
};

export const WASP_OUTLINE_LAYER: Layer<LineLayerSpecification> = {
  id: 'wasp-areas-outline',
  type: 'line',
  source: SOURCE_IDS.wasp,
  paint: { 'line-color': C.leaf700, 'line-width': 1.5, 'line-dasharray': [2, 1.5], 'line-opacity': 0.8 },
};

/** Station circles coloured by frost-free days (days50), in the legend's bands. */
export const FROST_STATION_LAYER: Layer<CircleLayerSpecification> = {
  id: 'frost-stations',
  type: 'circle',
  source: SOURCE_IDS.frost,
  paint: {
    'circle-color': ['step', ['get', 'days50'], FROST_BANDS[0]!.color, ...FROST_BANDS.slice(1).flatMap((b) => [b.from, b.color])] as unknown as string,
    'circle-radius': ['interpolate', ['linear'], ['zoom'], 2, 5, 8, 9],
    'circle-stroke-color': C.ink,
    'circle-stroke-opacity': 0.35,
    'circle-stroke-width': 1,
    'circle-opacity': 0.9,
  },
};

/** Layers a click can land on, topmost first. */
export const CLICKABLE_LAYER_IDS = [PIN_CLUSTER_LAYER.id, PIN_CELL_LAYER.id, FROST_STATION_LAYER.id, WASP_FILL_LAYER.id] as const;
