import { and, asc, count, desc, eq, inArray, ne, sql, type SQL } from 'drizzle-orm';
import type { CatalogueEntry, CatalogueQuery, Variety, VarietyInput } from '../../shared/schemas/varieties';
import type { Db } from '../db/client';
import { reports, users, varieties, varietySynonyms } from '../db/schema';
import { recordAudit } from '../audit/audit.repo';
import { HttpError, notFound } from '../lib/http-error';
import { findVariety } from './varieties.repo';

/*
 * The editors' side of the catalogue: paginated listing over every status, and the writes
 * (create, edit, accept, reject, merge, import). Each write runs in one transaction with its
 * audit entry.
 */

const now = () => new Date().toISOString();
const likePattern = (q: string) => `%${q.toLowerCase().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
const reportCountSql = sql<number>`(SELECT count(*) FROM ${reports} WHERE ${reports.varietyId} = ${varieties.id})`;

export function listCatalogue(db: Db, query: CatalogueQuery): { items: CatalogueEntry[]; total: number } {
  const conditions: SQL[] = [];
  if (query.status) conditions.push(eq(varieties.status, query.status));
  if (query.figType) conditions.push(eq(varieties.figType, query.figType));
  if (query.q) {
    const pattern = likePattern(query.q);
    conditions.push(
      sql`(lower(${varieties.name}) LIKE ${pattern} ESCAPE '\\' OR ${varieties.id} IN (SELECT ${varietySynonyms.varietyId} FROM ${varietySynonyms} WHERE lower(${varietySynonyms.name}) LIKE ${pattern} ESCAPE '\\'))`,
    );
  }
  const where = conditions.length ? and(...conditions) : undefined;
  const total = db.select({ n: count() }).from(varieties).where(where).get()!.n;
  const column = {
    name: sql`lower(${varieties.name})`,
    status: varieties.status,
    figType: varieties.figType,
    reportCount: reportCountSql,
    createdAt: varieties.createdAt,
  }[query.sort];
  const order = query.dir === 'desc' ? desc(column) : asc(column);
  const rows = db
    .select({ id: varieties.id, reportCount: reportCountSql, proposedBy: users.displayName, reviewNote: varieties.reviewNote, mergedIntoId: varieties.mergedIntoId, createdAt: varieties.createdAt })
    .from(varieties)
    .leftJoin(users, eq(users.id, varieties.proposedByUserId))
    .where(where)
    .orderBy(order, asc(varieties.id))
    .limit(query.limit)
    .offset(query.offset)
    .all();
  const mergedIds = rows.map((r) => r.mergedIntoId).filter((id): id is number => id !== null);
  const mergedNames = new Map(mergedIds.length ? db.select({ id: varieties.id, name: varieties.name }).from(varieties).where(inArray(varieties.id, mergedIds)).all().map((r) => [r.id, r.name]) : []);
  const items = rows.map((row) => ({
    ...findVariety(db, row.id)!,
    reportCount: row.reportCount,
    proposedBy: row.proposedBy,
    reviewNote: row.reviewNote,
    mergedIntoId: row.mergedIntoId,
    mergedIntoName: row.mergedIntoId === null ? null : (mergedNames.get(row.mergedIntoId) ?? null),
    createdAt: row.createdAt,
  }));
  return { items, total };
}

/** Refuse a name or synonym that another variety already uses, naming the field. */
function assertNamesFree(db: Db, input: Pick<VarietyInput, 'name' | 'synonyms'>, exceptId: number | null): void {
  const fields: Record<string, string[]> = {};
  const other = (table: typeof varieties.id | typeof varietySynonyms.varietyId) => (exceptId === null ? undefined : ne(table, exceptId));
  const nameClash =
    db.select({ id: varieties.id }).from(varieties).where(and(sql`lower(${varieties.name}) = ${input.name.toLowerCase()}`, other(varieties.id))).get() ??
    db.select({ id: varietySynonyms.varietyId }).from(varietySynonyms).where(and(sql`lower(${varietySynonyms.name}) = ${input.name.toLowerCase()}`, other(varietySynonyms.varietyId))).get();
  if (nameClash) fields.name = [`“${input.name}” is already used by variety #${nameClash.id}; merge the two instead`];
  for (const synonym of input.synonyms) {
    const clash =
      db.select({ id: varieties.id }).from(varieties).where(and(sql`lower(${varieties.name}) = ${synonym.toLowerCase()}`, other(varieties.id))).get() ??
      db.select({ id: varietySynonyms.varietyId }).from(varietySynonyms).where(and(sql`lower(${varietySynonyms.name}) = ${synonym.toLowerCase()}`, other(varietySynonyms.varietyId))).get();
    if (clash) (fields.synonyms ??= []).push(`“${synonym}” already names variety #${clash.id}`);
  }
  if (Object.keys(fields).length) throw new HttpError(409, 'name_taken', Object.values(fields).flat().join('; '), fields);
}

function writeSynonyms(db: Db, varietyId: number, synonyms: string[]): void {
  db.delete(varietySynonyms).where(eq(varietySynonyms.varietyId, varietyId)).run();
  for (const name of synonyms) db.insert(varietySynonyms).values({ varietyId, name }).run();
}

function requireVariety(db: Db, id: number): Variety {
  const variety = findVariety(db, id);
  if (!variety) throw notFound('Variety');
  return variety;
}

export function createVariety(db: Db, input: VarietyInput, actorId: number, action = 'variety.create'): Variety {
  return db.transaction(() => {
    assertNamesFree(db, input, null);
    const { synonyms, ...values } = input;
    const { id } = db.insert(varieties).values({ ...values, status: 'accepted' }).returning({ id: varieties.id }).get();
    writeSynonyms(db, id, synonyms);
    const after = findVariety(db, id)!;
    recordAudit(db, { actorId, action, entityType: 'variety', entityId: id, after });
    return after;
  });
}

export function updateVariety(db: Db, id: number, input: VarietyInput, actorId: number, action = 'variety.update'): Variety {
  return db.transaction(() => {
    const before = requireVariety(db, id);
    if (before.status === 'merged') throw new HttpError(409, 'merged', 'This variety was merged into another; edit that one instead');
    assertNamesFree(db, input, id);
    const { synonyms, ...values } = input;
    db.update(varieties).set({ ...values, updatedAt: now() }).where(eq(varieties.id, id)).run();
    writeSynonyms(db, id, synonyms);
    const after = findVariety(db, id)!;
    recordAudit(db, { actorId, action, entityType: 'variety', entityId: id, before, after });
    return after;
  });
}

/** A proposed name becomes an accepted variety, with the details the editor filled in. */
export function acceptVariety(db: Db, id: number, input: VarietyInput, actorId: number): Variety {
  return db.transaction(() => {
    const before = requireVariety(db, id);
    if (before.status !== 'proposed' && before.status !== 'rejected') throw new HttpError(409, 'not_proposed', `Only proposed or rejected names can be accepted (this one is ${before.status})`);
    assertNamesFree(db, input, id);
    const { synonyms, ...values } = input;
    db.update(varieties).set({ ...values, status: 'accepted', reviewNote: null, updatedAt: now() }).where(eq(varieties.id, id)).run();
    writeSynonyms(db, id, synonyms);
    const after = findVariety(db, id)!;
    recordAudit(db, { actorId, action: 'variety.accept', entityType: 'variety', entityId: id, before, after });
    return after;
  });
}

/** Reject a proposed name: its reports keep the link, but only accepted varieties are aggregated. */
export function rejectVariety(db: Db, id: number, reason: string, actorId: number): Variety {
  return db.transaction(() => {
    const before = requireVariety(db, id);
    if (before.status !== 'proposed') throw new HttpError(409, 'not_proposed', `Only proposed names can be rejected (this one is ${before.status})`);
    db.update(varieties).set({ status: 'rejected', reviewNote: reason, updatedAt: now() }).where(eq(varieties.id, id)).run();
    const after = findVariety(db, id)!;
    recordAudit(db, { actorId, action: 'variety.reject', entityType: 'variety', entityId: id, before, after: { ...after, reviewNote: reason } });
    return after;
  });
}

/**
 * Merge one variety into another: its reports move to the kept variety, its name and synonyms
 * become synonyms of the kept one, and the merged row stays (status 'merged', mergedIntoId) so
 * nothing is lost and old links still resolve.
 */
export function mergeVariety(db: Db, id: number, intoId: number, actorId: number): { kept: Variety; movedReports: number; addedSynonyms: string[] } {
  if (id === intoId) throw new HttpError(400, 'invalid_input', 'A variety cannot be merged into itself', { intoId: ['Choose a different variety to keep'] });
  return db.transaction(() => {
    const merged = requireVariety(db, id);
    const kept = findVariety(db, intoId);
    if (!kept) throw new HttpError(400, 'invalid_input', 'The variety to keep was not found', { intoId: ['No such variety'] });
    if (merged.status === 'merged') throw new HttpError(409, 'merged', 'This variety was already merged');
    if (kept.status !== 'accepted') throw new HttpError(400, 'invalid_input', 'Merge into an accepted variety', { intoId: [`“${kept.name}” is ${kept.status}, not accepted`] });

    const movedReports = db.update(reports).set({ varietyId: intoId, updatedAt: now(), updatedById: actorId }).where(eq(reports.varietyId, id)).run().changes;
    const known = new Set([kept.name.toLowerCase(), ...kept.synonyms.map((s) => s.toLowerCase())]);
    const addedSynonyms: string[] = [];
    // the merged variety's synonyms move over (the unique index is global, so re-point the rows)
    for (const synonym of merged.synonyms) {
      if (known.has(synonym.toLowerCase())) db.delete(varietySynonyms).where(and(eq(varietySynonyms.varietyId, id), sql`lower(${varietySynonyms.name}) = ${synonym.toLowerCase()}`)).run();
      else {
        db.update(varietySynonyms).set({ varietyId: intoId }).where(and(eq(varietySynonyms.varietyId, id), sql`lower(${varietySynonyms.name}) = ${synonym.toLowerCase()}`)).run();
        addedSynonyms.push(synonym);
        known.add(synonym.toLowerCase());
      }
    }
    if (!known.has(merged.name.toLowerCase())) {
      db.insert(varietySynonyms).values({ varietyId: intoId, name: merged.name }).run();
      addedSynonyms.push(merged.name);
    }
    db.update(varieties).set({ status: 'merged', mergedIntoId: intoId, updatedAt: now() }).where(eq(varieties.id, id)).run();
    // earlier merges into the merged variety now point at the kept one
    db.update(varieties).set({ mergedIntoId: intoId }).where(eq(varieties.mergedIntoId, id)).run();
    const after = findVariety(db, intoId)!;
    recordAudit(db, {
      actorId,
      action: 'variety.merge',
      entityType: 'variety',
      entityId: id,
      before: { merged, kept },
      after: { merged: { ...findVariety(db, id)!, mergedIntoId: intoId }, kept: after, movedReports },
    });
    return { kept: after, movedReports, addedSynonyms };
  });
}

/** Import rows all at once: a row whose name matches a variety updates it, any other row creates one. */
export function importCatalogue(db: Db, rows: VarietyInput[], actorId: number): { created: number; updated: number } {
  return db.transaction(() => {
    let created = 0;
    let updated = 0;
    rows.forEach((row, index) => {
      const existing = db.select({ id: varieties.id }).from(varieties).where(sql`lower(${varieties.name}) = ${row.name.toLowerCase()}`).get();
      try {
        if (existing) {
          updateVariety(db, existing.id, row, actorId, 'variety.import-update');
          updated++;
        } else {
          createVariety(db, row, actorId, 'variety.import-create');
          created++;
        }
      } catch (error) {
        // name the CSV row (header is row 1) so the editor can find it
        if (error instanceof HttpError) {
          const row = index + 2;
          const fields = Object.fromEntries(Object.entries(error.fields ?? { _: [error.message] }).map(([key, messages]) => [`row ${row}.${key}`, messages]));
          throw new HttpError(400, 'invalid_csv', `Nothing was imported. Row ${row}: ${error.message}`, fields);
        }
        throw error;
      }
    });
    recordAudit(db, { actorId, action: 'variety.import', entityType: 'catalogue', after: { created, updated, rows: rows.length } });
    return { created, updated };
  });
}

/** Accepted varieties for the CSV export, by name. */
export function exportCatalogue(db: Db): Variety[] {
  const ids = db.select({ id: varieties.id }).from(varieties).where(eq(varieties.status, 'accepted')).orderBy(asc(sql`lower(${varieties.name})`)).all();
  return ids.map(({ id }) => findVariety(db, id)!);
}
