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

  it('with near=lat,lon, puts the town near the point first: "Alban" typed near Albany gives Albany, NY', async () => {
    // Albany, NY lies at 42.65 N, 73.76 W (GeoNames, recalled from memory); the point is in the city.
    const res = await ctx.agent().get('/api/places?q=Alban&near=42.65,-73.75');
    expect(res.status).toBe(200);
    const { places } = placeSearchResponseSchema.parse(res.body);
    expect(places[0]).toMatchObject({ name: 'Albany', context: 'NY, United States' });
    // Near Albany, GA (31.58 N, 84.16 W, recalled from memory) the Georgia town comes first instead.
    const south = placeSearchResponseSchema.parse((await ctx.agent().get('/api/places?q=Alban&near=31.58,-84.16')).body).places;
    expect(south[0]).toMatchObject({ name: 'Albany', context: 'GA, United States' });
  });

  it('refuses a near that is not "lat,lon" with 400 naming near', async () => {
    for (const near of ['north', '95,10', '10,200', '1,2,3']) {
      const res = await ctx.agent().get(`/api/places?q=albany&near=${encodeURIComponent(near)}`);
      expect(res.status, near).toBe(400);
      expect(res.body.error.fields, near).toHaveProperty('near');
    }
  });

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

  it('near a point, weighs distance against size', () => {
    // Near Portbury, England the English town comes first although the French "Port" is named exactly.
    expect(gazetteer.search('port', 5, { lat: 51.5, lon: -2.7 })[0]!.id).toBe(2);
    // Near Port Test (New York) the small local town beats the larger ones across the ocean.
    expect(gazetteer.search('port', 5, { lat: 42, lon: -73 })[0]!.id).toBe(1);
    // A large city 200 km away still comes before a hamlet 20 km away (the weights' intent).
    const pair = createGazetteer([
      { cityId: 10, name: 'Newbig', altName: '', country: 'US', adminCode: 'NY', population: 8_000_000, loc: { coordinates: [-74, 40.7] } },
      { cityId: 11, name: 'Newhamlet', altName: '', country: 'US', adminCode: 'NY', population: 1_000, loc: { coordinates: [-73.8, 42.45] } },
    ]);
    expect(pair.search('new', 5, { lat: 42.65, lon: -73.75 }).map((p) => p.id)).toEqual([10, 11]);
  });

  it('folds accents and punctuation', () => {
    expect(foldName('Montréal-Ouest')).toBe('montreal ouest');
  });
});
