import { and, asc, eq, inArray, or, sql, type SQL } from 'drizzle-orm';
import type { Variety, VarietyListQuery } from '../../shared/schemas/varieties';
import type { Db } from '../db/client';
import { reports, varieties, varietySynonyms } from '../db/schema';

type VarietyRow = typeof varieties.$inferSelect;

function withSynonyms(db: Db, rows: VarietyRow[]): Variety[] {
  const ids = rows.map((r) => r.id);
  const synonyms = ids.length ? db.select().from(varietySynonyms).where(inArray(varietySynonyms.varietyId, ids)).orderBy(asc(varietySynonyms.name)).all() : [];
  return rows.map((row) => ({
    id: row.id,
    name: row.name,
    synonyms: synonyms.filter((s) => s.varietyId === row.id).map((s) => s.name),
    figType: row.figType,
    bearsBreba: row.bearsBreba,
    bearsMain: row.bearsMain,
    ripeningClass: row.ripeningClass,
    typicalDaysToRipen: row.typicalDaysToRipen,
    notes: row.notes,
    sources: row.sources,
    status: row.status,
    isFictional: row.isFictional,
  }));
}

/** Who asks: editors see every name; anyone else what visibleTo allows. */
export type VarietyViewer = { id: number; role: string } | undefined;

/**
 * Which catalogue rows a viewer may see. A name that is not accepted (proposed, rejected, merged)
 * is a grower's text: public only once a published report carries it, so a draft's proposed name
 * stays with its author and the editors until the report is published (issue 15).
 */
function visibleTo(viewer: VarietyViewer): SQL | undefined {
  if (viewer && (viewer.role === 'editor' || viewer.role === 'admin')) return undefined;
  const published = sql`EXISTS (SELECT 1 FROM ${reports} WHERE ${reports.varietyId} = ${varieties.id} AND ${reports.status} = 'published')`;
  return viewer
    ? or(eq(varieties.status, 'accepted'), eq(varieties.proposedByUserId, viewer.id), published)
    : or(eq(varieties.status, 'accepted'), published);
}

/** Varieties by name or synonym (case-insensitive substring), accepted ones unless a status is asked for; only those the viewer may see. */
export function listVarieties(db: Db, query: VarietyListQuery, viewer: VarietyViewer): Variety[] {
  const conditions = [eq(varieties.status, query.status ?? 'accepted')];
  const visible = visibleTo(viewer);
  if (visible) conditions.push(visible);
  if (query.q) {
    const pattern = `%${query.q.toLowerCase().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    conditions.push(
      sql`(lower(${varieties.name}) LIKE ${pattern} ESCAPE '\\' OR ${varieties.id} IN (SELECT ${varietySynonyms.varietyId} FROM ${varietySynonyms} WHERE lower(${varietySynonyms.name}) LIKE ${pattern} ESCAPE '\\'))`,
    );
  }
  const rows = db.select().from(varieties).where(and(...conditions)).orderBy(asc(sql`lower(${varieties.name})`)).all();
  return withSynonyms(db, rows);
}

export function findVariety(db: Db, id: number): Variety | undefined {
  const row = db.select().from(varieties).where(eq(varieties.id, id)).get();
  return row ? withSynonyms(db, [row])[0] : undefined;
}

/** findVariety, for a viewer: a name they may not see (see visibleTo) is not found. */
export function findVisibleVariety(db: Db, id: number, viewer: VarietyViewer): Variety | undefined {
  const row = db.select().from(varieties).where(and(eq(varieties.id, id), visibleTo(viewer))).get();
  return row ? withSynonyms(db, [row])[0] : undefined;
}
