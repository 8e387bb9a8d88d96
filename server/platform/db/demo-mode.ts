import { eq } from 'drizzle-orm';
import type { Db } from './client';
import { appMeta } from './schema';

// Whether this database was seeded in demo mode, kept in the database itself.
const key = 'demo_seeded';

export function wasDemoSeeded(db: Db): boolean {
  return db.select({ value: appMeta.value }).from(appMeta).where(eq(appMeta.key, key)).get()?.value === '1';
}

export function markDemoSeeded(db: Db): void {
  db.insert(appMeta).values({ key, value: '1' }).onConflictDoUpdate({ target: appMeta.key, set: { value: '1' } }).run();
}

/** DEMO if set; otherwise on for a new database, and on for a database seeded in demo mode. */
export function resolveDemoMode(db: Db, isNew: boolean, demoVar: boolean | undefined): boolean {
  if (demoVar !== undefined) return demoVar;
  return isNew || wasDemoSeeded(db);
}
