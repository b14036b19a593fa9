import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import type { Variety, VarietyListQuery } from '../../shared/schemas/varieties';
import type { Db } from '../db/client';
import { varieties, varietySynonyms } from '../db/schema';

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

/** Varieties by name or synonym (case-insensitive substring), accepted ones unless a status is asked for. */
export function listVarieties(db: Db, query: VarietyListQuery): Variety[] {
  const conditions = [eq(varieties.status, query.status ?? 'accepted')];
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
