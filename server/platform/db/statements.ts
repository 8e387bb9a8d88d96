import type Database from 'better-sqlite3';
import type { Statement } from 'better-sqlite3';
import type { DbOrTx } from './client';

// Statements prepared once per connection, for hot paths (the stock list, storing job results):
// Drizzle builds the SQL text and SQLite prepares it again on every call, about 0.2 ms each,
// most of the cost of storing one foundry result (issue 14). Texts come from the code (column
// and sort whitelists), never from input; values are always parameters.

/** The better-sqlite3 connection behind a database or one of its transactions (the same connection: a statement run on it runs inside the open transaction). */
export function connectionOf(d: DbOrTx): Database.Database {
  const x = d as { $client?: Database.Database; session?: { client?: Database.Database } };
  const c = x.$client ?? x.session?.client;
  if (!c) throw new Error('connectionOf: not a better-sqlite3 database or transaction');
  return c;
}

const statementCache = new WeakMap<Database.Database, Map<string, Statement>>();

/** The statement for `text` on this connection, prepared on first use (the 500 most recent texts are kept). */
export function prepared(client: Database.Database, text: string): Statement {
  let perDb = statementCache.get(client);
  if (!perDb) statementCache.set(client, (perDb = new Map()));
  let st = perDb.get(text);
  if (!st) {
    if (perDb.size >= 500) perDb.delete(perDb.keys().next().value!);
    perDb.set(text, (st = client.prepare(text)));
  }
  return st;
}
