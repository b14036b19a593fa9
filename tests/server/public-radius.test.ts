import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MIN_PUBLIC_RADIUS_KM, PUBLIC_GRID_STEP_DEG } from '../../shared/domain/public-grid';
import { createTestContext, type TestAgent, type TestContext } from '../helpers/test-app';

/*
 * Every radius a query accepts is at least the public grid cell (issue 15 item 3): a smaller one
 * is refused with a 400 naming radiusKm and the minimum. The minimum is the cell's diagonal
 * rounded up: 0.05 degrees of latitude is 5.56 km (111.2 km per degree, a value from memory of
 * the mean meridian degree), times the square root of 2 is 7.86 km, so 8 km.
 */

let ctx: TestContext;
let grower: TestAgent;
let varietyId = 0;

beforeAll(async () => {
  ctx = createTestContext();
  grower = await ctx.signedIn('grower');
  varietyId = Number(ctx.db.sqlite.prepare("INSERT INTO varieties (name, fig_type, status) VALUES ('Radius Amber (fictional)', 'common', 'accepted')").run().lastInsertRowid);
});
afterAll(() => ctx.db.sqlite.close());

const P = 'lat=42.65&lon=-73.75';
const ROUTES = [
  (r: number) => `/api/atlas/near?${P}&radiusKm=${r}`,
  (r: number) => `/api/varieties/${varietyId}/fit?${P}&radiusKm=${r}`,
  (r: number) => `/api/guidance/ripe-dates?varietyId=${varietyId}&${P}&radiusKm=${r}`,
];

describe('the minimum radius', () => {
  it('is the public cell diagonal rounded up: 8 km', () => {
    expect(PUBLIC_GRID_STEP_DEG * 111.2 * Math.SQRT2).toBeCloseTo(7.86, 2);
    expect(MIN_PUBLIC_RADIUS_KM).toBe(8);
  });

  it('refuses a smaller radius on every radius query with a 400 naming radiusKm and the minimum', async () => {
    for (const route of ROUTES) {
      for (const radius of [0.00001, 1, 7.99]) {
        const res = await ctx.agent().get(route(radius));
        expect(res.status, route(radius)).toBe(400);
        expect(Object.keys(res.body.error.fields)).toEqual(['radiusKm']);
        expect(res.body.error.fields.radiusKm.join(' ')).toContain('at least 8 km');
      }
      expect((await ctx.agent().get(route(MIN_PUBLIC_RADIUS_KM))).status, route(8)).toBe(200);
    }
  });

  it('applies to the nearby digest setting too', async () => {
    const small = await grower.put('/api/email/digest').send({ active: true, radiusKm: 5 });
    expect(small.status).toBe(400);
    expect(small.body.error.fields.radiusKm.join(' ')).toContain('at least 8 km');
    expect((await grower.put('/api/email/digest').send({ active: false, radiusKm: 8 })).status).toBe(200);
  });
});
