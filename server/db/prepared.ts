import type { Statement } from 'better-sqlite3';
import type { Db } from './client';

/*
 * Statements on the hot request paths are prepared once per database and reused. Building a
 * Drizzle query and letting SQLite prepare it costs more than running a point look-up, so doing
 * both on every request spends most of the server's CPU on SQL text.
 */

/**
 * A value built from the database once, on first use, and kept as long as the database object
 * lives (a WeakMap, so the temporary databases of tests do not pile up). Use it for Drizzle
 * prepared queries with `sql.placeholder`:
 *
 *   const byId = perDb((db) => db.select().from(users).where(eq(users.id, sql.placeholder('id'))).prepare());
 *   byId(db).get({ id });
 *
 * Mind two Drizzle habits with placeholders: a placeholder's value is encoded by its column's
 * mapper without Drizzle's null check (a JSON column would store the text "null" for null), and a
 * column left out of an insert takes its default at prepare time (fine for SQL defaults, wrong for
 * a `$defaultFn`). Use `statement` with plain SQL for such cases.
 */
export function perDb<T>(build: (db: Db) => T): (db: Db) => T {
  const built = new WeakMap<Db, T>();
  return (db) => {
    let value = built.get(db);
    if (value === undefined) {
      value = build(db);
      built.set(db, value);
    }
    return value;
  };
}

const statements = new WeakMap<Db, Map<string, Statement>>();

/** A better-sqlite3 statement for this SQL text, prepared once per database; `raw` answers arrays. */
export function statement(db: Db, sql: string, raw = false): Statement {
  let perDatabase = statements.get(db);
  if (!perDatabase) statements.set(db, (perDatabase = new Map()));
  const key = raw ? `raw:${sql}` : sql;
  let prepared = perDatabase.get(key);
  if (!prepared) {
    prepared = db.sqlite.prepare(sql);
    if (raw) prepared.raw(true);
    perDatabase.set(key, prepared);
  }
  return prepared;
}
