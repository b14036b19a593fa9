import { addProtocol } from 'maplibre-gl';
import { evidenceStrength, SURFACE_CELLS, SURFACE_MAX_ZOOM, SURFACE_MIN_ZOOM, THIN_EVIDENCE } from '@shared/domain/season-surface';
import { seasonGridSchema, type SeasonGrid } from '@shared/schemas/season-surface';
import { apiFetch } from '../../lib/api-client';
import { SEASON_RAMP } from './palette';

/*
 * The season surface as map tiles: each tile's nodes come from GET /api/atlas/season-grid (the
 * season estimate at each node) and are drawn here, blended between nodes, into a 256 px image
 * that MapLibre shows as a raster layer. Faded where the evidence is far, hatched where it is thin.
 * The grids stay in memory, so the map can read the value it draws at any point.
 */

export const SEASON_PROTOCOL = 'syconium-season';
export const SEASON_TILE_URL = `${SEASON_PROTOCOL}://{z}/{x}/{y}`;
export const SEASON_SOURCE = { type: 'raster' as const, tiles: [SEASON_TILE_URL], tileSize: 256, minzoom: SURFACE_MIN_ZOOM, maxzoom: SURFACE_MAX_ZOOM };

const RAMP_RGB = SEASON_RAMP.map((s) => ({ days: s.days, rgb: [1, 3, 5].map((k) => parseInt(s.color.slice(k, k + 2), 16)) as [number, number, number] }));

/** The colour of a season length, blended between the ramp's stops. */
export function seasonColor(days: number): [number, number, number] {
  if (days <= RAMP_RGB[0]!.days) return RAMP_RGB[0]!.rgb;
  for (let k = 1; k < RAMP_RGB.length; k++) {
    const hi = RAMP_RGB[k]!;
    if (days <= hi.days) {
      const lo = RAMP_RGB[k - 1]!;
      const t = (days - lo.days) / (hi.days - lo.days);
      return [0, 1, 2].map((c) => Math.round(lo.rgb[c]! + t * (hi.rgb[c]! - lo.rgb[c]!))) as [number, number, number];
    }
  }
  return RAMP_RGB[RAMP_RGB.length - 1]!.rgb;
}

const grids = new Map<string, SeasonGrid>();
const MAX_GRIDS = 400;

function keep(grid: SeasonGrid): void {
  const key = `${grid.z}/${grid.x}/${grid.y}`;
  grids.delete(key);
  grids.set(key, grid);
  if (grids.size > MAX_GRIDS) grids.delete(grids.keys().next().value!);
}

const TILE = 256;
const side = SURFACE_CELLS + 1;

/** How much of the blend at (u, v) comes from nodes with a value (0 to 1): the surface fades out with it at its edge. */
let lastCoverage = 0;

/** Blend the four nodes around (u, v) in node units; nodes without a value are left out. */
function blend(values: (number | null)[], u: number, v: number): number | null {
  const i = Math.min(SURFACE_CELLS - 1, Math.floor(u));
  const j = Math.min(SURFACE_CELLS - 1, Math.floor(v));
  const fu = u - i;
  const fv = v - j;
  let sum = 0;
  let weight = 0;
  const add = (ii: number, jj: number, w: number) => {
    const value = values[jj * side + ii];
    if (value === null || value === undefined || w === 0) return;
    sum += value * w;
    weight += w;
  };
  add(i, j, (1 - fu) * (1 - fv));
  add(i + 1, j, fu * (1 - fv));
  add(i, j + 1, (1 - fu) * fv);
  add(i + 1, j + 1, fu * fv);
  lastCoverage = weight;
  return weight > 0 ? sum / weight : null;
}

/** Draws one tile's grid into RGBA pixels. */
export function paintSeasonTile(grid: SeasonGrid, pixels: Uint8ClampedArray): void {
  const strength = grid.days50.map((d, k) => (d === null ? null : evidenceStrength(grid.stations[k]!, grid.reports[k]!, grid.nearestKm[k]!, grid.radiusKm)));
  const scale = SURFACE_CELLS / TILE;
  for (let py = 0; py < TILE; py++) {
    const v = (py + 0.5) * scale;
    for (let px = 0; px < TILE; px++) {
      const o = (py * TILE + px) * 4;
      const u = (px + 0.5) * scale;
      const days = blend(grid.days50, u, v);
      if (days === null) {
        pixels[o + 3] = 0;
        continue;
      }
      const coverage = lastCoverage;
      const s = blend(strength, u, v) ?? 0;
      let [r, g, b] = seasonColor(days);
      let alpha = (0.25 + 0.6 * s) * Math.min(1, coverage * 1.6);
      // Thin evidence: diagonal hatching every 9 px, in the ink colour, over a paler fill.
      if (s < THIN_EVIDENCE && (px + py) % 9 < 2) {
        [r, g, b] = [91, 79, 94];
        alpha = 0.32 * Math.min(1, coverage * 1.6);
      }
      pixels[o] = r;
      pixels[o + 1] = g;
      pixels[o + 2] = b;
      pixels[o + 3] = Math.round(alpha * 255);
    }
  }
}

let registered = false;

/** Teaches MapLibre the season tiles' address scheme; call before the layer is added. */
export function registerSeasonProtocol(): void {
  if (registered) return;
  registered = true;
  addProtocol(SEASON_PROTOCOL, async (params, abortController) => {
    const [z, x, y] = params.url.slice(SEASON_PROTOCOL.length + 3).split('/').map(Number);
    const grid = await apiFetch(`/api/atlas/season-grid/${z}/${x}/${y}`, seasonGridSchema, { signal: abortController.signal });
    keep(grid);
    const canvas = new OffscreenCanvas(TILE, TILE);
    const context = canvas.getContext('2d')!;
    const image = context.createImageData(TILE, TILE);
    paintSeasonTile(grid, image.data);
    context.putImageData(image, 0, 0);
    const blob = await canvas.convertToBlob({ type: 'image/png' });
    return { data: await blob.arrayBuffer() };
  });
}

/**
 * The surface's value at a point as drawn: the typical frost-free days blended from the loaded
 * tile's nodes at the deepest zoom loaded there (at a node, exactly the estimate at that node).
 */
export function seasonSurfaceValueAt(lon: number, lat: number): number | null {
  for (let z = SURFACE_MAX_ZOOM; z >= SURFACE_MIN_ZOOM; z--) {
    const n = 2 ** z;
    const fx = ((lon + 180) / 360) * n;
    const latRad = (lat * Math.PI) / 180;
    const fy = ((1 - Math.log(Math.tan(latRad) + 1 / Math.cos(latRad)) / Math.PI) / 2) * n;
    const x = Math.floor(fx);
    const y = Math.floor(fy);
    const grid = grids.get(`${z}/${x}/${y}`);
    if (!grid) continue;
    return blend(grid.days50, (fx - x) * SURFACE_CELLS, (fy - y) * SURFACE_CELLS);
  }
  return null;
}
