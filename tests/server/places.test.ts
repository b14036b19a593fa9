import { describe, expect, it } from 'vitest';
import { createGazetteer, foldName } from '../../server/places/gazetteer';
import { placeSearchResponseSchema } from '../../shared/schemas/places';
import { createTestContext } from '../helpers/test-app';

const ctx = createTestContext();

describe('GET /api/places', () => {
  it('finds a town by the start of its name, the largest first, from the embedded GeoNames list', async () => {
    const res = await ctx.agent().get('/api/places?q=albany');
    expect(res.status).toBe(200);
    const { places } = placeSearchResponseSchema.parse(res.body);
    // GeoNames: Albany, New York, 42.65258 N, 73.75623 W (recalled from memory; the capital of New York State).
    expect(places[0]).toMatchObject({ name: 'Albany', country: 'US', context: 'NY, United States' });
    expect(places[0]!.lat).toBeCloseTo(42.65, 1);
    expect(places[0]!.lon).toBeCloseTo(-73.76, 1);
    expect(places.length).toBeLessThanOrEqual(8);
  }, 30_000);

  it('ignores accents and case', async () => {
    const { places } = placeSearchResponseSchema.parse((await ctx.agent().get('/api/places?q=SAO%20PAULO&limit=3')).body);
    expect(places[0]!.name).toBe('São Paulo');
    expect(places).toHaveLength(3);
  });

  it('refuses a missing or one-letter query with 400 naming q', async () => {
    for (const url of ['/api/places', '/api/places?q=a', `/api/places?q=${'x'.repeat(81)}`]) {
      const res = await ctx.agent().get(url);
      expect(res.status, url).toBe(400);
      expect(res.body.error.fields).toHaveProperty('q');
    }
    const badLimit = await ctx.agent().get('/api/places?q=albany&limit=500');
    expect(badLimit.body.error.fields).toHaveProperty('limit');
  });
});

describe('the gazetteer', () => {
  const rows = [
    { cityId: 1, name: 'Port Test', altName: '', country: 'US', adminCode: 'NY', population: 5000, loc: { coordinates: [-73, 42] as [number, number] } },
    { cityId: 2, name: 'Portbury', altName: 'Old Portbury', country: 'GB', adminCode: 'ENG', population: 90000, loc: { coordinates: [-2.7, 51.5] as [number, number] } },
    { cityId: 3, name: 'Port', altName: '', country: 'FR', adminCode: '84', population: 1200, loc: { coordinates: [5, 46] as [number, number] } },
  ];
  const gazetteer = createGazetteer(rows);

  it('puts an exact name first, then larger towns', () => {
    expect(gazetteer.search('port', 5).map((p) => p.id)).toEqual([3, 2, 1]);
  });

  it('also finds a later word of a name and an alternative name', () => {
    expect(gazetteer.search('test', 5).map((p) => p.id)).toEqual([1]);
    expect(gazetteer.search('old port', 5).map((p) => p.id)).toEqual([2]);
  });

  it('folds accents and punctuation', () => {
    expect(foldName('Montréal-Ouest')).toBe('montreal ouest');
  });
});
