import type { Db } from '../db/client';
import { recordAudit } from '../audit/audit.repo';
import { buildDemoAtlas } from './demo-atlas';
import { DEMO_ATLAS_EMAIL_DOMAIN, DEMO_ATLAS_VARIETIES } from './demo-atlas-scenario';

const VARIETY_SOURCE = 'Invented for the Syconium demo; not a real cultivar.';

/**
 * Write the demo atlas (server/seed/demo-atlas.ts) next to the demo story: its extra fictional
 * varieties, several hundred demo growers (same password as every demo account), their trees and
 * reports, and a few flags and hidden reports. Idempotent: nothing is added once any of its growers
 * exists, nor to a database without the demo story (its demo grower's reports). One transaction of
 * prepared statements, so it adds only a fraction of a second to a first start.
 */
export function seedDemoAtlas(db: Db): void {
  const sqlite = db.sqlite;
  if (sqlite.prepare('SELECT 1 FROM users WHERE email LIKE ? LIMIT 1').get(`%@${DEMO_ATLAS_EMAIL_DOMAIN}`)) return;
  const story = sqlite
    .prepare("SELECT u.id, u.password_hash AS passwordHash FROM users u WHERE u.email = 'grower@demo.syconium.test' AND EXISTS (SELECT 1 FROM reports r WHERE r.user_id = u.id)")
    .get() as { id: number; passwordHash: string } | undefined;
  if (!story) return;
  const editor = sqlite.prepare("SELECT id FROM users WHERE email = 'editor@demo.syconium.test'").get() as { id: number } | undefined;
  const atlas = buildDemoAtlas();

  db.transaction(() => {
    const findVariety = sqlite.prepare('SELECT id FROM varieties WHERE lower(name) = lower(?)').pluck();
    const insertVariety = sqlite.prepare(
      'INSERT INTO varieties (name, fig_type, bears_breba, bears_main, ripening_class, typical_days_to_ripen, notes, sources, is_fictional) VALUES (?, ?, ?, ?, ?, ?, ?, ?, 1)',
    );
    const insertSynonym = sqlite.prepare('INSERT OR IGNORE INTO variety_synonyms (variety_id, name) VALUES (?, ?)');
    for (const v of DEMO_ATLAS_VARIETIES) {
      if (findVariety.get(v.name) !== undefined) continue;
      const { lastInsertRowid } = insertVariety.run(v.name, v.figType, v.bearsBreba ? 1 : 0, v.bearsMain ? 1 : 0, v.ripeningClass, v.typicalDaysToRipen, v.notes, VARIETY_SOURCE);
      for (const synonym of v.synonyms) insertSynonym.run(lastInsertRowid, synonym);
    }
    const varietyIds = new Map((sqlite.prepare('SELECT id, name FROM varieties').all() as { id: number; name: string }[]).map((v) => [v.name, v.id]));

    const verifiedAt = new Date().toISOString();
    const insertUser = sqlite.prepare("INSERT INTO users (email, display_name, password_hash, role, email_verified_at, is_demo, data_licence_agreed_at) VALUES (?, ?, ?, 'grower', ?, 1, strftime('%Y-%m-%dT%H:%M:%fZ','now'))");
    const userIds = atlas.growers.map((g) => Number(insertUser.run(g.email, `${g.name} (demo)`, story.passwordHash, g.verified ? verifiedAt : null).lastInsertRowid));

    const insertTree = sqlite.prepare('INSERT INTO trees (user_id, label, created_at) VALUES (?, ?, ?)');
    const firstPosted = new Map<number, string>();
    for (const r of atlas.reports) if (!firstPosted.has(r.treeIndex) || r.createdAt < firstPosted.get(r.treeIndex)!) firstPosted.set(r.treeIndex, r.createdAt);
    const treeIds = atlas.trees.map((t, i) => Number(insertTree.run(userIds[t.growerIndex], t.label, firstPosted.get(i) ?? verifiedAt).lastInsertRowid));

    const insertReport = sqlite.prepare(`INSERT INTO reports (user_id, tree_id, variety_id, lat, lon, grid_lat, grid_lon, form, origin, year_planted, season, crop,
      outcome, first_ripe_date, last_harvest_date, spring_frost_date, fall_frost_date, pinched, pinched_date, winter_protection, feeding, watering, notes,
      status, created_at, updated_at, published_at) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`);
    const reportIds = atlas.reports.map((r) => {
      const varietyId = varietyIds.get(r.varietyName);
      if (varietyId === undefined) throw new Error(`demo atlas: variety ${r.varietyName} is missing`);
      return Number(
        insertReport.run(
          userIds[r.growerIndex], treeIds[r.treeIndex], varietyId, r.lat, r.lon, r.gridLat, r.gridLon, r.form, r.origin, r.yearPlanted, r.season, r.crop,
          r.outcome, r.firstRipeDate, r.lastHarvestDate, r.springFrostDate, r.fallFrostDate, r.pinched ? 1 : 0, r.pinchedDate, r.winterProtection, r.feeding,
          r.watering, r.notes, r.status, r.createdAt, r.createdAt, r.status === 'published' ? r.createdAt : null,
        ).lastInsertRowid,
      );
    });

    const insertFlag = sqlite.prepare('INSERT INTO report_flags (report_id, user_id, reason) VALUES (?, ?, ?)');
    for (const f of atlas.flags) insertFlag.run(reportIds[f.reportIndex], userIds[f.growerIndex], f.reason);

    // Hidden by the demo editor now, through the same record an editor's hide leaves (report and audit log).
    const hide = sqlite.prepare("UPDATE reports SET status = 'hidden', hidden_reason = ?, hidden_by_id = ?, hidden_at = ?, updated_at = ?, updated_by_id = ? WHERE id = ?");
    for (const h of atlas.hidden) {
      const id = reportIds[h.reportIndex]!;
      const now = new Date().toISOString();
      hide.run(h.reason, editor?.id ?? null, now, now, editor?.id ?? null, id);
      recordAudit(db, { actorId: editor?.id ?? null, action: 'report.hide', entityType: 'report', entityId: id, before: { status: 'published' }, after: { status: 'hidden', hiddenReason: h.reason } });
    }
  });
}
