import { describe, expect, it } from 'vitest';
import { seedDatabase } from '../../server/seed';
import { DEMO_TOWNS } from '../../server/seed/demo-scenario';
import { createTestContext } from '../helpers/test-app';

describe('demo climate stations', () => {
  it('are seeded once, real and synthetic, so every demo town has a season nearby', async () => {
    const { db, agent } = createTestContext();
    await seedDatabase(db, { seedDemo: true });
    const count = () => db.sqlite.prepare('SELECT (SELECT count(*) FROM stations) s, (SELECT count(*) FROM station_days) d, (SELECT count(*) FROM station_summaries) m').get();
    const first = count();
    await seedDatabase(db, { seedDemo: true });
    expect(count()).toEqual(first);

    const { body } = await agent().get('/api/stations');
    const names = body.stations.map((s: { name: string }) => s.name);
    expect(names).toContain('Albany International Airport, NY');
    expect(names).toContain('Milwaukee Mitchell International Airport, WI');
    expect(names.filter((n: string) => n.endsWith('(demo, synthetic)'))).toHaveLength(DEMO_TOWNS.length - 2);

    for (const town of DEMO_TOWNS) {
      const res = await agent().get(`/api/atlas/near?lat=${town.lat}&lon=${town.lon}&radiusKm=50`);
      expect(res.status).toBe(200);
      expect(res.body.season.stationCount, town.name).toBeGreaterThanOrEqual(1);
      expect(res.body.varieties.length, town.name).toBeGreaterThan(0);
      // The synthetic stations are tuned to the story's season; the real ones are real (Albany's
      // 1991-2017 median is about 170 days, the story says 165): "roughly" is within 25 days.
      expect(Math.abs(res.body.season.days50 - town.seasonDays), town.name).toBeLessThanOrEqual(25);
    }
  }, 120_000); // seeding reads and computes a dozen stations: slow on a busy machine
});
