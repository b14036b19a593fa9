import { boundingBox, distanceKm } from '../../shared/domain/geo';
import type { Db } from '../db/client';
import { followedPlacesOf, listFollows } from './follows.repo';

/*
 * What the weekly digest adds for the varieties and places a grower follows: ripened reports that
 * became public in the digest's window, other growers' only, placed by their public grid cell.
 * Kept apart from the home-radius part of the digest (server/email/digest.ts) so that either can
 * change without the other.
 */

export interface FollowedVarietyNews {
  varietyId: number;
  name: string;
  reports: number;
  /** Distinct public grid cells the reports came from. */
  cells: number;
}

export interface FollowedPlaceNews {
  name: string;
  reports: number;
  varieties: string[];
}

export interface FollowedNews {
  varieties: FollowedVarietyNews[];
  places: FollowedPlaceNews[];
}

const PUBLISHED_RIPENED_IN_WINDOW = `r.status = 'published' AND r.outcome = 'ripened' AND r.published_at > ? AND r.published_at <= ? AND r.user_id <> ?`;

/** News for the followed varieties and places in (since, until]; places are searched within radiusKm of the followed point. */
export function followedNews(db: Db, userId: number, since: string, until: string, radiusKm: number): FollowedNews {
  const follows = listFollows(db, userId);
  const byVariety = db.sqlite.prepare(`SELECT r.grid_lat AS gridLat, r.grid_lon AS gridLon FROM reports r WHERE r.variety_id = ? AND ${PUBLISHED_RIPENED_IN_WINDOW}`);
  const varieties = follows.varieties.flatMap((v) => {
    const rows = byVariety.all(v.varietyId, since, until, userId) as { gridLat: number; gridLon: number }[];
    return rows.length ? [{ varietyId: v.varietyId, name: v.name, reports: rows.length, cells: new Set(rows.map((r) => `${r.gridLat},${r.gridLon}`)).size }] : [];
  });

  // The grid index covers (grid_lat, grid_lon): a box over grid cells, then the exact distance to each cell centre.
  const inBox = db.sqlite.prepare(
    `SELECT r.grid_lat AS gridLat, r.grid_lon AS gridLon, v.name AS varietyName FROM reports r LEFT JOIN varieties v ON v.id = r.variety_id
      WHERE r.grid_lat BETWEEN ? AND ? AND r.grid_lon BETWEEN ? AND ? AND ${PUBLISHED_RIPENED_IN_WINDOW}`,
  );
  const places = followedPlacesOf(db, userId).flatMap((p) => {
    const rows: { gridLat: number; gridLon: number; varietyName: string | null }[] = [];
    for (const b of boundingBox(p, radiusKm)) {
      for (const row of inBox.all(b.minLat, b.maxLat, b.minLon, b.maxLon, since, until, userId) as typeof rows) {
        if (distanceKm(p, { lat: row.gridLat, lon: row.gridLon }) <= radiusKm) rows.push(row);
      }
    }
    if (!rows.length) return [];
    const names = [...new Set(rows.map((r) => r.varietyName ?? 'a name awaiting review'))].sort();
    return [{ name: p.name, reports: rows.length, varieties: names }];
  });
  return { varieties, places };
}

export const hasNews = (news: FollowedNews) => news.varieties.length > 0 || news.places.length > 0;
