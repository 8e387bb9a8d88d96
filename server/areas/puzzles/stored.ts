import { getTableName } from 'drizzle-orm';
import { z } from 'zod';
import { puzzleLevelSchema, type PuzzleLevel } from '../../../shared/contracts/puzzles';
import { parseStoredJson } from '../../platform/db/stored-json';
import { certificateSchema, noteListSchema, placedListSchema, recheckOutcomeSchema, secondSolutionSchema, stepListSchema } from './rules';
import { puzzle } from './schema';

// The puzzle table's JSON columns, each with its schema, read here and nowhere else. They are
// written from a job summary that was parsed with the same schemas (./rules.ts), so a row that
// does not parse is corrupt: reading it is an error that names the table, the column and the
// row, never a silent fallback.

type PuzzleRow = typeof puzzle.$inferSelect;
type Row<K extends keyof PuzzleRow> = Pick<PuzzleRow, 'id' | K>;

/** One column's text through its schema; a column left empty (SQL null) reads as null. */
function parseColumn<T>(column: { name: string }, schema: z.ZodType<T>, rowId: number, text: string): T;
function parseColumn<T>(column: { name: string }, schema: z.ZodType<T>, rowId: number, text: string | null): T | null;
function parseColumn<T>(column: { name: string }, schema: z.ZodType<T>, rowId: number, text: string | null): T | null {
  return parseStoredJson(schema, text, { table: getTableName(puzzle), rowId, column: column.name });
}

/**
 * Re-checks as stored: the outcome of the last one that finished and when it ran (absent
 * before the first), and the latest attempt that did not finish (failed, cancelled or cut off
 * by a server stop), which changed nothing else: the certificate in force stays.
 */
const storedRecheckSchema = recheckOutcomeSchema
  .extend({ at: z.string() })
  .partial()
  .extend({ unfinished: z.object({ state: z.enum(['failed', 'cancelled', 'interrupted']), at: z.string() }).optional() });
export type StoredRecheck = z.infer<typeof storedRecheckSchema>;

/** The level column's text for a level (Deduction) or none (Assembly); levelOf reads it back. */
export const levelText = (level: PuzzleLevel | null): string | null => (level === null ? null : JSON.stringify(level));
/** Deduction: its locality level; null for Assembly. */
export const levelOf = (r: Row<'level'>) => parseColumn(puzzle.level, puzzleLevelSchema, r.id, r.level);
export const startersOf = (r: Row<'startersJson'>) => parseColumn(puzzle.startersJson, placedListSchema, r.id, r.startersJson);
export const givensOf = (r: Row<'givensJson'>) => parseColumn(puzzle.givensJson, placedListSchema, r.id, r.givensJson);
export const stepsOf = (r: Row<'stepsJson'>) => parseColumn(puzzle.stepsJson, stepListSchema, r.id, r.stepsJson);
/** The certificate of the latest finished proof (null before the first). */
export const certificateOf = (r: Row<'certificateJson'>) => parseColumn(puzzle.certificateJson, certificateSchema, r.id, r.certificateJson);
export const secondOf = (r: Row<'secondJson'>) => parseColumn(puzzle.secondJson, secondSolutionSchema, r.id, r.secondJson);
export const notesOf = (r: Row<'notesJson'>) => parseColumn(puzzle.notesJson, noteListSchema, r.id, r.notesJson);
/** The latest re-check and when it ran (null when none since the last change). */
export const lastRecheckOf = (r: Row<'recheckJson'>) => parseColumn(puzzle.recheckJson, storedRecheckSchema, r.id, r.recheckJson);
