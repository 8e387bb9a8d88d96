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

function storedError(at: StoredAt, issue: z.core.$ZodIssue | undefined, skip = 0): StoredJsonError {
  const path = issue && issue.path.length > skip ? ` at ${issue.path.slice(skip).join('.')}` : '';
  return new StoredJsonError(at.table, at.id, at.column, `does not read${path}: ${issue?.message ?? 'invalid'}`);
}

/** Read a stored column's text through its schema; a text that does not read throws a StoredJsonError naming the row. */
export function readStored<S extends z.ZodType<unknown, string>>(schema: S, text: string, at: StoredAt): z.output<S> {
  const r = schema.safeParse(text);
  if (!r.success) throw storedError(at, r.error.issues[0]);
  return r.data;
}

/** A stored integer as JSON.stringify writes it: non-negative, at most 15 digits (so exact). */
const storedInt = String.raw`\d{1,15}`;
const storedSquare = String.raw`\[${storedInt},${storedInt},${storedInt}\]`;

type StoredSquares = [number, number, number][];

/**
 * squares_json of the stock and of submissions: [[x,y,s],...] exactly as squaresToJson writes
 * it. The schema checks each text's grammar, so what JSON.parse gives for texts that match is
 * a non-empty list of integer triples per text. It reads the texts of many rows at once (a
 * list page): checking a text costs about as much as JSON.parse, where checking the parsed
 * value element by element (z.tuple), or one schema call per row, cost a stock list page up to
 * twice the CPU (measured on the 50,000 tilings bench/intake.ts seeds).
 */
export const storedSquaresSchema = z
  .array(z.string().regex(new RegExp(`^\\[${storedSquare}(?:,${storedSquare})*\\]$`), 'not a list of [x,y,s] (non-negative integers)'))
  .transform((texts): StoredSquares[] => JSON.parse(`[${texts.join(',')}]`));

/** Squares stored compactly as [[x,y,s],...]. */
export function squaresToJson(t: Tiling): string {
  return JSON.stringify(t.squares.map((q) => [q.x, q.y, q.s]));
}

/** The squares_json of stock or submission rows, in the order given: the one place that column is read. */
export function storedSquaresOf(table: 'stock' | 'submission', rows: readonly { id: number; squaresJson: string }[]): StoredSquares[] {
  const r = storedSquaresSchema.safeParse(rows.map((row) => row.squaresJson));
  if (r.success) return r.data;
  // the first issue's path starts with the index of the row that does not read
  const issue = r.error.issues[0];
  throw storedError({ table, id: rows[Number(issue?.path[0] ?? 0)]!.id, column: 'squares_json' }, issue, 1);
}

/** The tiling of a stock or submission row (its width, height and squares_json). */
export function storedTiling(table: 'stock' | 'submission', row: { id: number; width: number; height: number; squaresJson: string }): Tiling {
  const [squares] = storedSquaresOf(table, [row]);
  return { W: row.width, H: row.height, squares: squares!.map(([x, y, s]) => ({ x, y, s })) };
}
