import type Database from 'better-sqlite3';

/*
 * Data versions for in-memory caches. Triggers add one to a named counter in `data_versions` on
 * every insert, update and delete of the tables it covers, so a cache of anything computed from
 * those tables stays valid exactly as long as the counter has not moved. Reading it is one
 * primary-key look-up, whatever the size of the data.
 *
 *   'atlas'     reports and varieties (drizzle/0005_data-version.sql)
 *   'stations'  stations and station_summaries (drizzle/0010_stations-data-version.sql)
 */

type DataSet = 'atlas' | 'stations';

const statements = new WeakMap<Database.Database, Database.Statement>();

/** The counter of one data set: one prepared statement per database, shared by every data set. */
function dataVersion(db: { sqlite: Database.Database }, name: DataSet): number {
  let statement = statements.get(db.sqlite);
  if (!statement) {
    statement = db.sqlite.prepare('SELECT version FROM data_versions WHERE name = ?').pluck();
    statements.set(db.sqlite, statement);
  }
  const version = statement.get(name) as number | undefined;
  // Without the row every read would look like the same version and a cache would never refresh.
  if (version === undefined) throw new Error(`data_versions has no '${name}' row: the database is not migrated`);
  return version;
}

/**
 * The atlas data version: a number that moves whenever any report or variety is added, edited or
 * removed, committed by any connection (another process or worker included). Compare it with
 * equality only: it counts row changes, so a rolled-back transaction takes it back too.
 */
export function atlasDataVersion(db: { sqlite: Database.Database }): number {
  return dataVersion(db, 'atlas');
}

/**
 * The stations data version: moves whenever a station or one of its summaries (the computed frost
 * dates) is added, edited or removed, by any connection. Compare with equality only, as the atlas one.
 */
export function stationsDataVersion(db: { sqlite: Database.Database }): number {
  return dataVersion(db, 'stations');
}
