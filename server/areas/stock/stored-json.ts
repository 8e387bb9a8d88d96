import { z } from 'zod';
import type { Tiling } from '../../../shared/tiling/index';
import { issuesText, parseStoredJson, StoredRowError } from '../../platform/db/stored-json';

// The stock's and the submissions' JSON columns, each read here through its schema (decision
// 007); a row that does not read is a StoredRowError naming the table, the row and the column.

const stockParamsSchema = z.record(z.string(), z.unknown());

/** params_json of a stock row: how it was made (foundry run, submission, demo). */
export function storedParamsOf(row: { id: number; paramsJson: string | null }): Record<string, unknown> | null {
  return parseStoredJson(stockParamsSchema, row.paramsJson, { table: 'stock', rowId: row.id, column: 'params_json' });
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
  const row = rows[Number(issue?.path[0] ?? 0)]!;
  throw new StoredRowError(table, row.id, 'squares_json', `does not have its stored shape: ${issuesText(new z.ZodError(issue ? [{ ...issue, path: issue.path.slice(1) }] : []))}`);
}

/** The tiling of a stock or submission row (its width, height and squares_json). */
export function storedTiling(table: 'stock' | 'submission', row: { id: number; width: number; height: number; squaresJson: string }): Tiling {
  const [squares] = storedSquaresOf(table, [row]);
  return { W: row.width, H: row.height, squares: squares!.map(([x, y, s]) => ({ x, y, s })) };
}
