import { VectorTile } from '@mapbox/vector-tile';
import { GeoJSONVT } from '@maplibre/geojson-vt';
import { area } from '@turf/turf';
import type { GeoJSONVTTile } from '@maplibre/geojson-vt';
import type { FeatureCollection, MultiPolygon, Polygon } from 'geojson';
import fs from 'node:fs';
import { createRequire } from 'node:module';
import { PbfReader } from 'pbf';
import { feature } from 'topojson-client';
import type { GeometryCollection, Topology } from 'topojson-specification';
import { describe, expect, it } from 'vitest';
import { crossesAntimeridian, splitAtAntimeridian } from '../../scripts/tiles/antimeridian';
import { encodeTile, seaOfTile } from '../../scripts/tiles/build-tiles';
import { childTiles, lonLatToTile, tileToLonLat } from '../../scripts/tiles/tile-math';

const require = createRequire(import.meta.url);

describe('tile numbering', () => {
  // Formula from the OpenStreetMap wiki, "Slippy map tilenames" (recalled from memory):
  // x = floor((lon + 180) / 360 * 2^z), y = floor((1 - ln(tan(lat) + sec(lat)) / pi) / 2 * 2^z).
  it('puts Albany International Airport (42.7431 N, 73.8092 W) in tile 10/302/377', () => {
    // Worked by hand from the formula above: x = floor(106.1908 / 360 * 1024) = floor(302.05) = 302;
    // ln(tan(42.7431 deg) + sec(42.7431 deg)) = 0.8267, y = floor((1 - 0.8267 / pi) / 2 * 1024) = floor(377.27) = 377.
    expect(lonLatToTile(-73.8092, 42.7431, 10)).toEqual({ z: 10, x: 302, y: 377 });
  });

  it('numbers the world from the north-west: zoom 0 is one tile, zoom 1 splits at Greenwich and the equator', () => {
    // Same wiki page: tile 0/0/0 is the whole world; x grows eastward and y southward.
    expect(lonLatToTile(12.3, -40, 0)).toEqual({ z: 0, x: 0, y: 0 });
    expect(lonLatToTile(-100, 40, 1)).toEqual({ z: 1, x: 0, y: 0 });
    expect(lonLatToTile(100, -40, 1)).toEqual({ z: 1, x: 1, y: 1 });
    // The edge of Web Mercator's square world is at atan(sinh(pi)) = 85.0511 degrees.
    expect(tileToLonLat(0, 0, 0).lat).toBeCloseTo(85.0511, 4);
    expect(tileToLonLat(0, 0, 0).lon).toBe(-180);
  });

  it('agrees with the reference tiler (geojson-vt) on which tile holds a point, at every zoom', () => {
    // geojson-vt is MapLibre's own tiler; with no buffer, only the tile holding the point gets it.
    const places: [number, number][] = [[-73.8092, 42.7431], [-0.13, 51.51], [-122.33, 47.61], [151.21, -33.87], [-179.9, 65.5]];
    for (const [lon, lat] of places) {
      const index = new GeoJSONVT({ type: 'Feature', properties: {}, geometry: { type: 'Point', coordinates: [lon, lat] } }, { maxZoom: 9, buffer: 0, indexMaxZoom: 0 });
      for (const z of [3, 6, 9]) {
        const { x, y } = lonLatToTile(lon, lat, z);
        expect(index.getTile(z, x, y)?.features.length ?? 0, `${lon},${lat} z${z}`).toBe(1);
        expect(index.getTile(z, (x + 1) % 2 ** z, y)?.features.length ?? 0).toBe(0);
        expect(index.getTile(z, x, Math.max(0, y - 1))?.features.length ?? 0).toBe(0);
      }
    }
  });

  it('splits a tile into its four children', () => {
    expect(childTiles({ z: 2, x: 1, y: 3 })).toEqual([
      { z: 3, x: 2, y: 6 },
      { z: 3, x: 3, y: 6 },
      { z: 3, x: 2, y: 7 },
      { z: 3, x: 3, y: 7 },
    ]);
  });
});

describe('the 180th meridian', () => {
  it('cuts a ring that crosses it into one piece on each side', () => {
    const square: Polygon = { type: 'Polygon', coordinates: [[[170, 0], [-170, 0], [-170, 10], [170, 10], [170, 0]]] };
    expect(crossesAntimeridian(square)).toBe(true);
    const split = splitAtAntimeridian(square);
    expect(split.coordinates).toHaveLength(2);
    expect(crossesAntimeridian(split)).toBe(false);
    const ranges = split.coordinates.map((rings) => {
      const lons = rings[0]!.map((p) => p[0]!);
      return [Math.min(...lons), Math.max(...lons)];
    });
    expect(ranges).toContainEqual([170, 180]);
    expect(ranges).toContainEqual([-180, -170]);
  });

  it('leaves an ordinary polygon as it is', () => {
    const ring = [[-74, 42], [-73, 42], [-73, 43], [-74, 43], [-74, 42]];
    expect(splitAtAntimeridian({ type: 'Polygon', coordinates: [ring] }).coordinates).toEqual([[ring]]);
  });

  it('keeps Russia whole and off the band: every ring within -180..180 and the area close to the published one', () => {
    const topology = JSON.parse(fs.readFileSync(require.resolve('world-atlas/countries-50m.json'), 'utf8')) as Topology;
    const countries = feature(topology, topology.objects.countries as GeometryCollection) as unknown as FeatureCollection<Polygon | MultiPolygon, { name: string }>;
    const russia = countries.features.find((f) => f.properties.name === 'Russia')!;
    const split = splitAtAntimeridian(russia.geometry);
    expect(crossesAntimeridian(split)).toBe(false);
    const lons = split.coordinates.flat(2).map((p) => p[0]!);
    expect(Math.min(...lons)).toBeGreaterThanOrEqual(-180);
    expect(Math.max(...lons)).toBeLessThanOrEqual(180);
    // CIA World Factbook, Russia, total area 17,098,242 km2 (recalled from memory); Natural Earth's
    // 1:50m outline (without inland water detail) should land within a few percent of it.
    const km2 = area(split) / 1e6;
    expect(Math.abs(km2 - 17_098_242) / 17_098_242).toBeLessThan(0.04);
  });

  it('closes Antarctica along the bottom edge instead of drawing across the world', () => {
    const topology = JSON.parse(fs.readFileSync(require.resolve('world-atlas/land-110m.json'), 'utf8')) as Topology;
    const land = feature(topology, topology.objects.land as GeometryCollection) as unknown as FeatureCollection<MultiPolygon>;
    const split = splitAtAntimeridian(land.features[0]!.geometry);
    expect(crossesAntimeridian(split)).toBe(false);
    // No ring of any continent spans the world from edge to edge except along the south pole.
    const wide = split.coordinates.filter((rings) => {
      const lons = rings[0]!.map((p) => p[0]!);
      return Math.max(...lons) - Math.min(...lons) > 350;
    });
    expect(wide.every((rings) => Math.min(...rings[0]!.map((p) => p[1]!)) < -60)).toBe(true);
  });
});

describe('encoding tiles', () => {
  it('writes a point into the tile that holds it and nowhere else, with its properties', () => {
    const labels = new GeoJSONVT({ type: 'FeatureCollection', features: [{ type: 'Feature', properties: { name: 'Albany', minzoom: 5 }, geometry: { type: 'Point', coordinates: [-73.7562, 42.6526] } }] }, { maxZoom: 10, buffer: 0 });
    const layers = [{ name: 'labels', byZoom: () => labels, minzoomProperty: true }];
    const at = lonLatToTile(-73.7562, 42.6526, 8);
    const data = encodeTile(layers, at)!;
    const tile = new VectorTile(new PbfReader(data));
    expect(tile.layers.labels!.length).toBe(1);
    expect(tile.layers.labels!.feature(0).properties.name).toBe('Albany');
    expect(encodeTile(layers, { ...at, x: at.x + 1 })).toBeNull();
    // Below the label's zoom the tile stays empty.
    expect(encodeTile(layers, lonLatToTile(-73.7562, 42.6526, 4))).toBeNull();
  });
});

describe('the sea layer', () => {
  // Tile coordinates: 4096 units a side, 64 of buffer around (geojson-vt's settings in build-tiles.ts).
  const SIDE = 4096 + 2 * 64;
  const shoelace = (ring: number[][]) => ring.slice(0, -1).reduce((sum, [x, y], i) => sum + x! * ring[i + 1]![1]! - ring[i + 1]![0]! * y!, 0) / 2;
  const landTile = (ring: number[][]) => ({ features: [{ type: 3, tags: {}, geometry: [ring] }] }) as unknown as GeoJSONVTTile;

  it('is the whole tile where there is no land', () => {
    const sea = seaOfTile(null)!;
    const rings = sea.features[0]!.geometry as number[][][];
    expect(rings).toHaveLength(1);
    expect(shoelace(rings[0]!)).toBe(SIDE * SIDE);
  });

  it('is the tile less its land, outer rings written the way geojson-vt writes land (positive area), and reads back as one polygon', () => {
    // Land over the west half of the tile (x up to 2048): the sea is the east half, 2112 x 4224.
    const sea = seaOfTile(landTile([[-64, -64], [2048, -64], [2048, 4160], [-64, 4160], [-64, -64]]))!;
    const rings = sea.features[0]!.geometry as number[][][];
    expect(rings).toHaveLength(1);
    expect(shoelace(rings[0]!)).toBe(2112 * SIDE);
    // An island in the middle: the sea is the tile with a hole (outer positive, hole negative).
    const island = seaOfTile(landTile([[1000, 1000], [3000, 1000], [3000, 3000], [1000, 3000], [1000, 1000]]))!;
    const [outer, hole] = island.features[0]!.geometry as number[][][];
    expect(shoelace(outer!)).toBe(SIDE * SIDE);
    expect(shoelace(hole!)).toBe(-2000 * 2000);
    // Encoded as a vector tile and read back (@mapbox/vector-tile classifies rings by their winding): one polygon with its hole.
    const data = encodeTile([{ name: 'sea', byZoom: () => ({ getTile: () => island }) }], { z: 0, x: 0, y: 0 })!;
    const read = new VectorTile(new PbfReader(data)).layers.sea!.feature(0).toGeoJSON(0, 0, 0);
    expect(read.geometry.type).toBe('Polygon');
    expect((read.geometry as Polygon).coordinates).toHaveLength(2);
  });
});
