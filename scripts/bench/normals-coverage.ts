// The reference climate on a fresh install: how long loading the shipped NOAA normals takes, and
// the share of random points in the contiguous US that get a frost-free season (a station within
// 150 km), through the same station snapshot and estimator as GET /api/atlas/near.
import fs from 'node:fs';
import { createRequire } from 'node:module';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { feature } from 'topojson-client';
import type { Topology, GeometryCollection } from 'topojson-specification';
import { createDb, migrateDb } from '../../server/db/client';
import { loadShippedNormals } from '../../server/normals/normals.repo';
import { seededRandom } from '../../server/seed/random';
import { currentStationSnapshot, stationSeasonsInBoxes } from '../../server/stations/station-snapshot';
import { estimateSeason } from '../../shared/domain/season-estimate';

export const COVERAGE_RADIUS_KM = 150;
/** FIPS codes outside the contiguous US: Alaska, Hawaii and the territories. */
const NOT_CONTIGUOUS = new Set(['02', '15', '60', '66', '69', '72', '78']);

/** Even-odd ray casting on longitude/latitude (planar; ample for sampling points inside states). */
function inRings(rings: number[][][], lon: number, lat: number): boolean {
  let inside = false;
  for (const ring of rings) {
    for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
      const [xi, yi] = ring[i]!;
      const [xj, yj] = ring[j]!;
      if (yi! > lat !== yj! > lat && lon < ((xj! - xi!) * (lat - yi!)) / (yj! - yi!) + xi!) inside = !inside;
    }
  }
  return inside;
}

function inGeometry(geometry: GeoJSON.Geometry, lon: number, lat: number): boolean {
  if (geometry.type === 'Polygon') return inRings(geometry.coordinates, lon, lat);
  if (geometry.type === 'MultiPolygon') return geometry.coordinates.some((polygon) => inRings(polygon, lon, lat));
  return false;
}

/** `count` random points on land in the contiguous 48 states and DC (us-atlas, Census Bureau cartographic boundaries). */
export function randomContiguousUsPoints(count: number, seed = 2_110): { lat: number; lon: number }[] {
  const require = createRequire(import.meta.url);
  const topology = require('us-atlas/states-10m.json') as Topology<{ states: GeometryCollection }>;
  const states = feature(topology, topology.objects.states);
  const lower48 = { type: 'FeatureCollection' as const, features: states.features.filter((f) => !NOT_CONTIGUOUS.has(String(f.id))) };
  const random = seededRandom(seed);
  const points: { lat: number; lon: number }[] = [];
  while (points.length < count) {
    const lon = -125 + random() * 58.1;
    const lat = 24.4 + random() * 25.1;
    if (lower48.features.some((f) => inGeometry(f.geometry, lon, lat))) points.push({ lat, lon });
  }
  return points;
}

export function normalsCoverage(): { loadMs: number; secondLoadMs: number; stations: number; share: number; points: number; estimateMs: Record<50 | 200, number> } {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'syconium-normals-bench-'));
  const db = createDb(path.join(dir, 'fresh.db'));
  try {
    migrateDb(db);
    let t0 = performance.now();
    const loaded = loadShippedNormals(db)!;
    const loadMs = performance.now() - t0;
    t0 = performance.now();
    loadShippedNormals(db);
    const secondLoadMs = performance.now() - t0;
    const snapshot = currentStationSnapshot(db);
    const points = randomContiguousUsPoints(1000);
    let withSeason = 0;
    for (const point of points) {
      const season = estimateSeason({ point, stations: stationSeasonsInBoxes(snapshot, point, COVERAGE_RADIUS_KM), reportFrostSeasons: [], radiusKm: COVERAGE_RADIUS_KM });
      if (season.days50 !== null && season.sources.some((s) => s.period)) withSeason++;
    }
    // The season estimate's own share of a near call with every normals station in memory (the
    // station snapshot and estimateSeason), median over the same points.
    const estimateMs = { 50: 0, 200: 0 };
    for (const radiusKm of [50, 200] as const) {
      const times: number[] = [];
      for (const point of points) {
        const t = performance.now();
        estimateSeason({ point, stations: stationSeasonsInBoxes(currentStationSnapshot(db), point, radiusKm), reportFrostSeasons: [], radiusKm });
        times.push(performance.now() - t);
      }
      times.sort((a, b) => a - b);
      estimateMs[radiusKm] = times[Math.floor(times.length / 2)]!;
    }
    return { loadMs, secondLoadMs, stations: loaded.added.length, share: withSeason / points.length, points: points.length, estimateMs };
  } finally {
    db.sqlite.close();
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const r = normalsCoverage();
  console.log(r);
}
