import Database from 'better-sqlite3';
import { drizzle, type BetterSQLite3Database } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import { mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import { fromRoot } from '../app-root';

/** The app's database. Tables are defined per area (server/areas/<area>/schema.ts) and by the platform; queries name their tables, so the handle carries no schema. */
export type Db = BetterSQLite3Database & { $client: Database.Database };
/** A database or a transaction handle: what services and queueMail take. */
export type DbOrTx = Pick<Db, 'select' | 'insert' | 'update' | 'delete' | 'run' | 'all' | 'get'>;

export type OpenDatabaseOptions = {
  /** Folder of generated migrations; default `<app root>/drizzle`. */
  migrationsFolder?: string;
  /** Run the committed migrations (default true). */
  migrate?: boolean;
};

/**
 * Open (and create) a SQLite database with WAL, foreign keys and a busy timeout, and
 * apply the committed migrations. `file` may be ':memory:'.
 */
export function openDatabase(file: string, options: OpenDatabaseOptions = {}): Db {
  if (file !== ':memory:') mkdirSync(dirname(file), { recursive: true });
  const sqlite = new Database(file);
  if (file !== ':memory:') sqlite.pragma('journal_mode = WAL');
  sqlite.pragma('foreign_keys = ON');
  sqlite.pragma('busy_timeout = 5000');
  const db = drizzle(sqlite) as Db;
  if (options.migrate !== false) {
    migrate(db, { migrationsFolder: options.migrationsFolder ?? fromRoot('drizzle') });
  }
  return db;
}

export function closeDatabase(db: Db): void {
  if (db.$client.open) db.$client.close();
}
