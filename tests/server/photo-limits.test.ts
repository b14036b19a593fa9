import { beforeAll, describe, expect, it } from 'vitest';
import sharp from 'sharp';
import { MAX_INPUT_PIXELS } from '../../server/photos/photos';
import { reportPhotos, varieties } from '../../server/db/schema';
import { createTestContext, type TestAgent } from '../helpers/test-app';

/*
 * Photos are the costly upload: decoding is CPU and memory. The limits are cheap and come first:
 * the account's hourly allowance (checked before the upload is read, and for every file before it
 * is decoded) and the declared pixel count (read from the header before any pixel is decoded).
 */
const ctx = createTestContext({ photoUploadLimit: { limit: 3, windowMs: 60 * 60_000 } });
let varietyId: number;
let alice: TestAgent & { userId: number };
let bob: TestAgent & { userId: number };

beforeAll(async () => {
  varietyId = ctx.db.insert(varieties).values({ name: 'Limit Test Violet', figType: 'common', isFictional: true }).returning().get().id;
  alice = await ctx.signedIn('grower');
  bob = await ctx.signedIn('grower');
});

async function postReport(agent: TestAgent): Promise<number> {
  const res = await agent.post('/api/reports').send({ varietyId, newTreeLabel: `t${Math.random()}`, lat: 44.2, lon: 4.3, form: 'ground', season: 2024, crop: 'main', outcome: 'ripened', firstRipeDate: '2024-08-20' });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.report.id;
}

const small = () => sharp({ create: { width: 16, height: 16, channels: 3, background: '#7a3b62' } }).png().toBuffer();

/** A valid 8x8 PNG whose header then claims width x height (the IHDR fields at bytes 16-23, PNG spec 11.2.2); its CRC no longer matches. */
async function pngDeclaring(width: number, height: number): Promise<Buffer> {
  const png = await small();
  png.writeUInt32BE(width, 16);
  png.writeUInt32BE(height, 20);
  return png;
}

describe('photo uploads per account per hour', () => {
  it('counts every file sent; past the allowance the answer is 429 with Retry-After and nothing is decoded or stored', async () => {
    const report = await postReport(alice);
    const png = await small();
    expect((await alice.post(`/api/reports/${report}/photos`).attach('photos', png, 'a.png').attach('photos', png, 'b.png')).status).toBe(201);
    // Two more would make four: refused whole, before decoding.
    const over = await alice.post(`/api/reports/${report}/photos`).attach('photos', png, 'c.png').attach('photos', png, 'd.png');
    expect(over.status).toBe(429);
    expect(over.body.error.code).toBe('rate_limited');
    expect(over.body.error.fields.photos[0]).toBe('Only 1 more photo this hour');
    expect(Number(over.headers['retry-after'])).toBeGreaterThan(3000);
    expect(Number(over.headers['retry-after'])).toBeLessThanOrEqual(3600);
    expect(ctx.db.select().from(reportPhotos).all()).toHaveLength(2);
    expect((await alice.post(`/api/reports/${report}/photos`).attach('photos', png, 'e.png')).status).toBe(201);
    // Used up: refused before the upload is even read, whatever it holds.
    const spent = await alice.post(`/api/reports/${report}/photos`).attach('photos', Buffer.from('not read'), 'f.png');
    expect(spent.status).toBe(429);
    // Another account has its own allowance.
    const other = await postReport(bob);
    expect((await bob.post(`/api/reports/${other}/photos`).attach('photos', png, 'g.png')).status).toBe(201);
  });

  it('unreadable files count too: decoding is what the allowance limits', async () => {
    const report = await postReport(bob);
    const junk = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(64)]);
    expect((await bob.post(`/api/reports/${report}/photos`).attach('photos', junk, 'x.png')).status).toBe(400);
    expect((await bob.post(`/api/reports/${report}/photos`).attach('photos', junk, 'y.png')).status).toBe(400);
    expect((await bob.post(`/api/reports/${report}/photos`).attach('photos', await small(), 'z.png')).status).toBe(429);
  });
});

describe('decoding is capped', () => {
  const fresh = createTestContext();
  let carol: TestAgent & { userId: number };
  beforeAll(async () => {
    carol = await fresh.signedIn('grower');
  });
  const postTo = async () => {
    const id = fresh.db.insert(varieties).values({ name: `Cap Test ${Math.random()}`, isFictional: true }).returning().get().id;
    const res = await carol.post('/api/reports').send({ varietyId: id, newTreeLabel: 'cap', lat: 44.2, lon: 4.3, form: 'ground', season: 2024, crop: 'main', outcome: 'ripened', firstRipeDate: '2024-08-20' });
    return res.body.report.id as number;
  };

  it('a 90-byte PNG declaring 60,000 x 60,000 pixels is refused from its header, at once', async () => {
    const report = await postTo();
    const bomb = await pngDeclaring(60_000, 60_000);
    expect(bomb.length).toBeLessThan(200);
    const started = performance.now();
    const res = await carol.post(`/api/reports/${report}/photos`).attach('photos', bomb, 'bomb.png');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('image_too_large');
    expect(res.body.error.fields.photos[0]).toMatch(/more than 25 megapixels/);
    expect(performance.now() - started).toBeLessThan(2000);
  });

  it('a small file that would decode to 30 megapixels is refused before decoding; 24 megapixels (a 6000 x 4000 camera) is accepted', async () => {
    expect(MAX_INPUT_PIXELS).toBe(25_000_000);
    const report = await postTo();
    // One colour, losslessly compressed: a few kilobytes for 30 million pixels.
    const big = await sharp({ create: { width: 6000, height: 5000, channels: 3, background: '#000000' } }).webp({ lossless: true }).toBuffer();
    expect(big.length).toBeLessThan(10_000);
    const refused = await carol.post(`/api/reports/${report}/photos`).attach('photos', big, 'big.webp');
    expect(refused.status).toBe(400);
    expect(refused.body.error.code).toBe('image_too_large');

    // Near the worst case still accepted: about 0.4-0.6 s of one core on the build machine (README); a generous bound for a busy machine.
    const camera = await sharp({ create: { width: 6000, height: 4000, channels: 3, background: '#000000' } }).webp({ lossless: true }).toBuffer();
    const started = performance.now();
    const accepted = await carol.post(`/api/reports/${report}/photos`).attach('photos', camera, 'camera.webp');
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(201);
    expect(accepted.body.photos[0]).toMatchObject({ width: 2000, height: 1333 });
    expect(performance.now() - started).toBeLessThan(15_000);
  }, 60_000);
});
