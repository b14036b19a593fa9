import type Database from 'better-sqlite3';

/*
 * Data versions for in-memory caches. Triggers (drizzle/0005_data-version.sql) add one to the
 * counter 'atlas' in `data_versions` on every insert, update and delete of a report or a variety,
 * so a cache of anything computed from those two tables stays valid exactly as long as the counter
 * has not moved. Reading it is one primary-key look-up, whatever the size of the atlas.
 */

const statements = new WeakMap<Database.Database, Database.Statement>();

/**
 * The atlas data version: a number that moves whenever any report or variety is added, edited or
 * removed, committed by any connection (another process or worker included). Compare it with
 * equality only: it counts row changes, so a rolled-back transaction takes it back too.
 */
export function atlasDataVersion(db: { sqlite: Database.Database }): number {
  let statement = statements.get(db.sqlite);
  if (!statement) {
    statement = db.sqlite.prepare("SELECT version FROM data_versions WHERE name = 'atlas'").pluck();
    statements.set(db.sqlite, statement);
  }
  return statement.get() as number;
}
