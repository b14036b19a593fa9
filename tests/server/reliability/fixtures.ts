import sharp from 'sharp';
import { expect } from 'vitest';
import type { TestAgent, TestContext } from '../../helpers/test-app';
import { addVariety, validReportBody } from './helpers';

/*
 * Objects for the access-control and hostile-input tests, made fresh for each request (a request
 * may delete or change what it is given). The owner's reports and places sit at a distinctive
 * exact place, so a leak of the exact position can be found in any response body.
 */

export const EXACT_LAT = 42.6543217;
export const EXACT_LON = -73.7654321;
/** Substrings that would betray the exact place (full value or its first 4 decimals). */
export const EXACT_MARKERS = ['42.6543', '73.7654'];

export type Role = 'visitor' | 'owner' | 'other' | 'editor' | 'admin';
export const ROLES: Role[] = ['visitor', 'owner', 'other', 'editor', 'admin'];

export interface World {
  ctx: TestContext;
  agents: Record<Role, TestAgent>;
  emails: Record<Exclude<Role, 'visitor'>, string> & { signInTarget: string };
  varietyId: number;
  /** A fresh agent signed in as a new account with this role (for calls that sign out or in). */
  freshAgent: (role: Role) => Promise<TestAgent>;
  report: (status?: 'published' | 'draft' | 'hidden') => Promise<number>;
  photo: (status?: 'published' | 'draft') => Promise<{ reportId: number; photoId: number; fileName: string }>;
  place: () => Promise<number>;
  proposedVariety: () => number;
  acceptedVariety: () => number;
  waspArea: () => Promise<number>;
  station: () => number;
  flag: () => Promise<number>;
  user: () => Promise<number>;
  stationCsv: () => string;
  png: () => Promise<Buffer>;
}

let unique = 0;
export const uniqueName = (what: string) => `${what} ${Date.now().toString(36)}-${++unique}`;

export async function createWorld(ctx: TestContext): Promise<World> {
  const stamp = Date.now().toString(36);
  const emails = {
    owner: `owner-${stamp}@example.com`,
    other: `other-${stamp}@example.com`,
    editor: `editor-${stamp}@example.com`,
    admin: `admin-${stamp}@example.com`,
    signInTarget: `sign-in-target-${stamp}@example.com`,
  };
  const agents: Record<Role, TestAgent> = {
    visitor: ctx.agent(),
    owner: await ctx.signedIn('grower', emails.owner),
    other: await ctx.signedIn('grower', emails.other),
    editor: await ctx.signedIn('editor', emails.editor),
    admin: await ctx.signedIn('admin', emails.admin),
  };
  await ctx.signedIn('grower', emails.signInTarget);
  const varietyId = addVariety(ctx.db, uniqueName('Access fig'));
  const { sqlite } = ctx.db;

  const report: World['report'] = async (status = 'published') => {
    const res = await agents.owner.post('/api/reports').send(validReportBody(varietyId, { lat: EXACT_LAT, lon: EXACT_LON, notes: 'owner report' }));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const id = res.body.report.id as number;
    if (status !== 'published') sqlite.prepare('UPDATE reports SET status = ? WHERE id = ?').run(status, id);
    return id;
  };
  const png = () => sharp({ create: { width: 16, height: 12, channels: 3, background: '#7a3b5c' } }).png().toBuffer();
  const photo: World['photo'] = async (status = 'published') => {
    const reportId = await report();
    const res = await agents.owner.post(`/api/reports/${reportId}/photos`).attach('photos', await png(), 'fig.png');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const row = sqlite.prepare('SELECT id, file_name AS fileName FROM report_photos WHERE report_id = ?').get(reportId) as { id: number; fileName: string };
    if (status !== 'published') sqlite.prepare('UPDATE reports SET status = ? WHERE id = ?').run(status, reportId);
    return { reportId, photoId: row.id, fileName: row.fileName };
  };
  const place = async () => {
    const res = await agents.owner.post('/api/saved-places').send({ name: uniqueName('Home orchard'), lat: EXACT_LAT, lon: EXACT_LON });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body.place.id as number;
  };
  const proposedVariety = () => Number(sqlite.prepare("INSERT INTO varieties (name, status) VALUES (?, 'proposed')").run(uniqueName('Proposed fig')).lastInsertRowid);
  const acceptedVariety = () => addVariety(ctx.db, uniqueName('Accepted fig'));
  const waspArea = async () => {
    const res = await agents.editor.post('/api/wasp-areas').send(waspAreaBody());
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body.area.id as number;
  };
  const station = () => Number(sqlite.prepare('INSERT INTO stations (name, lat, lon) VALUES (?, 42.7, -73.8)').run(uniqueName('Station')).lastInsertRowid);
  const flag = async () => {
    const id = await report();
    const res = await agents.other.post(`/api/reports/${id}/flags`).send({ reason: 'Looks like a duplicate' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body.flag.id as number;
  };
  const user = async () => (await ctx.signedIn('grower')).userId;
  return { ctx, agents, emails, varietyId, freshAgent: async (role) => (role === 'visitor' ? ctx.agent() : ctx.signedIn(role === 'owner' || role === 'other' ? 'grower' : role)), report, photo, place, proposedVariety, acceptedVariety, waspArea, station, flag, user, stationCsv, png };
}

/** A valid wasp-area body: a small square near Sacramento (invented record). */
export function waspAreaBody(): Record<string, unknown> {
  return {
    name: uniqueName('Wasp area'),
    source: 'Invented record for a test',
    observedOn: '2024-07-01',
    geometry: { type: 'Polygon', coordinates: [[[-121.6, 38.5], [-121.4, 38.5], [-121.4, 38.7], [-121.6, 38.7], [-121.6, 38.5]]] },
  };
}

/** A valid variety body (fig type unknown, so no source is needed). */
export function varietyBody(): Record<string, unknown> {
  return { name: uniqueName('Catalogue fig'), figType: 'unknown', bearsBreba: false, bearsMain: true };
}

/** Three years of invented daily minima in GHCN-Daily's YYYY,MM,DD,TMAX,TMIN layout (deg C). */
export function stationCsv(): string {
  const lines = ['YYYY,MM,DD,TMAX,TMIN'];
  for (const year of [2021, 2022, 2023]) {
    for (let day = 0; day < 365; day++) {
      const date = new Date(Date.UTC(year, 0, 1 + day));
      const tmin = (-8 + 22 * Math.sin(((day - 100) / 365) * 2 * Math.PI)).toFixed(1);
      lines.push(`${year},${String(date.getUTCMonth() + 1).padStart(2, '0')},${String(date.getUTCDate()).padStart(2, '0')},${(Number(tmin) + 10).toFixed(1)},${tmin}`);
    }
  }
  return `${lines.join('\n')}\n`;
}
