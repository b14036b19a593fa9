import type { StyleSpecification } from 'maplibre-gl';

/**
 * A small offline style for the editors' map: a paper background and, where the project's own
 * vector tiles are built (`npm run tiles`, served at /tiles), land and borders. No request leaves
 * the machine; with no tiles built the areas still draw on the plain background.
 */
export function editorsMapStyle(origin: string): StyleSpecification {
  return {
    version: 8,
    sources: {
      base: { type: 'vector', tiles: [`${origin}/tiles/base/{z}/{x}/{y}.pbf`], minzoom: 0, maxzoom: 5 },
    },
    layers: [
      { id: 'background', type: 'background', paint: { 'background-color': '#dfe9ee' } },
      { id: 'land', type: 'fill', source: 'base', 'source-layer': 'land', paint: { 'fill-color': '#faf6ef' } },
      { id: 'boundaries', type: 'line', source: 'base', 'source-layer': 'boundaries', paint: { 'line-color': '#c193ae', 'line-width': 0.8 } },
      { id: 'state-boundaries', type: 'line', source: 'base', 'source-layer': 'state-boundaries', paint: { 'line-color': '#dcbccf', 'line-width': 0.5, 'line-dasharray': [2, 2] } },
    ],
  };
}
