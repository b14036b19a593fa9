import { describe, expect, it } from 'vitest';
import { seedDemoSavedPlaces } from '../../server/saved-places/saved-places.seed';
import { listSavedPlaces } from '../../server/saved-places/saved-places.repo';
import { insertUser } from '../../server/users/users.repo';
import { createTestContext } from '../helpers/test-app';

const ctx = createTestContext();

describe('/api/saved-places', () => {
  it('is for signed-in growers only', async () => {
    expect((await ctx.agent().get('/api/saved-places')).status).toBe(401);
  });

  it('saves, lists, edits and deletes a grower’s own places', async () => {
    const grower = await ctx.signedIn('grower');
    const created = await grower.post('/api/saved-places').send({ name: 'Allotment', lat: 42.7, lon: -73.8, form: 'container' });
    expect(created.status).toBe(201);
    expect(created.body.place).toMatchObject({ name: 'Allotment', lat: 42.7, lon: -73.8, form: 'container', isHome: false });
    const id = created.body.place.id;

    const patched = await grower.patch(`/api/saved-places/${id}`).send({ name: 'Allotment plot 7' });
    expect(patched.status).toBe(200);
    // Fields left out of a PATCH keep their values (no defaults sneak in).
    expect(patched.body.place).toMatchObject({ name: 'Allotment plot 7', form: 'container', isHome: false });

    // An empty patch changes nothing.
    expect((await grower.patch(`/api/saved-places/${id}`).send({})).body.place).toMatchObject({ name: 'Allotment plot 7' });
    // A misspelt or unknown field is refused, naming it, rather than silently ignored.
    const unknown = await grower.patch(`/api/saved-places/${id}`).send({ colour: 'red' });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.message + JSON.stringify(unknown.body.error.fields)).toContain('colour');

    expect((await grower.get('/api/saved-places')).body.places.map((p: { id: number }) => p.id)).toEqual([id]);
    expect((await grower.delete(`/api/saved-places/${id}`)).status).toBe(204);
    expect((await grower.get('/api/saved-places')).body.places).toEqual([]);
  });

  it('keeps one home at a time', async () => {
    const grower = await ctx.signedIn('grower');
    const first = (await grower.post('/api/saved-places').send({ name: 'Old house', lat: 40, lon: -75, isHome: true })).body.place;
    const second = (await grower.post('/api/saved-places').send({ name: 'New house', lat: 41, lon: -74, isHome: true })).body.place;
    let places = (await grower.get('/api/saved-places')).body.places as { id: number; isHome: boolean }[];
    expect(places.filter((p) => p.isHome).map((p) => p.id)).toEqual([second.id]);

    await grower.patch(`/api/saved-places/${first.id}`).send({ isHome: true });
    places = (await grower.get('/api/saved-places')).body.places;
    expect(places.filter((p) => p.isHome).map((p) => p.id)).toEqual([first.id]);
    expect(places[0]!.id).toBe(first.id); // home comes first
  });

  it('hides one grower’s places from another (404, nothing changed)', async () => {
    const owner = await ctx.signedIn('grower');
    const other = await ctx.signedIn('grower');
    const place = (await owner.post('/api/saved-places').send({ name: 'Secret orchard', lat: 45, lon: -93 })).body.place;
    expect((await other.get('/api/saved-places')).body.places).toEqual([]);
    expect((await other.patch(`/api/saved-places/${place.id}`).send({ name: 'Mine now' })).status).toBe(404);
    expect((await other.delete(`/api/saved-places/${place.id}`)).status).toBe(404);
    expect((await owner.get('/api/saved-places')).body.places[0]).toMatchObject({ id: place.id, name: 'Secret orchard' });
  });

  it('answers 400 naming the field, and saves nothing', async () => {
    const grower = await ctx.signedIn('grower');
    const badLat = await grower.post('/api/saved-places').send({ name: 'Nowhere', lat: 95, lon: 0 });
    expect(badLat.status).toBe(400);
    expect(Object.keys(badLat.body.error.fields)).toEqual(['lat']);
    const noName = await grower.post('/api/saved-places').send({ name: '  ', lat: 10, lon: 10, form: 'pot' });
    expect(noName.status).toBe(400);
    expect(Object.keys(noName.body.error.fields).sort()).toEqual(['form', 'name']);
    const place = (await grower.post('/api/saved-places').send({ name: 'Yard', lat: 10, lon: 10 })).body.place;
    const badPatch = await grower.patch(`/api/saved-places/${place.id}`).send({ lon: 200 });
    expect(badPatch.status).toBe(400);
    expect(Object.keys(badPatch.body.error.fields)).toEqual(['lon']);
    expect((await grower.get('/api/saved-places')).body.places).toHaveLength(1);
  });

  it('refuses writes without the CSRF header', async () => {
    const grower = await ctx.signedIn('grower');
    const res = await grower.raw.post('/api/saved-places').send({ name: 'Yard', lat: 10, lon: 10 });
    expect(res.status).toBe(403);
  });
});

describe('seedDemoSavedPlaces', () => {
  it('gives the demo grower one home place, however often it runs', () => {
    const user = insertUser(ctx.db, { email: 'grower@demo.syconium.test', displayName: 'Demo', passwordHash: 'x', role: 'grower' });
    seedDemoSavedPlaces(ctx.db);
    seedDemoSavedPlaces(ctx.db);
    const places = listSavedPlaces(ctx.db, user.id);
    expect(places).toHaveLength(1);
    expect(places[0]).toMatchObject({ isHome: true, form: 'container' });
  });
});
