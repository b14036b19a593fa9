import { describe, expect, it } from 'vitest';
import { createTestContext } from '../helpers/test-app';
import { seedDatabase } from '../../server/seed';
import { findWaspAreasAt } from '../../server/wasp-areas/wasp-areas.repo';

// The demo seed parses two GHCN station files: give it room on a busy machine.
describe('public catalogue reads', { timeout: 60_000 }, () => {
  it('finds a variety by a synonym, case-insensitively', async () => {
    const { db, agent } = createTestContext();
    await seedDatabase(db, { seedDemo: true, demoAtlas: false }); // the story's varieties are enough
    const res = await agent().get('/api/varieties?q=amber%20LANTERN');
    expect(res.status).toBe(200);
    expect(res.body.varieties.map((v: { name: string }) => v.name)).toEqual(['Lantern Amber']);
  });

  it('names the bad parameter', async () => {
    const { agent } = createTestContext();
    const res = await agent().get('/api/varieties?status=bogus');
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('status');
  });

  it('serves wasp areas as GeoJSON and finds the area around a point', async () => {
    const { db, agent } = createTestContext();
    await seedDatabase(db, { seedDemo: true, demoAtlas: false }); // the story's wasp areas are enough
    const res = await agent().get('/api/wasp-areas');
    expect(res.body.type).toBe('FeatureCollection');
    expect(res.body.features).toHaveLength(2);
    expect(findWaspAreasAt(db, 38.58, -121.49).map((a) => a.name)).toEqual(['Lower Sacramento Valley (demo)']);
    expect(findWaspAreasAt(db, 42.65, -73.75)).toEqual([]);
  });
});

describe('demo seed', { timeout: 120_000 }, () => {
  it('is idempotent', async () => {
    const { db } = createTestContext();
    await seedDatabase(db, { seedDemo: true });
    const counts = () => db.sqlite.prepare('SELECT (SELECT count(*) FROM users) u, (SELECT count(*) FROM reports) r, (SELECT count(*) FROM varieties) v, (SELECT count(*) FROM wasp_areas) w').get();
    const first = counts();
    await seedDatabase(db, { seedDemo: true });
    expect(counts()).toEqual(first);
  });
});
