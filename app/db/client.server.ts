import Database from "better-sqlite3";
import { drizzle, type BetterSQLite3Database } from "drizzle-orm/better-sqlite3";
import { migrate } from "drizzle-orm/better-sqlite3/migrator";
import { mkdirSync } from "node:fs";
import path from "node:path";
import { env } from "~/server/env.server";
import * as schema from "./schema";

export type Db = BetterSQLite3Database<typeof schema> & { $client: Database.Database };
/** The handle `db().transaction(...)` passes to its callback. */
export type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];

/** Opens a SQLite file with the pragmas Nearnote relies on and applies pending migrations (from MIGRATIONS_DIR). */
export function openDatabase(file: string, migrationsDir = env().migrationsDir): Db {
  mkdirSync(path.dirname(file), { recursive: true });
  const sqlite = new Database(file);
  sqlite.pragma("journal_mode = WAL");
  sqlite.pragma("foreign_keys = ON");
  sqlite.pragma("busy_timeout = 5000");
  sqlite.pragma("synchronous = NORMAL");
  const db = drizzle(sqlite, { schema }) as Db;
  migrate(db, { migrationsFolder: migrationsDir });
  return db;
}

let instance: Db | undefined;

/** The one database connection of the process, opened on first use. */
export function db(): Db {
  instance ??= openDatabase(env().databasePath);
  return instance;
}

/**
 * Closes the process's connection; the next `db()` opens it again. Commands close it
 * before handing the database to the server they start, and tests before swapping in a
 * freshly migrated file.
 */
export function closeDatabase() {
  instance?.$client.close();
  instance = undefined;
}

/**
 * A query built once per connection (Drizzle's `.prepare()`, with `sql.placeholder` for the
 * values) for the queries nearly every request runs, so they skip building the SQL each time.
 * A fresh connection (tests swap the file) gets its own.
 */
export function preparedQuery<T>(build: (database: Db) => T): () => T {
  const byConnection = new WeakMap<Db, T>();
  return () => {
    const database = db();
    let query = byConnection.get(database);
    if (query === undefined) {
      query = build(database);
      byConnection.set(database, query);
    }
    return query;
  };
}
