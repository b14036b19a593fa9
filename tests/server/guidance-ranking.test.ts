import { describe, expect, it } from 'vitest';
import { toPublicPoint } from '../../shared/domain/public-grid';
import { reports, trees, varieties, waspAreas } from '../../server/db/schema';
import { insertUser } from '../../server/users/users.repo';
import { geometryBounds } from '../../server/wasp-areas/wasp-areas.repo';
import { createTestContext } from '../helpers/test-app';

/*
 * The "what ripens here" ranking through the real engine (GET /api/atlas/near): a Smyrna variety
 * whose local trees did well must still rank below a common variety where the wasp is absent,
 * and may rank above it where the wasp is established.
 * Texas A&M AgriLife EHT-019 and Condit 1955: Smyrna figs mature only after caprification;
 * common figs need no pollination.
 */
function scenario(withWasp: boolean) {
  const ctx = createTestContext();
  const point = { lat: 42.65, lon: -73.75 };
  const common = ctx.db.insert(varieties).values({ name: 'Plain Common', figType: 'common', ripeningClass: 'early', typicalDaysToRipen: 120 }).returning().get().id;
  const smyrna = ctx.db.insert(varieties).values({ name: 'Wasp Smyrna', figType: 'smyrna', ripeningClass: 'early', typicalDaysToRipen: 120 }).returning().get().id;
  const add = (varietyId: number, n: number, ripened: number) => {
    for (let i = 0; i < n; i++) {
      const userId = insertUser(ctx.db, { email: `g${varietyId}-${i}@example.com`, displayName: 'g', passwordHash: 'x' }).id;
      const treeId = ctx.db.insert(trees).values({ userId, label: 't' }).returning().get().id;
      const at = { lat: point.lat + i * 0.01, lon: point.lon };
      const grid = toPublicPoint(at.lat, at.lon);
      ctx.db
        .insert(reports)
        .values({ userId, treeId, varietyId, ...at, gridLat: grid.lat, gridLon: grid.lon, form: 'ground', season: 2024, crop: 'main', outcome: i < ripened ? 'ripened' : 'unripe', springFrostDate: '2024-04-27', fallFrostDate: '2024-10-15', firstRipeDate: i < ripened ? '2024-08-20' : null })
        .run();
    }
  };
  add(common, 6, 3); // half ripened
  // Every local tree "ripened"; six trees, enough evidence for a verdict (MIN_TREES_FOR_VERDICT).
  add(smyrna, 6, 6);
  if (withWasp) {
    const geometry = { type: 'Polygon' as const, coordinates: [[[-74.5, 42], [-73, 42], [-73, 43.5], [-74.5, 43.5], [-74.5, 42]]] };
    ctx.db.insert(waspAreas).values({ name: 'Test wasp area', geometry, ...geometryBounds(geometry), source: 'test', observedOn: '2024-07-01' }).run();
  }
  return { ctx, point };
}

const order = (body: { varieties: { name: string }[] }) => body.varieties.map((v) => v.name);

describe('ranking through /api/atlas/near', () => {
  it('drops the Smyrna type below the common type where the wasp is absent, marked and explained', async () => {
    const { ctx, point } = scenario(false);
    const res = await ctx.agent().get(`/api/atlas/near?lat=${point.lat}&lon=${point.lon}&radiusKm=50&form=ground`);
    expect(res.status).toBe(200);
    expect(res.body.wasp.established).toBe(false);
    expect(order(res.body)).toEqual(['Plain Common', 'Wasp Smyrna']);
    const smyrna = res.body.varieties[1];
    expect(smyrna.all.share).toBe(1);
    expect(res.body.pollinationByFigType[smyrna.figType].main.fruitExpected).toBe('no');
  });

  it('lets it rank first where the wasp is established', async () => {
    const { ctx, point } = scenario(true);
    const res = await ctx.agent().get(`/api/atlas/near?lat=${point.lat}&lon=${point.lon}&radiusKm=50&form=ground`);
    expect(res.body.wasp.established).toBe(true);
    expect(order(res.body)).toEqual(['Wasp Smyrna', 'Plain Common']);
  });
});
