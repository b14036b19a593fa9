import type { Db } from '../db/client';
import { DEMO_COOL_COAST_GROWERS, DEMO_COOL_COAST_TOWN, DEMO_VARIETIES } from './demo-scenario';
import { buildDemoReports } from './demo-reports';

/** The cool-coast growers write from this e-mail domain; it marks their accounts (idempotence). */
export const DEMO_COOL_COAST_EMAIL_DOMAIN = 'coast.demo.syconium.test';

/**
 * The demo's cool-summer coastal town (demo-scenario.ts, DEMO_COOL_COAST_TOWN): a few invented
 * growers at Eureka, CA, where the normals give about 300 frost-free days and little heat, so late
 * varieties stay unripe. Their reports follow the same story (demo-reports.ts), with its own seed so
 * the rest of the demo is unchanged. Idempotent: nothing is added once one of its growers exists,
 * nor to a database without the demo story.
 */
export function seedDemoCoolCoast(db: Db): void {
  const sqlite = db.sqlite;
  if (sqlite.prepare('SELECT 1 FROM users WHERE email LIKE ? LIMIT 1').get(`%@${DEMO_COOL_COAST_EMAIL_DOMAIN}`)) return;
  const story = sqlite.prepare("SELECT password_hash AS passwordHash FROM users WHERE email = 'grower@demo.syconium.test' AND is_demo = 1").get() as { passwordHash: string } | undefined;
  if (!story) return;
  const varietyIds = new Map((sqlite.prepare('SELECT id, name FROM varieties').all() as { id: number; name: string }[]).map((v) => [v.name, v.id]));
  const reports = buildDemoReports(DEMO_COOL_COAST_GROWERS.length, DEMO_VARIETIES, 40_802, [DEMO_COOL_COAST_TOWN]);
  const verified = new Date().toISOString();
  db.transaction(() => {
    const insertUser = sqlite.prepare("INSERT INTO users (email, display_name, password_hash, role, email_verified_at, is_demo, data_licence_agreed_at) VALUES (?, ?, ?, 'grower', ?, 1, strftime('%Y-%m-%dT%H:%M:%fZ','now'))");
    const growerIds = DEMO_COOL_COAST_GROWERS.map((name) => Number(insertUser.run(`${name.toLowerCase().replace(/[^a-z]+/g, '.')}@${DEMO_COOL_COAST_EMAIL_DOMAIN}`, `${name} (demo)`, story.passwordHash, verified).lastInsertRowid));
    const insertTree = sqlite.prepare('INSERT INTO trees (user_id, label) VALUES (?, ?)');
    const insertReport = sqlite.prepare(
      `INSERT INTO reports (user_id, tree_id, variety_id, lat, lon, grid_lat, grid_lon, form, origin, year_planted, season, crop, outcome, first_ripe_date, last_harvest_date,
                            spring_frost_date, fall_frost_date, pinched, pinched_date, notes, status)
       VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, 'published')`,
    );
    const trees = new Map<string, number>();
    for (const r of reports) {
      const userId = growerIds[r.growerIndex]!;
      let treeId = trees.get(r.treeKey);
      if (treeId === undefined) {
        treeId = Number(insertTree.run(userId, `${r.varietyName} #${Number(r.treeKey.split(':')[1]) + 1}`).lastInsertRowid);
        trees.set(r.treeKey, treeId);
      }
      insertReport.run(userId, treeId, varietyIds.get(r.varietyName)!, r.lat, r.lon, r.gridLat, r.gridLon, r.form, r.origin, r.yearPlanted, r.season, r.crop, r.outcome, r.firstRipeDate, r.lastHarvestDate, r.springFrostDate, r.fallFrostDate, r.pinched ? 1 : 0, r.pinchedDate, r.notes);
    }
  });
}
