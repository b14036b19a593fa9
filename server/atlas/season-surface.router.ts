import type { Router } from 'express';
import { SURFACE_CELLS, SURFACE_MAX_ZOOM, SURFACE_RADIUS_KM, nodeLat, nodeLon } from '../../shared/domain/season-surface';
import { seasonAtQuerySchema, seasonGridParamsSchema, type SeasonAtResponse, type SeasonGrid, type SeasonGridParams } from '../../shared/schemas/season-surface';
import type { Db } from '../db/client';
import { stationsDataVersion } from '../db/data-version';
import { seasonAt } from './season-at';
import type { TreeSnapshotCache } from './tree-snapshot-cache';
import { frostTreesWithin, type TreeSnapshot } from './tree-snapshot';

/** Tiles kept ready as JSON text (about 4 KB each): a few hours of panning over a region. */
const MAX_CACHED_TILES = 4_000;

/** Nodes kept per data version: neighbouring tiles share their edges, and a tile shares a quarter of its nodes with the tile above it. */
const MAX_CACHED_NODES = 250_000;
type NodeValue = [days50: number | null, stations: number, reports: number, nearestKm: number | null];

/**
 * A node's place as one number at the deepest zoom's node spacing, so the same node reached from
 * any zoom (or from either neighbouring tile) has the same key.
 */
function nodeKey(z: number, x: number, y: number, i: number, j: number): number {
  const scale = 2 ** (SURFACE_MAX_ZOOM - z);
  const perRow = 2 ** SURFACE_MAX_ZOOM * SURFACE_CELLS + 1;
  return ((y * SURFACE_CELLS + j) * scale) * perRow + (x * SURFACE_CELLS + i) * scale;
}

/** Every node of one tile, each through seasonAt: the same estimate as GET /api/atlas/near's season. */
export function computeSeasonGrid(db: Db, snapshot: TreeSnapshot, { z, x, y }: SeasonGridParams, version: string, nodes = new Map<number, NodeValue>()): SeasonGrid {
  const side = SURFACE_CELLS + 1;
  const grid: SeasonGrid = { z, x, y, cells: SURFACE_CELLS, radiusKm: SURFACE_RADIUS_KM, version, days50: [], stations: [], reports: [], nearestKm: [] };
  for (let j = 0; j < side; j++) {
    const lat = nodeLat(z, y, j);
    for (let i = 0; i < side; i++) {
      const key = nodeKey(z, x, y, i, j);
      let value = nodes.get(key);
      if (!value) {
        const point = { lat, lon: nodeLon(z, x, i) };
        const season = seasonAt(db, point, SURFACE_RADIUS_KM, frostTreesWithin(snapshot, point, SURFACE_RADIUS_KM));
        value = [season.days50, season.stationCount, season.reportFrostCount, season.nearestStationKm];
        if (nodes.size >= MAX_CACHED_NODES) nodes.delete(nodes.keys().next().value!);
        nodes.set(key, value);
      }
      grid.days50.push(value[0]);
      grid.stations.push(value[1]);
      grid.reports.push(value[2]);
      grid.nearestKm.push(value[3]);
    }
  }
  return grid;
}

/**
 * GET /atlas/season-grid/:z/:x/:y and GET /atlas/season-at, added to the atlas router so they
 * share its tree snapshot. Tiles and their nodes are kept per stations and atlas data version
 * (oldest dropped first), so panning back is a map look-up and a change of data recomputes them.
 */
export function addSeasonSurfaceRoutes(router: Router, { db, snapshots }: { db: Db; snapshots: TreeSnapshotCache }): void {
  const tiles = new Map<string, string>();
  let nodes = { version: '', values: new Map<number, NodeValue>() };

  router.get('/atlas/season-grid/:z/:x/:y', async (req, res) => {
    const tile = seasonGridParamsSchema.parse(req.params);
    const snapshot = await snapshots.get();
    const version = `${stationsDataVersion(db)}.${snapshot.version}`;
    const key = `${version}/${tile.z}/${tile.x}/${tile.y}`;
    let body = tiles.get(key);
    if (body === undefined) {
      if (nodes.version !== version) nodes = { version, values: new Map() };
      body = JSON.stringify(computeSeasonGrid(db, snapshot, tile, version, nodes.values));
      if (tiles.size >= MAX_CACHED_TILES) tiles.delete(tiles.keys().next().value!);
    } else {
      tiles.delete(key);
    }
    tiles.set(key, body);
    res.setHeader('Cache-Control', 'no-cache');
    res.type('application/json').send(body);
  });

  router.get('/atlas/season-at', async (req, res) => {
    const point = seasonAtQuerySchema.parse(req.query);
    const snapshot = await snapshots.get();
    const season = seasonAt(db, point, SURFACE_RADIUS_KM, frostTreesWithin(snapshot, point, SURFACE_RADIUS_KM));
    const body: SeasonAtResponse = { point, radiusKm: SURFACE_RADIUS_KM, season };
    res.json(body);
  });
}
