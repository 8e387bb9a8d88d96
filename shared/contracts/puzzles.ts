import { z } from 'zod';
import { isoDateTimeSchema, pageOf, pageQuerySchema } from './common';

// Puzzles: Assembly and Deduction puzzles made from stock tilings, proved unique in the
// worker pool and stored with their certificate.

export const puzzleKindSchema = z.enum(['assembly', 'deduction']);
export type PuzzleKind = z.infer<typeof puzzleKindSchema>;

/** Deduction locality level k (the longest chain a step may use), or 'closure'. */
export const puzzleLevelSchema = z.union([z.number().int().min(1).max(12), z.literal('closure')]);
export type PuzzleLevel = z.infer<typeof puzzleLevelSchema>;

/**
 * Status of a puzzle: `proving` while its job runs; otherwise the verdict of its latest proof
 * (`unique` is the only printable one), or `failed` / `cancelled` when the job did not finish.
 */
export const puzzleStatusSchema = z.enum(['proving', 'unique', 'multiple', 'none', 'undecided', 'stuck', 'not-unique', 'failed', 'cancelled']);
export type PuzzleStatus = z.infer<typeof puzzleStatusSchema>;

const coord = z.number().int().min(0).max(100_000);
/** A square of the tiling, named by its top-left corner (the stock tiling's canonical orientation). */
export const squareRefSchema = z.object({ x: coord, y: coord }).strict();
export type SquareRef = z.infer<typeof squareRefSchema>;

export const placedSizeSchema = z.object({ x: coord, y: coord, size: z.number().int().positive() });
export type PlacedSize = z.infer<typeof placedSizeSchema>;

const refList = z.array(squareRefSchema).max(200);

export const puzzleCreateSchema = z
  .object({
    stockId: z.number().int().positive(),
    kind: puzzleKindSchema,
    /** Deduction: locality level (default: chosen from the grade wished, else 3) */
    level: puzzleLevelSchema.optional(),
    /** Deduction: the grade wished (1..5); the engine picks the level whose grade comes closest */
    grade: z.number().int().min(1).max(5).optional(),
    /** Deduction: print the frame's width and height (default false) */
    showFrame: z.boolean().optional(),
    /** Assembly: starter pieces chosen by the editor (default: the engine finds the fewest) */
    starters: refList.optional(),
    /** Deduction: givens chosen by the editor (default: the engine chooses them for the level) */
    givens: refList.optional(),
    /** seed of the givens search (default 1) */
    seed: z.number().int().min(0).max(2 ** 31 - 1).optional(),
  })
  .strict()
  .superRefine((v, ctx) => {
    if (v.kind === 'assembly' && v.givens !== undefined) ctx.addIssue({ code: 'custom', path: ['givens'], message: 'an Assembly puzzle has starter pieces, not givens' });
    if (v.kind === 'assembly' && (v.level !== undefined || v.grade !== undefined || v.showFrame !== undefined)) ctx.addIssue({ code: 'custom', path: ['level'], message: 'level, grade and showFrame are for Deduction puzzles' });
    if (v.kind === 'deduction' && v.starters !== undefined) ctx.addIssue({ code: 'custom', path: ['starters'], message: 'a Deduction puzzle has givens, not starter pieces' });
  });
export type PuzzleCreate = z.infer<typeof puzzleCreateSchema>;

export const puzzlePatchSchema = z
  .object({
    starters: refList.optional(),
    givens: refList.optional(),
    level: puzzleLevelSchema.optional(),
    showFrame: z.boolean().optional(),
    /** let the engine propose the starter pieces / givens again (for the level, if given) */
    propose: z.literal(true).optional(),
  })
  .strict()
  .refine((v) => Object.keys(v).length > 0, { message: 'send at least one of starters, givens, level, showFrame, propose' })
  .refine((v) => !(v.propose && (v.starters !== undefined || v.givens !== undefined)), { path: ['propose'], message: 'propose lets the engine choose: send no starters or givens with it' });
export type PuzzlePatch = z.infer<typeof puzzlePatchSchema>;

export const puzzleCertificateSchema = z.object({
  kind: puzzleKindSchema,
  verdict: z.string(),
  inputHash: z.string(),
  engineVersion: z.string(),
  checks: z.array(z.string()),
  counts: z.object({ classes: z.number().int(), rawSolutions: z.number().int().optional(), rank: z.number().int().optional(), unknowns: z.number().int().optional() }),
  nodes: z.number(),
  ms: z.number(),
  createdAt: z.string(),
});
export type PuzzleCertificate = z.infer<typeof puzzleCertificateSchema>;

const squareSchema = z.object({ x: z.number(), y: z.number(), s: z.number() });
export const puzzleTilingSchema = z.object({ W: z.number().int(), H: z.number().int(), squares: z.array(squareSchema) });

export const puzzleJobSchema = z.object({
  id: z.string(),
  state: z.enum(['queued', 'running', 'done', 'cancelled', 'failed', 'interrupted']),
  phase: z.string().nullable(),
  done: z.number().nullable(),
  total: z.number().nullable(),
  elapsedMs: z.number().nullable(),
  error: z.string().nullable(),
});
export type PuzzleJob = z.infer<typeof puzzleJobSchema>;

export const puzzleStepSchema = z.object({ square: z.number().int(), label: z.string(), round: z.number().int(), value: z.number(), text: z.string() });
export type PuzzleStep = z.infer<typeof puzzleStepSchema>;

export const puzzleUseSchema = z.object({ editionId: z.string(), publicationTitle: z.string(), number: z.number().int(), editionDate: z.string(), state: z.string() });

export const puzzleSummarySchema = z.object({
  id: z.number().int(),
  kind: puzzleKindSchema,
  title: z.string(),
  status: puzzleStatusSchema,
  grade: z.number().int().nullable(),
  level: puzzleLevelSchema.nullable(),
  stockId: z.number().int(),
  tilingKey: z.string(),
  order: z.number().int(),
  width: z.number().int(),
  height: z.number().int(),
  /** verdict unique, by the engine version in use, for the puzzle as it is now */
  certificateCurrent: z.boolean(),
  usedIn: z.array(puzzleUseSchema),
  createdAt: isoDateTimeSchema,
  updatedAt: isoDateTimeSchema,
});
export type PuzzleSummary = z.infer<typeof puzzleSummarySchema>;

export const puzzleDetailSchema = puzzleSummarySchema.extend({
  showFrame: z.boolean(),
  tiling: puzzleTilingSchema,
  starters: z.array(placedSizeSchema),
  givens: z.array(placedSizeSchema),
  steps: z.array(puzzleStepSchema),
  certificate: puzzleCertificateSchema.nullable(),
  /** why the certificate is not current (empty when it is) */
  staleReasons: z.array(z.string()),
  /** Assembly with several solutions: a second one and the squares (indexes into it) that differ */
  second: z.object({ tiling: puzzleTilingSchema, differ: z.array(z.number().int()) }).nullable(),
  /** what the engine said beyond the verdict (fewest starters proved, minimal givens, ...) */
  notes: z.array(z.string()),
  lastRecheck: z.object({ holds: z.boolean(), reasons: z.array(z.string()), at: z.string() }).nullable(),
  /** the latest re-check that did not finish (it changed nothing: the certificate in force stays) */
  lastUnfinishedRecheck: z.object({ state: z.enum(['failed', 'cancelled', 'interrupted']), at: z.string() }).nullable().optional(),
  job: puzzleJobSchema.nullable(),
});
export type PuzzleDetail = z.infer<typeof puzzleDetailSchema>;

export const puzzleStartedSchema = z.object({ id: z.number().int(), jobId: z.string() });
export type PuzzleStarted = z.infer<typeof puzzleStartedSchema>;

const boolQuery = z.enum(['true', 'false']).transform((v) => v === 'true');

export const puzzleSortKeys = ['createdAt', 'updatedAt', 'grade', 'order', 'id'] as const;
export const puzzleListQuerySchema = z
  .object({
    ...pageQuerySchema.shape,
    kind: puzzleKindSchema.optional(),
    status: puzzleStatusSchema.optional(),
    grade: z.coerce.number().int().min(1).max(5).optional(),
    stockId: z.coerce.number().int().positive().optional(),
    printable: boolQuery.optional(),
    /** column, '-' in front for descending (default: newest first) */
    sort: z
      .enum([...puzzleSortKeys, ...puzzleSortKeys.map((k) => `-${k}` as const)])
      .default('-createdAt')
      .transform((v) => ({ key: v.replace(/^-/, '') as (typeof puzzleSortKeys)[number], desc: v.startsWith('-') })),
  })
  .strict();
export type PuzzleListQuery = z.infer<typeof puzzleListQuerySchema>;

export const puzzleListSchema = pageOf(puzzleSummarySchema);
export type PuzzleList = z.infer<typeof puzzleListSchema>;
