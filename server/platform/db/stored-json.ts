import type { z } from 'zod';

// Stored JSON, parsed with the schema that wrote it (decision 007: parse, don't cast). Every
// area reads each of its JSON columns at one place through parseStoredJson; a value that is not
// JSON, or not of the stored shape, is corrupt: reading it is an error that names the table, the
// row and the column, never a silent fallback.

/** A stored value that does not have its column's shape. */
export class StoredRowError extends Error {
  constructor(
    readonly table: string,
    readonly rowId: string | number,
    readonly column: string,
    problem: string,
  ) {
    super(`${table} ${rowId}: column ${column} ${problem}`);
    this.name = 'StoredRowError';
  }
}

/** A zod error's issues on one line: `path: message; ...`. */
export function issuesText(error: z.ZodError): string {
  return error.issues.map((i) => `${i.path.join('.') || '(root)'}: ${i.message}`).join('; ');
}

export type StoredAt = { table: string; rowId: string | number; column: string };

/** One column's text through its schema; SQL null reads as null. */
export function parseStoredJson<S extends z.ZodType>(schema: S, text: string, at: StoredAt): z.infer<S>;
export function parseStoredJson<S extends z.ZodType>(schema: S, text: string | null, at: StoredAt): z.infer<S> | null;
export function parseStoredJson<S extends z.ZodType>(schema: S, text: string | null, at: StoredAt): z.infer<S> | null {
  if (text === null) return null;
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (e) {
    throw new StoredRowError(at.table, at.rowId, at.column, `is not JSON (${(e as Error).message})`);
  }
  const r = schema.safeParse(raw);
  if (!r.success) throw new StoredRowError(at.table, at.rowId, at.column, `does not have its stored shape: ${issuesText(r.error)}`);
  return r.data;
}
