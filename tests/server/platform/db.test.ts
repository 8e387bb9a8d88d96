import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { closeDatabase, openDatabase } from '../../../server/platform/db/client';
import { session } from '../../../server/platform/auth/schema';

const dir = mkdtempSync(join(tmpdir(), 'sw-db-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('openDatabase', () => {
  it('a file database runs in WAL mode with foreign keys and a busy timeout', () => {
    const db = openDatabase(join(dir, 'a', 'test.db'));
    expect(db.$client.pragma('journal_mode', { simple: true })).toBe('wal');
    expect(db.$client.pragma('foreign_keys', { simple: true })).toBe(1);
    expect(db.$client.pragma('busy_timeout', { simple: true })).toBe(5000);
    closeDatabase(db);
  });

  it('applies every committed migration, and again is a no-op', () => {
    const file = join(dir, 'b.db');
    const db = openDatabase(file);
    const tables = db.$client.prepare("select name from sqlite_master where type = 'table'").all() as { name: string }[];
    expect(tables.map((t) => t.name)).toEqual(expect.arrayContaining(['user', 'session', 'account', 'verification', 'invitation', 'mail_outbox', 'mailbox_message', 'app_meta']));
    const applied = (db.$client.prepare('select count(*) as n from __drizzle_migrations').get() as { n: number }).n;
    closeDatabase(db);
    const again = openDatabase(file);
    expect((again.$client.prepare('select count(*) as n from __drizzle_migrations').get() as { n: number }).n).toBe(applied);
    closeDatabase(again);
  });

  it('foreign keys are enforced (a session needs its user)', () => {
    const db = openDatabase(':memory:');
    expect(() =>
      db.insert(session).values({ id: 's1', token: 't1', userId: 'nobody', expiresAt: new Date() }).run(),
    ).toThrow(/FOREIGN KEY/);
    closeDatabase(db);
  });
});
