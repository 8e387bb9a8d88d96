import { z } from 'zod';
import type { Tiling } from '../../../shared/tiling/index';

// Stored JSON is parsed, not cast: each JSON column is read through its zod schema at one
// place, and a row that does not read is an error naming the table, the row and the column.

/** A stored JSON column that does not read as its schema: the stored data are at fault (a 500, not the caller's 4xx). */
export class StoredJsonError extends Error {
  constructor(
    readonly table: string,
    readonly rowId: number,
    readonly column: string,
    problem: string,
  ) {
    super(`${table} row ${rowId}: ${column} ${problem}`);
    this.name = 'StoredJsonError';
  }
}

export interface StoredAt {
  table: string;
  id: number;
  column: string;
}

/** A schema over a column's JSON text: the text must be JSON, and its value must be of `schema`. */
export function jsonText<S extends z.ZodType>(schema: S) {
  return z
    .string()
    .transform((text, ctx): unknown => {
      try {
        return JSON.parse(text);
      } catch {
        ctx.addIssue({ code: 'custom', message: 'not JSON' });
        return z.NEVER;
      }
    })
    .pipe(schema);
}

/** Read a stored column's text through its schema; a text that does not read throws a StoredJsonError naming the row. */
export function readStored<S extends z.ZodType<unknown, string>>(schema: S, text: string, at: StoredAt): z.output<S> {
  const r = schema.safeParse(text);
  if (!r.success) {
    const issue = r.error.issues[0];
    const path = issue && issue.path.length ? ` at ${issue.path.join('.')}` : '';
    throw new StoredJsonError(at.table, at.id, at.column, `does not read${path}: ${issue?.message ?? 'invalid'}`);
  }
  return r.data;
}

/** A stored integer as JSON.stringify writes it: non-negative, at most 15 digits (so exact). */
const storedInt = String.raw`\d{1,15}`;
const storedSquare = String.raw`\[${storedInt},${storedInt},${storedInt}\]`;

/**
 * squares_json of the stock and of submissions: [[x,y,s],...] exactly as squaresToJson writes
 * it. The schema checks the text's grammar, so what JSON.parse gives for a text that matches is
 * a non-empty list of integer triples. Checking the text costs about as much as JSON.parse;
 * checking the parsed value element by element (z.tuple) made a stock list page cost about
 * twice the CPU (measured on the 50,000 tilings bench/intake.ts seeds).
 */
export const storedSquaresSchema = z
  .string()
  .regex(new RegExp(`^\\[${storedSquare}(?:,${storedSquare})*\\]$`), 'not a list of [x,y,s] (non-negative integers)')
  .transform((text): [number, number, number][] => JSON.parse(text));

/** Squares stored compactly as [[x,y,s],...]. */
export function squaresToJson(t: Tiling): string {
  return JSON.stringify(t.squares.map((q) => [q.x, q.y, q.s]));
}

/** The squares_json of a stock or submission row: the one place that column is read. */
export function storedSquares(table: 'stock' | 'submission', id: number, json: string): [number, number, number][] {
  return readStored(storedSquaresSchema, json, { table, id, column: 'squares_json' });
}

/** The tiling of a stock or submission row (its width, height and squares_json). */
export function storedTiling(table: 'stock' | 'submission', row: { id: number; width: number; height: number; squaresJson: string }): Tiling {
  return { W: row.width, H: row.height, squares: storedSquares(table, row.id, row.squaresJson).map(([x, y, s]) => ({ x, y, s })) };
}
