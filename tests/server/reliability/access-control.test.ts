import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { createTestContext, TEST_PASSWORD, testConfig, type TestAgent } from '../../helpers/test-app';
import { listRoutes, validReportBody } from './helpers';
import { createWorld, EXACT_LAT, EXACT_LON, EXACT_MARKERS, ROLES, stationCsv, uniqueName, varietyBody, waspAreaBody, type Role, type World } from './fixtures';
import { snapToGrid } from '../../../shared/domain/public-grid';

/*
 * Every route the app serves, called as a visitor, the grower who owns the objects, another
 * grower, an editor and an admin, with the status each should get. A route missing from this
 * table fails the completeness test: add a row (with its intended permission) for a new route.
 */

type Expected = Record<Role, number>;
const everyone = (status: number): Expected => ({ visitor: status, owner: status, other: status, editor: status, admin: status });
const signedIn = (status: number): Expected => ({ visitor: 401, owner: status, other: status, editor: status, admin: status });
const editors = (status: number): Expected => ({ visitor: 401, owner: 403, other: 403, editor: status, admin: status });
const admins = (status: number): Expected => ({ visitor: 401, owner: 403, other: 403, editor: 403, admin: status });
/** Only the author changes a report, even an editor (who moderates with hide/restore instead). */
const author = (status: number): Expected => ({ visitor: 401, owner: status, other: 403, editor: 403, admin: 403 });
/** Private to the owner: others are told it does not exist. */
const ownerPrivate = (status: number): Expected => ({ visitor: 401, owner: status, other: 404, editor: 404, admin: 404 });
/** A draft is the owner's alone until published (shared/schemas DRAFT_NOTICE: "Only you can see it"). */
const ownerOnly = (status: number): Expected => ({ visitor: 404, owner: status, other: 404, editor: 404, admin: 404 });
/** A hidden report: the owner and editors see it, nobody else learns it exists. */
const ownerAndEditors = (status: number): Expected => ({ visitor: 404, owner: status, other: 404, editor: status, admin: status });

interface Call {
  method: 'get' | 'post' | 'patch' | 'put' | 'delete';
  path: string;
  body?: unknown;
  files?: { field: string; content: Buffer | string; name: string }[];
  fields?: Record<string, string>;
}
interface Case {
  route: string;
  note?: string;
  expected: Expected;
  /** Use a new account of the role (the call signs in or out). */
  fresh?: boolean;
  call: (w: World, role: Role) => Call | Promise<Call>;
}

const get = (path: string): Call => ({ method: 'get', path });
/** A place near (not at) the owner's trees, for the public look-ups. */
const NEAR = 'lat=42.66&lon=-73.76';
const cell = () => `lat=${snapToGrid(EXACT_LAT)}&lon=${snapToGrid(EXACT_LON)}`;

const CASES: Case[] = [
  { route: 'GET /api/health', expected: everyone(200), call: () => get('/api/health') },
  { route: 'GET /api/health/live', expected: everyone(200), call: () => get('/api/health/live') },
  { route: 'GET /api/health/ready', expected: everyone(200), note: 'no data in it: ok and the database state', call: () => get('/api/health/ready') },
  { route: 'GET /metrics', expected: everyone(200), note: 'from loopback (the test client); from outside only with SYCONIUM_METRICS_TOKEN (tests/server/ops.test.ts)', call: () => get('/metrics') },
  { route: 'GET /api/auth/me', expected: everyone(200), call: () => get('/api/auth/me') },
  { route: 'POST /api/auth/sign-up', fresh: true, expected: everyone(202), call: () => ({ method: 'post', path: '/api/auth/sign-up', body: { email: `${uniqueName('new').replace(/\W+/g, '-')}@example.com`, acceptDataLicence: true, password: TEST_PASSWORD, displayName: 'New grower' } }) },
  { route: 'POST /api/auth/sign-in', fresh: true, expected: everyone(200), call: (w) => ({ method: 'post', path: '/api/auth/sign-in', body: { email: w.emails.signInTarget, password: TEST_PASSWORD } }) },
  { route: 'POST /api/auth/sign-out', fresh: true, expected: everyone(204), call: () => ({ method: 'post', path: '/api/auth/sign-out' }) },
  { route: 'POST /api/auth/verify', expected: everyone(400), note: 'public: the link may be opened signed out', call: () => ({ method: 'post', path: '/api/auth/verify', body: { token: 'x'.repeat(40) } }) },
  { route: 'POST /api/auth/verify/resend', expected: signedIn(409), note: 'test accounts are verified already', call: () => ({ method: 'post', path: '/api/auth/verify/resend' }) },
  { route: 'POST /api/auth/forgot', expected: everyone(202), call: () => ({ method: 'post', path: '/api/auth/forgot', body: { email: 'nobody-here@example.com' } }) },
  { route: 'POST /api/auth/reset', expected: everyone(400), call: () => ({ method: 'post', path: '/api/auth/reset', body: { token: 'y'.repeat(40), password: 'a brand new passphrase' } }) },
  { route: 'GET /api/email/digest', expected: signedIn(200), call: () => get('/api/email/digest') },
  { route: 'PUT /api/email/digest', expected: signedIn(200), call: () => ({ method: 'put', path: '/api/email/digest', body: { active: false, radiusKm: 50 } }) },
  { route: 'POST /api/email/unsubscribe', expected: everyone(404), note: 'public by token; an unknown token is a 404', call: () => ({ method: 'post', path: '/api/email/unsubscribe', body: { token: 'z'.repeat(40) } }) },
  // The development mailbox: loopback only, and not mounted in production (checked below).
  { route: 'GET /api/dev/mail', expected: everyone(200), call: () => get('/api/dev/mail') },
  { route: 'GET /api/dev/mail/:id', expected: everyone(404), call: () => get('/api/dev/mail/999999') },
  { route: 'DELETE /api/dev/mail', expected: everyone(204), call: () => ({ method: 'delete', path: '/api/dev/mail' }) },
  { route: 'GET /api/users', expected: admins(200), call: () => get('/api/users') },
  { route: 'PATCH /api/users/:id/role', expected: admins(200), call: async (w) => ({ method: 'patch', path: `/api/users/${await w.user()}/role`, body: { role: 'editor' } }) },
  { route: 'GET /api/atlas/near', expected: everyone(200), call: () => get(`/api/atlas/near?${NEAR}&radiusKm=50`) },
  { route: 'GET /api/varieties/:id/fit', expected: everyone(200), call: (w) => get(`/api/varieties/${w.varietyId}/fit?${NEAR}`) },
  { route: 'GET /api/varieties/catalogue', expected: editors(200), call: () => get('/api/varieties/catalogue') },
  { route: 'GET /api/varieties/export.csv', expected: editors(200), call: () => get('/api/varieties/export.csv') },
  {
    route: 'POST /api/varieties/import',
    expected: editors(200),
    call: async (w) => ({ method: 'post', path: '/api/varieties/import', body: { csv: (await w.agents.editor.get('/api/varieties/export.csv')).text } }),
  },
  { route: 'POST /api/varieties', expected: editors(201), call: () => ({ method: 'post', path: '/api/varieties', body: varietyBody() }) },
  { route: 'PATCH /api/varieties/:id', expected: editors(200), call: (w) => ({ method: 'patch', path: `/api/varieties/${w.acceptedVariety()}`, body: varietyBody() }) },
  { route: 'POST /api/varieties/:id/accept', expected: editors(200), call: (w) => ({ method: 'post', path: `/api/varieties/${w.proposedVariety()}/accept`, body: varietyBody() }) },
  { route: 'POST /api/varieties/:id/reject', expected: editors(200), call: (w) => ({ method: 'post', path: `/api/varieties/${w.proposedVariety()}/reject`, body: { reason: 'Not a fig variety name' } }) },
  { route: 'POST /api/varieties/:id/merge', expected: editors(200), call: (w) => ({ method: 'post', path: `/api/varieties/${w.proposedVariety()}/merge`, body: { intoId: w.acceptedVariety() } }) },
  { route: 'GET /api/varieties', expected: everyone(200), call: () => get('/api/varieties') },
  { route: 'GET /api/varieties/:id', expected: everyone(200), call: (w) => get(`/api/varieties/${w.varietyId}`) },
  { route: 'GET /api/wasp-areas', expected: everyone(200), call: () => get('/api/wasp-areas') },
  { route: 'GET /api/wasp-areas/records', expected: editors(200), call: () => get('/api/wasp-areas/records') },
  { route: 'GET /api/wasp-areas/records/:id', expected: editors(200), call: async (w) => get(`/api/wasp-areas/records/${await w.waspArea()}`) },
  { route: 'POST /api/wasp-areas', expected: editors(201), call: () => ({ method: 'post', path: '/api/wasp-areas', body: waspAreaBody() }) },
  { route: 'PATCH /api/wasp-areas/:id', expected: editors(200), call: async (w) => ({ method: 'patch', path: `/api/wasp-areas/${await w.waspArea()}`, body: { name: uniqueName('Renamed area') } }) },
  { route: 'POST /api/wasp-areas/:id/retire', expected: editors(200), call: async (w) => ({ method: 'post', path: `/api/wasp-areas/${await w.waspArea()}/retire` }) },
  { route: 'GET /api/stations', expected: everyone(200), call: () => get('/api/stations') },
  { route: 'GET /api/stations/:id', expected: everyone(200), call: (w) => get(`/api/stations/${w.station()}`) },
  { route: 'GET /api/stations/normals', expected: everyone(200), call: () => get('/api/stations/normals') },
  // No normals are loaded in this test's database: a well-formed code that is not there is a 404 for everyone.
  { route: 'GET /api/stations/normals/:code', expected: everyone(404), call: () => get('/api/stations/normals/USW00014735') },
  {
    route: 'POST /api/stations/upload',
    expected: editors(201),
    call: () => ({ method: 'post', path: '/api/stations/upload', fields: { name: uniqueName('Upload station'), lat: '42.7', lon: '-73.8' }, files: [{ field: 'file', content: stationCsv(), name: 'station.csv' }] }),
  },
  {
    // One 1991-2020 normals CSV (its layout; invented figures at an invented code): a whole set of one station.
    route: 'POST /api/stations/bulk',
    expected: editors(200),
    call: () => ({
      method: 'post',
      path: '/api/stations/bulk',
      files: [{ field: 'files', name: 'ACCESS0001.csv', content: 'STATION,LATITUDE,LONGITUDE,ELEVATION,NAME,ANN-TMIN-PRBGSL-T32FP50\nACCESS0001,42.7,-73.8,100,ACCESS TEST,170\n' }],
    }),
  },
  { route: 'DELETE /api/stations/:id', expected: editors(204), call: (w) => ({ method: 'delete', path: `/api/stations/${w.station()}` }) },
  { route: 'GET /api/reports', expected: everyone(200), call: () => get('/api/reports') },
  { route: 'GET /api/reports', note: 'mine=true', expected: signedIn(200), call: () => get('/api/reports?mine=true') },
  { route: 'GET /api/reports/trees', expected: signedIn(200), call: () => get('/api/reports/trees') },
  { route: 'GET /api/reports/export.csv', expected: everyone(200), call: () => get('/api/reports/export.csv') },
  { route: 'GET /api/reports/export.geojson', expected: everyone(200), call: () => get('/api/reports/export.geojson') },
  { route: 'GET /api/reports/import/template.csv', expected: everyone(200), call: () => get('/api/reports/import/template.csv') },
  { route: 'GET /api/reports/:id', note: 'published', expected: everyone(200), call: async (w) => get(`/api/reports/${await w.report()}`) },
  { route: 'GET /api/reports/:id', note: 'draft', expected: ownerOnly(200), call: async (w) => get(`/api/reports/${await w.report('draft')}`) },
  { route: 'GET /api/reports/:id', note: 'hidden', expected: ownerAndEditors(200), call: async (w) => get(`/api/reports/${await w.report('hidden')}`) },
  { route: 'POST /api/reports', expected: signedIn(201), call: (w) => ({ method: 'post', path: '/api/reports', body: validReportBody(w.varietyId) }) },
  { route: 'PATCH /api/reports/:id', expected: author(200), call: async (w) => ({ method: 'patch', path: `/api/reports/${await w.report()}`, body: { notes: 'edited' } }) },
  { route: 'DELETE /api/reports/:id', expected: author(204), call: async (w) => ({ method: 'delete', path: `/api/reports/${await w.report()}` }) },
  {
    route: 'POST /api/reports/:id/publish',
    expected: { visitor: 401, owner: 200, other: 404, editor: 404, admin: 404 },
    call: async (w) => ({ method: 'post', path: `/api/reports/${await w.report('draft')}/publish` }),
  },
  { route: 'POST /api/reports/:id/hide', expected: editors(200), call: async (w) => ({ method: 'post', path: `/api/reports/${await w.report()}/hide`, body: { reason: 'Duplicate of another report' } }) },
  { route: 'POST /api/reports/:id/restore', expected: editors(200), call: async (w) => ({ method: 'post', path: `/api/reports/${await w.report('hidden')}/restore` }) },
  {
    route: 'POST /api/reports/:id/flags',
    note: 'anyone signed in but the author',
    expected: { visitor: 401, owner: 400, other: 201, editor: 201, admin: 201 },
    call: async (w) => ({ method: 'post', path: `/api/reports/${await w.report()}/flags`, body: { reason: 'Looks wrong to me' } }),
  },
  { route: 'POST /api/reports/:id/photos', expected: author(201), call: async (w) => ({ method: 'post', path: `/api/reports/${await w.report()}/photos`, files: [{ field: 'photos', content: await w.png(), name: 'fig.png' }] }) },
  {
    route: 'DELETE /api/reports/:id/photos/:photoId',
    expected: author(204),
    call: async (w) => {
      const { reportId, photoId } = await w.photo();
      return { method: 'delete', path: `/api/reports/${reportId}/photos/${photoId}` };
    },
  },
  { route: 'GET /api/support/options', expected: everyone(200), call: () => get('/api/support/options') },
  {
    route: 'POST /api/support/checkout',
    note: 'contributions are off in this app (support.test.ts runs them on); a monthly membership needs an account',
    expected: { visitor: 401, owner: 404, other: 404, editor: 404, admin: 404 },
    call: () => ({ method: 'post', path: '/api/support/checkout', body: { kind: 'monthly', tier: 'cutting', currency: 'usd' } }),
  },
  { route: 'GET /api/support/checkout/:sessionId', expected: everyone(404), call: () => get('/api/support/checkout/cs_test_unknown') },
  { route: 'GET /api/support/membership', expected: signedIn(200), call: () => get('/api/support/membership') },
  { route: 'PUT /api/support/membership/mark', expected: signedIn(200), call: () => ({ method: 'put', path: '/api/support/membership/mark', body: { showMark: false } }) },
  { route: 'POST /api/support/membership/cancel', expected: signedIn(409), note: 'no membership to cancel', call: () => ({ method: 'post', path: '/api/support/membership/cancel' }) },
  { route: 'GET /api/support/summary', expected: admins(200), call: () => get('/api/support/summary') },
  { route: 'POST /api/support/webhook', expected: everyone(404), note: 'signed provider events only (support.test.ts); off here', call: () => ({ method: 'post', path: '/api/support/webhook', body: { id: 'evt_x' } }) },
  {
    route: 'POST /api/reports/import',
    expected: signedIn(201),
    call: (w) => {
      const name = w.ctx.db.sqlite.prepare('SELECT name FROM varieties WHERE id = ?').pluck().get(w.varietyId) as string;
      return { method: 'post', path: '/api/reports/import', files: [{ field: 'file', name: 'reports.csv', content: `variety,lat,lon,form,season,crop,outcome\n"${name}",42.5,-73.5,ground,2024,main,no-fruit\n` }] };
    },
  },
  { route: 'GET /api/saved-places', expected: signedIn(200), call: () => get('/api/saved-places') },
  { route: 'POST /api/saved-places', expected: signedIn(201), call: () => ({ method: 'post', path: '/api/saved-places', body: { name: uniqueName('Allotment'), lat: 40.1, lon: -75.2 } }) },
  { route: 'PATCH /api/saved-places/:id', expected: ownerPrivate(200), call: async (w) => ({ method: 'patch', path: `/api/saved-places/${await w.place()}`, body: { name: uniqueName('Renamed') } }) },
  { route: 'DELETE /api/saved-places/:id', expected: ownerPrivate(204), call: async (w) => ({ method: 'delete', path: `/api/saved-places/${await w.place()}` }) },
  { route: 'GET /api/guidance/ripe-dates', expected: everyone(200), call: (w) => get(`/api/guidance/ripe-dates?varietyId=${w.varietyId}&${NEAR}`) },
  { route: 'GET /api/guidance/season-success', expected: everyone(200), call: () => get('/api/guidance/season-success') },
  { route: 'GET /api/guidance/short-season', expected: everyone(200), call: () => get('/api/guidance/short-season?seasonDays=150') },
  { route: 'GET /api/atlas/pins', expected: everyone(200), call: () => get('/api/atlas/pins?bbox=-75,41,-72,44&zoom=9') },
  { route: 'GET /api/atlas/season-grid/:z/:x/:y', expected: everyone(200), call: () => get('/api/atlas/season-grid/6/18/23') },
  { route: 'GET /api/atlas/season-at', expected: everyone(200), call: () => get('/api/atlas/season-at?lat=42.65&lon=-73.75') },
  { route: 'GET /api/atlas/pins/cell', expected: everyone(200), call: () => get(`/api/atlas/pins/cell?${cell()}`) },
  { route: 'GET /api/places', expected: everyone(200), call: () => get('/api/places?q=Albany') },
  { route: 'GET /api/places/nearest', expected: everyone(200), call: () => get(`/api/places/nearest?${NEAR}`) },
  { route: 'GET /api/varieties/:id/page', expected: everyone(200), call: (w) => get(`/api/varieties/${w.varietyId}/page`) },
  { route: 'GET /api/account/units', expected: signedIn(200), call: () => get('/api/account/units') },
  { route: 'PUT /api/account/units', expected: signedIn(200), call: () => ({ method: 'put', path: '/api/account/units', body: { temperature: 'C', distance: 'km', locale: 'en-GB' } }) },
  { route: 'GET /api/follows', expected: signedIn(200), call: () => get('/api/follows') },
  { route: 'POST /api/follows', expected: signedIn(201), call: (w) => ({ method: 'post', path: '/api/follows', body: { kind: 'variety', varietyId: w.varietyId } }) },
  {
    route: 'DELETE /api/follows/varieties/:id',
    note: 'each grower unfollows only their own follow; the owner follows first',
    expected: ownerPrivate(200),
    call: async (w, role) => {
      if (role === 'owner') await w.agents.owner.post('/api/follows').send({ kind: 'variety', varietyId: w.varietyId });
      else if (role !== 'visitor') await w.agents[role].delete(`/api/follows/varieties/${w.varietyId}`);
      return { method: 'delete', path: `/api/follows/varieties/${w.varietyId}` };
    },
  },
  {
    route: 'DELETE /api/follows/places/:id',
    expected: ownerPrivate(200),
    call: async (w) => {
      const list = await w.agents.owner.post('/api/follows').send({ kind: 'place', name: uniqueName('Followed'), lat: 41.1, lon: -74.2 });
      return { method: 'delete', path: `/api/follows/places/${list.body.places.at(-1).id}` };
    },
  },
  { route: 'GET /api/accuracy', expected: everyone(200), call: () => get('/api/accuracy') },
  { route: 'GET /api/moderation/queue', expected: editors(200), call: () => get('/api/moderation/queue') },
  { route: 'GET /api/moderation/summary', expected: editors(200), call: () => get('/api/moderation/summary') },
  { route: 'POST /api/moderation/reports/:id/reviewed', expected: editors(204), call: async (w) => ({ method: 'post', path: `/api/moderation/reports/${await w.report()}/reviewed` }) },
  { route: 'POST /api/moderation/flags/:id/clear', expected: editors(200), call: async (w) => ({ method: 'post', path: `/api/moderation/flags/${await w.flag()}/clear` }) },
  { route: 'GET /api/audit', expected: editors(200), call: () => get('/api/audit') },
  { route: 'GET /uploads/reports/:name', note: 'published', expected: everyone(200), call: async (w) => get(`/uploads/reports/${(await w.photo()).fileName}`) },
  { route: 'GET /uploads/reports/:name', note: 'draft', expected: ownerOnly(200), call: async (w) => get(`/uploads/reports/${(await w.photo('draft')).fileName}`) },
  { route: 'GET /tiles/*', expected: everyone(204), note: 'a tile with no data is an empty 204 (no town near 85° N, 180° W)', call: () => get('/tiles/places/7/0/0.pbf') },
];

const ctx = createTestContext({ signInLimit: { windowMs: 60_000, perAddress: 10_000, freeFailures: 10_000 }, signUpLimit: { windowMs: 60_000, perAddress: 10_000 }, forgotLimit: { windowMs: 60_000, perAddress: 10_000, perEmail: 10_000 }, photoUploadLimit: { windowMs: 60_000, limit: 10_000 } });
let world: World;
/** Every response body each role received, to search for leaks afterwards. */
const seen: Record<Role, string[]> = { visitor: [], owner: [], other: [], editor: [], admin: [] };

beforeAll(async () => {
  world = await createWorld(ctx);
}, 60_000);
afterAll(() => ctx.db.sqlite.close());

async function send(c: Case, role: Role): Promise<supertest.Response> {
  const call = await c.call(world, role);
  const agent: TestAgent = c.fresh ? await world.freshAgent(role) : world.agents[role];
  let req = agent[call.method](call.path);
  if (call.files) {
    for (const [name, value] of Object.entries(call.fields ?? {})) req = req.field(name, value);
    for (const file of call.files) req = req.attach(file.field, Buffer.isBuffer(file.content) ? file.content : Buffer.from(file.content), file.name);
  } else if (call.body !== undefined) {
    req = req.send(call.body as object);
  }
  return req;
}

describe('access control: every route as every role', () => {
  it('the table covers every route the app serves', () => {
    const covered = new Set(CASES.map((c) => c.route));
    expect(listRoutes(ctx.app).filter((route) => !covered.has(route))).toEqual([]);
  });

  for (const c of CASES) {
    it(`${c.route}${c.note ? ` (${c.note})` : ''}`, async () => {
      const got: Partial<Record<Role, number>> = {};
      for (const role of ROLES) {
        const res = await send(c, role);
        got[role] = res.status;
        seen[role].push(`${c.route} ${res.text ?? ''}`);
        if (res.status >= 400) expect(res.body?.error?.code, `${role}: ${res.text}`).toEqual(expect.any(String));
      }
      expect(got).toEqual(c.expected);
    }, 30_000);
  }

  it('nothing is paywalled: a supporter gets exactly what any other grower gets, on every route', async () => {
    // Make the "other" grower a paying member with the mark shown, then call every route again as them.
    const otherId = ctx.db.sqlite.prepare('SELECT id FROM users WHERE email = ?').pluck().get(world.emails.other) as number;
    ctx.db.sqlite.prepare("INSERT INTO memberships (user_id, provider_subscription_id, tier, amount_minor, currency, status, started_at) VALUES (?, 'sub_paywall_check', 'orchard', 1500, 'usd', 'active', '2026-01-01T00:00:00.000Z')").run(otherId);
    ctx.db.sqlite.prepare('UPDATE users SET supporter_mark = 1 WHERE id = ?').run(otherId);
    try {
      const differs: string[] = [];
      // Only the membership's own page (see it, cancel it) answers differently, by design.
      for (const c of CASES.filter((x) => !x.fresh && !x.route.includes('/api/support/membership'))) {
        const status = (await send(c, 'other')).status;
        if (status !== c.expected.other) differs.push(`${c.route}: ${status} as a supporter, ${c.expected.other} otherwise`);
      }
      expect(differs).toEqual([]);
    } finally {
      ctx.db.sqlite.prepare("DELETE FROM memberships WHERE provider_subscription_id = 'sub_paywall_check'").run();
    }
  }, 120_000);

  it('the development mailbox is not served in production', async () => {
    const app = createApp({ db: ctx.db, config: testConfig({ env: 'production', devMail: false }) });
    expect((await supertest(app).get('/api/dev/mail')).status).toBe(404);
  });
});

describe('privacy: exact places and e-mail addresses', () => {
  it('the owner and editors do see the exact place (so the search below can find it)', async () => {
    const id = await world.report();
    for (const role of ['owner', 'editor'] as const) {
      const res = await world.agents[role].get(`/api/reports/${id}`);
      expect(res.body.report.lat).toBe(EXACT_LAT);
      expect(res.text).toContain(EXACT_MARKERS[0]);
    }
    expect((await world.agents.admin.get('/api/users')).text).toContain(world.emails.owner);
  });

  it('never reach a visitor or another grower in any response', () => {
    const leaks = (role: Role, secrets: string[]) => seen[role].filter((text) => !text.startsWith('GET /api/dev/mail') && secrets.some((s) => text.includes(s))).map((t) => t.slice(0, 160));
    expect(seen.visitor.length).toBeGreaterThan(CASES.length - 1);
    expect(leaks('visitor', [...EXACT_MARKERS, world.emails.owner, world.emails.other, world.emails.editor, world.emails.admin])).toEqual([]);
    expect(leaks('other', [...EXACT_MARKERS, world.emails.owner, world.emails.editor, world.emails.admin])).toEqual([]);
  });
});
