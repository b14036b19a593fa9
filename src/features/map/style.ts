import type { ExpressionSpecification, StyleSpecification } from 'maplibre-gl';
import fira400Latin from '@fontsource/fira-sans/files/fira-sans-latin-400-normal.woff2?url';
import fira400LatinExt from '@fontsource/fira-sans/files/fira-sans-latin-ext-400-normal.woff2?url';
import fira500Latin from '@fontsource/fira-sans/files/fira-sans-latin-500-normal.woff2?url';
import fira500LatinExt from '@fontsource/fira-sans/files/fira-sans-latin-ext-500-normal.woff2?url';
import fira400ItalicLatin from '@fontsource/fira-sans/files/fira-sans-latin-400-italic.woff2?url';
import fira400ItalicLatinExt from '@fontsource/fira-sans/files/fira-sans-latin-ext-400-italic.woff2?url';
import { MAP_COLORS as C } from './palette';

/*
 * Syconium's base map: our own tiles (tiles/build, served at /tiles) and our own look. Labels are
 * drawn from the bundled Fira Sans files through MapLibre's `font-faces` property, so no glyph
 * server is asked for anything: every request stays on this origin.
 */

export const FONT_REGULAR = 'Fira Sans Regular';
export const FONT_MEDIUM = 'Fira Sans Medium';
export const FONT_ITALIC = 'Fira Sans Italic';

/** The last zoom each tile set was built to (scripts/tiles/build-tiles.ts); MapLibre enlarges past it. */
export const TILE_SETS = { base: { minzoom: 0, maxzoom: 6 }, us: { minzoom: 3, maxzoom: 8 }, water: { minzoom: 2, maxzoom: 8 }, places: { minzoom: 7, maxzoom: 8 } } as const;

/** The base map's label layers: the pins' symbol layer sits above them, so they give way to pins. */
export const LABEL_LAYER_IDS = ['county-labels', 'town-labels', 'state-labels', 'city-labels', 'country-labels'] as const;

// Fontsource's unicode ranges for its "latin" and "latin-ext" subsets.
const LATIN = ['U+0000-00FF', 'U+0131', 'U+0152-0153', 'U+02BB-02BC', 'U+02C6', 'U+02DA', 'U+02DC', 'U+0304', 'U+0308', 'U+0329', 'U+2000-206F', 'U+20AC', 'U+2122', 'U+2191', 'U+2193', 'U+2212', 'U+2215', 'U+FEFF', 'U+FFFD'];
const LATIN_EXT = ['U+0100-02BA', 'U+02BD-02C5', 'U+02C7-02CC', 'U+02CE-02D7', 'U+02DD-02FF', 'U+1D00-1DBF', 'U+1E00-1E9F', 'U+1EF2-1EFF', 'U+2020', 'U+20A0-20AB', 'U+20AD-20C0', 'U+2113', 'U+2C60-2C7F', 'U+A720-A7FF'];

function face(latin: string, latinExt: string, origin: string) {
  return [
    { url: new URL(latin, origin).href, 'unicode-range': LATIN },
    { url: new URL(latinExt, origin).href, 'unicode-range': LATIN_EXT },
  ];
}

const labelHalo = { 'text-halo-color': C.paper, 'text-halo-width': 1.4, 'text-halo-blur': 0.4 } as const;
const shownFrom: ExpressionSpecification = ['>=', ['zoom'], ['get', 'minzoom']];

/** The base style; `origin` is the page's origin, since MapLibre's worker needs absolute URLs. */
export function createBaseStyle(origin: string): StyleSpecification {
  const tiles = (set: keyof typeof TILE_SETS) => [`${origin}/tiles/${set}/{z}/{x}/{y}.pbf`];
  return {
    version: 8,
    name: 'Syconium',
    'font-faces': {
      [FONT_REGULAR]: face(fira400Latin, fira400LatinExt, origin),
      [FONT_MEDIUM]: face(fira500Latin, fira500LatinExt, origin),
      [FONT_ITALIC]: face(fira400ItalicLatin, fira400ItalicLatinExt, origin),
    },
    sources: {
      base: { type: 'vector', tiles: tiles('base'), ...TILE_SETS.base },
      us: { type: 'vector', tiles: tiles('us'), ...TILE_SETS.us, bounds: [-180, 17, -64, 72] },
      water: { type: 'vector', tiles: tiles('water'), ...TILE_SETS.water },
      places: { type: 'vector', tiles: tiles('places'), ...TILE_SETS.places },
    },
    layers: [
      { id: 'water', type: 'background', paint: { 'background-color': C.water } },
      {
        id: 'land',
        type: 'fill',
        source: 'base',
        'source-layer': 'land',
        paint: { 'fill-color': C.land, 'fill-outline-color': C.waterDeep, 'fill-antialias': true },
      },
      {
        // The sea again, as polygons cut from each tile (the background is the open sea): whatever is
        // drawn between the land and this layer (the season surface) stops at the coast.
        id: 'sea',
        type: 'fill',
        source: 'base',
        'source-layer': 'sea',
        paint: { 'fill-color': C.water, 'fill-antialias': false },
      },
      {
        id: 'coast',
        type: 'line',
        source: 'base',
        'source-layer': 'land',
        paint: { 'line-color': C.waterEdge, 'line-width': ['interpolate', ['linear'], ['zoom'], 0, 0.4, 6, 1.2, 10, 2] },
      },
      {
        id: 'lakes',
        type: 'fill',
        source: 'water',
        'source-layer': 'lakes',
        filter: shownFrom,
        paint: { 'fill-color': C.water, 'fill-outline-color': C.waterEdge },
      },
      {
        id: 'lake-shores',
        type: 'line',
        source: 'water',
        'source-layer': 'lakes',
        filter: shownFrom,
        minzoom: 5,
        paint: { 'line-color': C.waterEdge, 'line-width': ['interpolate', ['linear'], ['zoom'], 5, 0.3, 10, 1] },
      },
      {
        id: 'river-areas',
        type: 'fill',
        source: 'water',
        'source-layer': 'river-areas',
        minzoom: 6,
        paint: { 'fill-color': C.water, 'fill-outline-color': C.waterEdge },
      },
      {
        // Rivers as lines along their 1 km slivers, the gaps joined (scripts/tiles/build-tiles.ts).
        id: 'rivers',
        type: 'line',
        source: 'water',
        'source-layer': 'rivers',
        minzoom: 6,
        layout: { 'line-join': 'round', 'line-cap': 'round' },
        paint: { 'line-color': C.river, 'line-width': ['interpolate', ['exponential', 1.6], ['zoom'], 6, 0.7, 9, 1.8, 12, 4.5, 14, 8] },
      },
      {
        id: 'county-boundaries',
        type: 'line',
        source: 'us',
        'source-layer': 'county-boundaries',
        minzoom: 6,
        paint: { 'line-color': C.countyBorder, 'line-width': ['interpolate', ['linear'], ['zoom'], 6, 0.4, 10, 1] },
      },
      {
        id: 'state-boundaries',
        type: 'line',
        source: 'us',
        'source-layer': 'state-boundaries',
        paint: { 'line-color': C.stateBorder, 'line-width': ['interpolate', ['linear'], ['zoom'], 3, 0.6, 8, 1.4], 'line-dasharray': [3, 2] },
      },
      {
        id: 'country-boundaries',
        type: 'line',
        source: 'base',
        'source-layer': 'boundaries',
        layout: { 'line-join': 'round' },
        paint: { 'line-color': C.countryBorder, 'line-width': ['interpolate', ['linear'], ['zoom'], 0, 0.5, 6, 1.3, 10, 2] },
      },
      {
        id: 'county-labels',
        type: 'symbol',
        source: 'us',
        'source-layer': 'county-labels',
        minzoom: 8.5,
        layout: { 'text-field': ['get', 'name'], 'text-font': [FONT_ITALIC], 'text-size': 11, 'symbol-sort-key': ['-', ['get', 'rank']] },
        paint: { 'text-color': '#8a7d89', ...labelHalo },
      },
      {
        id: 'town-labels',
        type: 'symbol',
        source: 'places',
        'source-layer': 'towns',
        filter: shownFrom,
        minzoom: 7,
        layout: {
          'text-field': ['get', 'name'],
          'text-font': [FONT_REGULAR],
          'text-size': ['interpolate', ['linear'], ['zoom'], 7, 10.5, 12, 13],
          'symbol-sort-key': ['-', ['get', 'rank']],
          'text-padding': 4,
          'text-max-width': 8,
        },
        paint: { 'text-color': C.inkSoft, 'text-opacity': 0.85, ...labelHalo },
      },
      {
        id: 'state-labels',
        type: 'symbol',
        source: 'base',
        'source-layer': 'labels',
        filter: ['all', ['==', ['get', 'kind'], 'state'], shownFrom],
        maxzoom: 8,
        layout: {
          'text-field': ['get', 'name'],
          'text-font': [FONT_REGULAR],
          'text-size': ['interpolate', ['linear'], ['zoom'], 4, 10, 7, 13],
          'text-transform': 'uppercase',
          'text-letter-spacing': 0.12,
          'symbol-sort-key': ['-', ['get', 'rank']],
        },
        paint: { 'text-color': '#9b8797', ...labelHalo },
      },
      {
        id: 'city-labels',
        type: 'symbol',
        source: 'base',
        'source-layer': 'labels',
        filter: ['all', ['==', ['get', 'kind'], 'city'], shownFrom],
        layout: {
          'text-field': ['get', 'name'],
          'text-font': [FONT_REGULAR],
          'text-size': ['interpolate', ['linear'], ['zoom'], 3, 11, 8, 14],
          'symbol-sort-key': ['-', ['get', 'rank']],
          'text-padding': 6,
        },
        paint: { 'text-color': C.inkSoft, ...labelHalo },
      },
      {
        id: 'country-labels',
        type: 'symbol',
        source: 'base',
        'source-layer': 'labels',
        filter: ['all', ['==', ['get', 'kind'], 'country'], shownFrom],
        layout: {
          'text-field': ['get', 'name'],
          'text-font': [FONT_MEDIUM],
          'text-size': ['interpolate', ['linear'], ['zoom'], 1, 10, 5, 15],
          'text-max-width': 7,
          'text-letter-spacing': 0.06,
          'symbol-sort-key': ['-', ['get', 'rank']],
        },
        paint: { 'text-color': C.fig700, 'text-opacity': 0.8, ...labelHalo },
      },
    ],
  };
}
