import fs from 'node:fs';
import path from 'node:path';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { toPublicPoint } from '../../shared/domain/public-grid';
import { createTestContext, type TestAgent, type TestContext } from '../helpers/test-app';
import { listRoutes } from './reliability/helpers';

/*
 * Every CSV the app serves is safe to open in a spreadsheet (issue 15 item 5). Source: OWASP,
 * "CSV Injection": no cell may begin with = + - @ tab or carriage return (a spreadsheet reads it
 * as a formula). The CSV routes are read from the router (a new .csv route is checked without
 * editing this file), filled with hostile names and notes, and every cell is checked; numbers
 * (a negative longitude) stay bare numbers.
 */

const HOSTILE = ['=HYPERLINK("http://example.invalid","fig")', '@SUM(A1:A2)', '+1+1', '-2+3', '\t=1', 'Notes\n=cmd|\'/C calc\'!A0'];
const FORMULA = /^[=+\-@\t\r]/;
const NUMBER = /^-?\d+(\.\d+)?$/;

let ctx: TestContext;
let editor: TestAgent;

beforeAll(async () => {
  ctx = createTestContext();
  editor = await ctx.signedIn('editor');
  const { sqlite } = ctx.db;
  const user = Number(sqlite.prepare("INSERT INTO users (email, display_name, password_hash) VALUES ('csv@example.com', '=cmd', 'x')").run().lastInsertRowid);
  HOSTILE.forEach((text, i) => {
    const varietyId = Number(
      sqlite.prepare("INSERT INTO varieties (name, fig_type, status, notes, sources, typical_days_to_ripen) VALUES (?, 'common', ?, ?, ?, 120)").run(`${text} ${i}`, i % 2 ? 'accepted' : 'proposed', text, text).lastInsertRowid,
    );
    sqlite.prepare('INSERT INTO variety_synonyms (variety_id, name) VALUES (?, ?)').run(varietyId, `${text} synonym ${i}`);
    const treeId = Number(sqlite.prepare('INSERT INTO trees (user_id, label) VALUES (?, ?)').run(user, text).lastInsertRowid);
    const place = { lat: 42.65 + i * 0.01, lon: -73.75 - i * 0.01 };
    const grid = toPublicPoint(place.lat, place.lon);
    sqlite
      .prepare(
        "INSERT INTO reports (user_id, tree_id, variety_id, proposed_variety_name, lat, lon, grid_lat, grid_lon, form, season, crop, outcome, notes, status) VALUES (?, ?, ?, ?, ?, ?, ?, ?, 'ground', 2024, 'main', 'unripe', ?, 'published')",
      )
      .run(user, treeId, varietyId, i % 2 ? null : text, place.lat, place.lon, grid.lat, grid.lon, text);
  });
});
afterAll(() => ctx.db.sqlite.close());

describe('CSV downloads', () => {
  it('every .csv route neutralises formula-like text cells and keeps numbers as numbers', async () => {
    const csvRoutes = listRoutes(ctx.app).filter((r) => r.startsWith('GET ') && r.endsWith('.csv'));
    expect(csvRoutes).toEqual(expect.arrayContaining(['GET /api/reports/export.csv', 'GET /api/varieties/export.csv', 'GET /api/reports/import/template.csv']));
    for (const route of csvRoutes) {
      const res = await editor.get(route.slice(4));
      expect(res.status, route).toBe(200);
      expect(res.headers['content-type'], route).toMatch(/^text\/csv/);
      const rows = Papa.parse<string[]>(res.text, { skipEmptyLines: true }).data;
      expect(rows.length, route).toBeGreaterThan(1);
      for (const row of rows) {
        for (const cell of row) {
          if (NUMBER.test(cell)) continue;
          expect(FORMULA.test(cell), `${route}: ${JSON.stringify(cell)}`).toBe(false);
          for (const line of cell.split(/\r\n|\r|\n/)) expect(FORMULA.test(line), `${route}: ${JSON.stringify(cell)}`).toBe(false);
        }
      }
    }
  });

  it('the reports export writes the grid longitude as a bare negative number and the hostile names as text', async () => {
    const res = await ctx.agent().get('/api/reports/export.csv');
    const rows = Papa.parse<Record<string, unknown>>(res.text, { header: true, dynamicTyping: true, skipEmptyLines: true }).data;
    expect(rows).toHaveLength(HOSTILE.length);
    for (const row of rows) {
      expect(typeof row.gridLon).toBe('number');
      expect(row.gridLon as number).toBeLessThan(0);
      expect(String(row.variety).startsWith("'")).toBe(true);
    }
  });

  it('the catalogue export imports back unchanged (the neutralising is undone on import)', async () => {
    const exported = (await editor.get('/api/varieties/export.csv')).text;
    const res = await editor.post('/api/varieties/import').send({ csv: exported });
    expect(res.status, res.text).toBe(200);
    expect((await editor.get('/api/varieties/export.csv')).text).toBe(exported);
    const names = ctx.db.sqlite.prepare('SELECT name FROM varieties ORDER BY id').pluck().all();
    expect(names).toEqual(HOSTILE.map((text, i) => `${text} ${i}`));
  });

  it('has one CSV writer: no code but shared/domain/spreadsheet-csv.ts calls Papa.unparse', () => {
    const root = path.resolve(import.meta.dirname, '../..');
    const writers: string[] = [];
    const walk = (dir: string) => {
      for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
        const full = path.join(dir, entry.name);
        if (entry.isDirectory()) walk(full);
        else if (/\.(ts|tsx)$/.test(entry.name) && /\bunparse\(/.test(fs.readFileSync(full, 'utf8'))) writers.push(path.relative(root, full));
      }
    };
    for (const dir of ['server', 'shared', 'src', 'scripts']) walk(path.join(root, dir));
    expect(writers).toEqual(['shared/domain/spreadsheet-csv.ts']);
  });
});
