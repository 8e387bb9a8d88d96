import Database from 'better-sqlite3';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { z } from 'zod';

// Migration tests: a database migrated only up to (and including) the migration tagged
// `upTo`, to fill with rows in the old shape; then `migrateRest` applies the committed rest.

const committed = resolve(import.meta.dirname, '..', '..', '..', 'drizzle');
const journalSchema = z.looseObject({ entries: z.array(z.looseObject({ idx: z.number(), tag: z.string() })) });

export function databaseMigratedUpTo(upTo: string): { sqlite: Database.Database; migrateRest(): void; close(): void } {
  const dir = mkdtempSync(join(tmpdir(), 'sw-migrations-'));
  const partial = join(dir, 'drizzle');
  cpSync(committed, partial, { recursive: true });
  const journalFile = join(partial, 'meta', '_journal.json');
  const journal = journalSchema.parse(JSON.parse(readFileSync(journalFile, 'utf8')));
  const last = journal.entries.findIndex((e) => e.tag === upTo);
  if (last < 0) throw new Error(`no migration tagged ${upTo} in drizzle/meta/_journal.json`);
  writeFileSync(journalFile, JSON.stringify({ ...journal, entries: journal.entries.slice(0, last + 1) }));
  const sqlite = new Database(join(dir, 'test.db'));
  sqlite.pragma('foreign_keys = ON');
  const db = drizzle(sqlite);
  migrate(db, { migrationsFolder: partial });
  return {
    sqlite,
    migrateRest: () => migrate(db, { migrationsFolder: committed }),
    close: () => {
      sqlite.close();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
