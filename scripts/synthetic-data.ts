// Synthetic (invented) growers, trees and reports in bulk, for the load script and reliability tests.
// One transaction with prepared statements and the report triggers replayed once at the end
// (scripts/bulk-load.ts): 200,000 reports take a few seconds.
import type Database from 'better-sqlite3';
import { bulkLoad } from './bulk-load';
import { CROPS, GROWING_FORMS, OUTCOMES, PLANT_ORIGINS } from '../shared/domain/codes';
import { snapToGrid } from '../shared/domain/public-grid';
import { seededRandom } from '../server/seed/random';

/** Regions where synthetic growers live (North America's fig belt and cool north, Europe, south-east Australia). */
const REGIONS = [
  { minLat: 29, maxLat: 48, minLon: -123, maxLon: -70 },
  { minLat: 36, maxLat: 56, minLon: -9, maxLon: 28 },
  { minLat: -38, maxLat: -28, minLon: 138, maxLon: 153 },
];

/** Places where growers cluster (towns), drawn once per seed. */
export function syntheticCentres(count: number, seed = 2026): { lat: number; lon: number }[] {
  const rand = seededRandom(seed ^ 0x5eed);
  return Array.from({ length: count }, (_, i) => {
    const region = REGIONS[i % 5 === 4 ? 2 : i % 2]!;
    return { lat: region.minLat + rand() * (region.maxLat - region.minLat), lon: region.minLon + rand() * (region.maxLon - region.minLon) };
  });
}

export interface SyntheticOptions {
  reports: number;
  growers: number;
  /** argon2 hash given to every synthetic account. */
  passwordHash: string;
  /** E-mail of grower i: default `load-grower-<i>@synthetic.syconium.test`. */
  emailOf?: (i: number) => string;
  seed?: number;
  /** Latest season year (reports spread over the ten years before it). */
  lastSeason?: number;
  /** How many towns the growers cluster around (default: one per 10 growers). */
  centres?: number;
}

export const syntheticEmail = (i: number) => `load-grower-${i}@synthetic.syconium.test`;

export interface SyntheticIds {
  userIds: number[];
  firstReportId: number;
  lastReportId: number;
}

/**
 * Insert growers (verified e-mail), one to five trees each, and `reports` published reports on
 * them, all in one transaction, through bulkLoad (the derived tables are filled once at the end).
 * Needs at least one variety in the catalogue. Returns the new ids.
 */
export function insertSyntheticData(sqlite: Database.Database, options: SyntheticOptions): SyntheticIds {
  return bulkLoad(sqlite, () => insertSyntheticRows(sqlite, options));
}

/** The same rows with every trigger firing per row (slow; the reference bulkLoad is checked against). */
export function insertSyntheticRows(sqlite: Database.Database, options: SyntheticOptions): SyntheticIds {
  const rand = seededRandom(options.seed ?? 2026);
  const centres = syntheticCentres(options.centres ?? Math.max(1, Math.ceil(options.growers / 10)), options.seed ?? 2026);
  const pick = <T>(list: readonly T[]): T => list[Math.floor(rand() * list.length)]!;
  const emailOf = options.emailOf ?? syntheticEmail;
  const lastSeason = options.lastSeason ?? new Date().getUTCFullYear() - 1;
  const varietyIds = sqlite.prepare("SELECT id FROM varieties WHERE status = 'accepted'").pluck().all() as number[];
  if (varietyIds.length === 0) throw new Error('insertSyntheticData needs at least one accepted variety');

  const insertUser = sqlite.prepare(
    "INSERT INTO users (email, display_name, password_hash, role, email_verified_at, is_demo, data_licence_agreed_at) VALUES (?, ?, ?, 'grower', strftime('%Y-%m-%dT%H:%M:%fZ','now'), 0, strftime('%Y-%m-%dT%H:%M:%fZ','now'))",
  );
  const insertTree = sqlite.prepare('INSERT INTO trees (user_id, label) VALUES (?, ?)');
  const insertReport = sqlite.prepare(`INSERT INTO reports
    (user_id, tree_id, variety_id, lat, lon, grid_lat, grid_lon, form, origin, year_planted, season, crop, outcome,
     first_ripe_date, last_harvest_date, pinched, notes, status)
    VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, 'published')`);

  return sqlite.transaction(() => {
    const growers: { userId: number; lat: number; lon: number; trees: { id: number; varietyId: number }[] }[] = [];
    for (let i = 0; i < options.growers; i++) {
      const userId = Number(insertUser.run(emailOf(i), `Synthetic grower ${i}`, options.passwordHash).lastInsertRowid);
      const centre = pick(centres);
      const lat = centre.lat + (rand() - 0.5) * 0.6;
      const lon = centre.lon + (rand() - 0.5) * 0.8;
      const trees = Array.from({ length: 1 + Math.floor(rand() * 5) }, (_, t) => {
        const varietyId = pick(varietyIds);
        return { id: Number(insertTree.run(userId, `Synthetic tree ${t + 1}`).lastInsertRowid), varietyId };
      });
      growers.push({ userId, lat, lon, trees });
    }
    let firstReportId = 0;
    let lastReportId = 0;
    for (let r = 0; r < options.reports; r++) {
      const grower = growers[r % growers.length]!;
      const tree = pick(grower.trees);
      const lat = Math.round((grower.lat + (rand() - 0.5) * 0.02) * 1e5) / 1e5;
      const lon = Math.round((grower.lon + (rand() - 0.5) * 0.02) * 1e5) / 1e5;
      const season = lastSeason - Math.floor(rand() * 10);
      const outcome = pick(OUTCOMES);
      const ripe = outcome === 'ripened' ? `${season}-08-${String(10 + Math.floor(rand() * 19)).padStart(2, '0')}` : null;
      const id = Number(
        insertReport.run(
          grower.userId, tree.id, tree.varietyId, lat, lon, snapToGrid(lat), snapToGrid(lon), pick(GROWING_FORMS), pick(PLANT_ORIGINS),
          season - 1 - Math.floor(rand() * 8), season, pick(CROPS), outcome, ripe, ripe ? `${season}-09-30` : null, 0, 'Synthetic load-test report',
        ).lastInsertRowid,
      );
      if (!firstReportId) firstReportId = id;
      lastReportId = id;
    }
    return { userIds: growers.map((g) => g.userId), firstReportId, lastReportId };
  })();
}
