import { beforeAll, describe, expect, it } from 'vitest';
import { toPublicPoint } from '../../shared/domain/public-grid';
import { evidenceStrength, nodeLat, nodeLon, SURFACE_CELLS, THIN_EVIDENCE } from '../../shared/domain/season-surface';
import { seasonAtResponseSchema, seasonGridSchema } from '../../shared/schemas/season-surface';
import { writeStation } from '../../server/stations/stations.repo';
import { lonLatToTile } from '../../scripts/tiles/tile-math';
import { createTestContext, type TestContext } from '../helpers/test-app';

/*
 * The season surface (GET /api/atlas/season-grid/:z/:x/:y, GET /api/atlas/season-at): every node is
 * the estimate GET /api/atlas/near gives at that point. Distances: one degree of latitude is
 * 111.195 km on the IUGG mean sphere R1 = 6371.0088 km (Moritz, Geodetic Reference System 1980;
 * ../shared/CHECKS.md).
 */
const KM_PER_DEG_LAT = 111.195;
let ctx: TestContext;

// A tile at zoom 9 over central Kansas; its north-west node is where station A stands.
const TILE = lonLatToTile(-98.5, 38.5, 9);
const NODE = { lat: nodeLat(TILE.z, TILE.y, 0), lon: nodeLon(TILE.z, TILE.x, 0) };

function addStation(name: string, at: { lat: number; lon: number }, days50: number) {
  ctx.db.transaction(() =>
    writeStation(ctx.db, { name, code: name, lat: at.lat, lon: at.lon, elevationM: null }, {
      days: [],
      freezeYears: [],
      summaries: [10, 50, 90].map((probability) => ({ thresholdF: 32, probability, lastSpringDoy: 110, firstFallDoy: 290, seasonDays: days50 + (probability - 50), years: 30 })),
    }),
  );
}

beforeAll(() => {
  ctx = createTestContext();
  addStation('A', NODE, 200);
  addStation('B', { lat: NODE.lat + 2 / KM_PER_DEG_LAT, lon: NODE.lon }, 150);
  // A grower 30 km south of the node reported one season's frost dates (invented test data).
  const userId = Number(ctx.db.sqlite.prepare("INSERT INTO users (email, display_name, password_hash) VALUES ('g@example.com', 'G', 'x')").run().lastInsertRowid);
  const varietyId = Number(ctx.db.sqlite.prepare("INSERT INTO varieties (name, fig_type, status) VALUES ('Test Amber (fictional)', 'common', 'accepted')").run().lastInsertRowid);
  const treeId = Number(ctx.db.sqlite.prepare("INSERT INTO trees (user_id, label) VALUES (?, 'tree')").run(userId).lastInsertRowid);
  const at = { lat: NODE.lat - 30 / KM_PER_DEG_LAT, lon: NODE.lon };
  const grid = toPublicPoint(at.lat, at.lon);
  ctx.db.sqlite
    .prepare(
      `INSERT INTO reports (user_id, tree_id, variety_id, lat, lon, grid_lat, grid_lon, form, season, crop, outcome, spring_frost_date, fall_frost_date, status)
       VALUES (?, ?, ?, ?, ?, ?, ?, 'ground', 2024, 'main', 'ripened', '2024-04-20', '2024-10-20', 'published')`,
    )
    .run(userId, treeId, varietyId, at.lat, at.lon, grid.lat, grid.lon);
});

const grid = async (z: number, x: number, y: number) => seasonGridSchema.parse((await ctx.agent().get(`/api/atlas/season-grid/${z}/${x}/${y}`).expect(200)).body);

describe('the season surface', () => {
  it('weights the stations by 1/distance² at a node, as Shepard’s method does (worked by hand)', async () => {
    const tile = await grid(TILE.z, TILE.x, TILE.y);
    expect(tile.cells).toBe(SURFACE_CELLS);
    expect(tile.days50).toHaveLength((SURFACE_CELLS + 1) ** 2);
    // Station A on the node (distance floored to 1 km: weight 1), B 2 km north (weight 1/4), and
    // the grower's 183-day season (Apr 20 to Oct 20) at 30 km, weighing a quarter of a station:
    // 0.25/900. (200·1 + 150·0.25 + 183·0.25/900) / (1 + 0.25 + 0.25/900) = 189.998... -> 190.
    expect(tile.days50[0]).toBe(190);
    expect(tile.stations[0]).toBe(2);
    expect(tile.reports[0]).toBe(1);
    expect(tile.nearestKm[0]).toBe(0);
  });

  it('gives at every node exactly the season GET /api/atlas/near gives there', async () => {
    const tile = await grid(TILE.z, TILE.x, TILE.y);
    const side = SURFACE_CELLS + 1;
    for (const [i, j] of [[0, 0], [5, 3], [8, 8], [2, 7]] as const) {
      const lat = nodeLat(TILE.z, TILE.y, j);
      const lon = nodeLon(TILE.z, TILE.x, i);
      const near = (await ctx.agent().get(`/api/atlas/near?lat=${lat}&lon=${lon}`).expect(200)).body;
      expect(tile.days50[j * side + i], `node ${i},${j}`).toBe(near.season.days50);
      expect(tile.stations[j * side + i]).toBe(near.season.stationCount);
      expect(tile.reports[j * side + i]).toBe(near.season.reportFrostCount);
      const at = seasonAtResponseSchema.parse((await ctx.agent().get(`/api/atlas/season-at?lat=${lat}&lon=${lon}`).expect(200)).body);
      expect(at.season).toEqual(near.season);
    }
  });

  it('is empty where nothing is in range, and follows a station change at once', async () => {
    const far = await grid(3, 0, 0);
    expect(far.days50.every((d) => d === null)).toBe(true);
    const before = await grid(TILE.z, TILE.x, TILE.y);
    addStation('C', { lat: NODE.lat, lon: NODE.lon + 0.01 }, 260);
    const after = await grid(TILE.z, TILE.x, TILE.y);
    expect(after.version).not.toBe(before.version);
    expect(after.days50[0]).toBeGreaterThan(before.days50[0]!);
  });

  it('refuses a tile off the map and a bad point with a 400 naming the field', async () => {
    const off = await ctx.agent().get('/api/atlas/season-grid/3/8/0');
    expect(off.status).toBe(400);
    expect(JSON.stringify(off.body)).toMatch(/x/);
    expect((await ctx.agent().get('/api/atlas/season-grid/14/0/0')).status).toBe(400);
    const bad = await ctx.agent().get('/api/atlas/season-at?lat=91&lon=0');
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.body)).toMatch(/lat/);
  });

  it('calls evidence thin when the nearest station is far or stands alone', () => {
    expect(evidenceStrength(3, 0, 10)).toBe(1);
    expect(evidenceStrength(1, 0, 10)).toBeLessThan(1);
    expect(evidenceStrength(2, 0, 90)).toBeLessThan(THIN_EVIDENCE);
    expect(evidenceStrength(0, 5, null)).toBeLessThan(THIN_EVIDENCE);
    expect(evidenceStrength(0, 0, null)).toBe(0);
  });
});
