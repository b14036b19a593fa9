import { eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { users } from '../../server/db/schema';
import { seedDatabase } from '../../server/seed';
import { DATA_LICENCE } from '../../shared/domain/data-licence';
import { createTestContext } from '../helpers/test-app';

const ctx = createTestContext();

describe('the open-data licence of published reports', () => {
  it('refuses a sign-up without agreement to the licence, naming acceptDataLicence, and records the agreement and when', async () => {
    const refused = await ctx.agent().post('/api/auth/sign-up').send({ email: 'nolicence@example.com', displayName: 'No licence', password: 'a long enough password' });
    expect(refused.status).toBe(400);
    expect(refused.body.error.fields.acceptDataLicence[0]).toContain('CC BY 4.0');
    const declined = await ctx.agent().post('/api/auth/sign-up').send({ email: 'nolicence@example.com', displayName: 'No licence', password: 'a long enough password', acceptDataLicence: false });
    expect(declined.status).toBe(400);
    expect(ctx.db.select().from(users).where(eq(users.email, 'nolicence@example.com')).all()).toHaveLength(0);

    const before = Date.now();
    const joined = await ctx.agent().post('/api/auth/sign-up').send({ email: 'licence@example.com', displayName: 'Licensed', password: 'a long enough password', acceptDataLicence: true });
    expect(joined.status).toBe(202);
    const row = ctx.db.select().from(users).where(eq(users.email, 'licence@example.com')).get()!;
    expect(Date.parse(row.dataLicenceAgreedAt!)).toBeGreaterThanOrEqual(before - 1000);
  });

  it('counts the seeded demo accounts as agreed', async () => {
    await seedDatabase(ctx.db, { ...ctx.config, seedDemo: true, demoAtlas: true });
    const demo = ctx.db.select().from(users).where(eq(users.isDemo, true)).all();
    expect(demo.length).toBeGreaterThan(0);
    expect(demo.every((u) => u.dataLicenceAgreedAt !== null)).toBe(true);
  }, 120_000);

  it('carries the licence and credit in every export: GeoJSON members and the CSV download headers', async () => {
    const geo = await ctx.agent().get('/api/reports/export.geojson');
    expect(geo.status).toBe(200);
    const body = JSON.parse(geo.text);
    // CC BY 4.0 is the Creative Commons Attribution 4.0 International licence (creativecommons.org/licenses/by/4.0/).
    expect(body.licence).toEqual({ name: 'CC BY 4.0', title: 'Creative Commons Attribution 4.0 International', url: 'https://creativecommons.org/licenses/by/4.0/' });
    expect(body.attribution).toBe('Syconium contributors');
    const csv = await ctx.agent().get('/api/reports/export.csv');
    expect(csv.status).toBe(200);
    // "license" is a registered link relation (RFC 8288 / IANA Link Relations registry, RFC 4946).
    expect(csv.headers.link).toBe(`<${DATA_LICENCE.url}>; rel="license"`);
    expect(csv.headers['x-data-licence']).toContain('Syconium contributors');
    expect(csv.headers['x-data-licence']).toContain('CC BY 4.0');
  });
});
