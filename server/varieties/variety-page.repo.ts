import type { Crop, Outcome } from '../../shared/domain/codes';
import type { Db } from '../db/client';
import { photoUrl } from '../photos/photos';

/*
 * Rows behind a variety's own page: published reports only, with their public grid cell (never
 * the exact place). The computation lives in shared/domain/variety-page.ts and guidance.ts.
 */

export interface VarietyPageRow {
  treeId: number;
  userId: number;
  gridLat: number;
  gridLon: number;
  crop: Crop;
  outcome: Outcome;
  firstRipeDate: string | null;
  springFrostDate: string | null;
}

export function publishedReportsOfVariety(db: Db, varietyId: number): VarietyPageRow[] {
  return db.sqlite
    .prepare(
      `SELECT tree_id AS treeId, user_id AS userId, grid_lat AS gridLat, grid_lon AS gridLon, crop, outcome,
              first_ripe_date AS firstRipeDate, spring_frost_date AS springFrostDate
         FROM reports WHERE variety_id = ? AND status = 'published'`,
    )
    .all(varietyId) as VarietyPageRow[];
}

/** Photos of the variety's published reports, newest season first (at most `limit`). */
export function publishedPhotosOfVariety(db: Db, varietyId: number, limit = 12): { reportId: number; season: number; url: string; thumbUrl: string }[] {
  const rows = db.sqlite
    .prepare(
      `SELECT p.report_id AS reportId, r.season, p.file_name AS fileName, p.thumb_name AS thumbName
         FROM report_photos p JOIN reports r ON r.id = p.report_id
        WHERE r.variety_id = ? AND r.status = 'published'
        ORDER BY r.season DESC, r.id DESC, p.position, p.id LIMIT ?`,
    )
    .all(varietyId, limit) as { reportId: number; season: number; fileName: string; thumbName: string }[];
  return rows.map((r) => ({ reportId: r.reportId, season: r.season, url: photoUrl(r.fileName), thumbUrl: photoUrl(r.thumbName) }));
}
