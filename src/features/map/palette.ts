/**
 * The map's colours, taken from the app's palette in src/index.css (fig plum, leaf green, warm
 * paper, soft ink) plus two quiet tones for water and land that sit between them.
 */
export const MAP_COLORS = {
  water: '#d3e1e2',
  waterDeep: '#c6d6d8',
  waterEdge: '#b7cacd',
  river: '#a9c6cc',
  land: '#f8f3ea',
  paper: '#faf6ef',
  ink: '#2b2230',
  inkSoft: '#5b4f5e',
  countryBorder: '#b58ea6',
  stateBorder: '#d4bfcb',
  countyBorder: '#e6dae0',
  fig300: '#c193ae',
  fig500: '#8e4f73',
  fig600: '#6b3a5b',
  fig700: '#552c48',
  fig900: '#2f1828',
  leaf300: '#a9c79d',
  leaf500: '#5e8a57',
  leaf700: '#3d5e39',
  amberSoft: '#f3d9a4',
} as const;

/**
 * Frost-free days to colour: a sequential ramp of our own, from pale straw (short seasons) through
 * sage and sea green to slate and deep fig (long seasons). Lightness falls steadily along it, so
 * longer always reads darker, whatever the colour vision. Here, not beside the surface's drawing code
 * (which needs MapLibre), so the legend on the first screen does not wait for the map's code.
 */
export const SEASON_RAMP: readonly { days: number; color: string }[] = [
  { days: 90, color: '#f4f0d9' },
  { days: 140, color: '#dfe3b8' },
  { days: 180, color: '#b3d0a6' },
  { days: 215, color: '#7fb1a0' },
  { days: 250, color: '#5b8a98' },
  { days: 290, color: '#4f5f86' },
  { days: 340, color: '#4a3466' },
];
