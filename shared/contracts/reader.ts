import { z } from 'zod';
import { richTextDocSchema } from './editions';
import { solutionRuleSchema } from './publications';

// The reader edition: published puzzles played on the web by readers without accounts, the
// anonymous solve events they send, and the editor's solve statistics and grade calibration.
// Public shapes (everything under /api/reader/public) carry no setter, fee, proof, stock id or
// certificate: only what a reader of the printed page sees.

// ---- a publication's reader settings -----------------------------------------------------

/** The readable address part of a publication: lower-case words joined by hyphens. */
export const readerSlugSchema = z
  .string({ error: 'slug is required' })
  .min(1, 'slug must not be empty')
  .max(80, 'slug may be at most 80 characters')
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'slug may hold lower-case letters, digits and single hyphens between them');

/** Whether the runtime's time-zone database knows an IANA zone name (Intl throws RangeError otherwise). */
export function isKnownTimeZone(name: string): boolean {
  try {
    new Intl.DateTimeFormat('en', { timeZone: name });
    return true;
  } catch {
    return false;
  }
}

export const timeZoneSchema = z
  .string({ error: 'time zone is required' })
  .min(1)
  .max(64)
  .refine(isKnownTimeZone, 'time zone must be an IANA zone name such as Europe/London or America/New_York');

/** Wall-clock time of day 'HH:MM' (24 hours). */
export const releaseTimeSchema = z.string().regex(/^(?:[01]\d|2[0-3]):[0-5]\d$/, 'release time must be HH:MM (00:00 to 23:59)');

/** An origin a publisher's site is served from: scheme, host and port only (as URL.origin spells it). */
export const embedOriginSchema = z
  .string()
  .max(200)
  .refine((v) => {
    try {
      const u = new URL(v);
      return (u.protocol === 'https:' || u.protocol === 'http:') && u.origin === v;
    } catch {
      return false;
    }
  }, 'an allowed origin is scheme, host and optional port, e.g. https://www.example.com (no path, no trailing slash)');

export const readerSettingsInputSchema = z
  .object({
    slug: readerSlugSchema,
    timeZone: timeZoneSchema,
    releaseTime: releaseTimeSchema,
    embedOrigins: z.array(embedOriginSchema).max(20, 'at most 20 allowed origins'),
  })
  .strict();
export type ReaderSettingsInput = z.infer<typeof readerSettingsInputSchema>;

export const readerSettingsSchema = readerSettingsInputSchema.extend({
  publicationId: z.string(),
  publicationTitle: z.string(),
  solutionRule: solutionRuleSchema,
});
export type ReaderSettings = z.infer<typeof readerSettingsSchema>;
export const readerSettingsListSchema = z.object({ items: z.array(readerSettingsSchema) });
export type ReaderSettingsList = z.infer<typeof readerSettingsListSchema>;

// ---- what readers see --------------------------------------------------------------------

/** Where a public puzzle lives: /read/<slug>/<number>/<position>. */
export const publicPuzzleParamsSchema = z.object({
  slug: readerSlugSchema,
  number: z.coerce.number().int().min(0).max(1_000_000),
  position: z.coerce.number().int().min(1).max(1000),
});
export type PublicPuzzleParams = z.infer<typeof publicPuzzleParamsSchema>;
export const publicEditionParamsSchema = publicPuzzleParamsSchema.omit({ position: true });

const size = z.number().int().positive();
const coord = z.number().int().min(0);

/** Assembly: the frame and the pieces (sizes, largest first; a piece is named by its index here). */
export const assemblyPlaySchema = z.object({
  kind: z.literal('assembly'),
  frame: z.object({ W: size, H: size }),
  pieces: z.array(size),
  /** starter pieces: fixed at their place */
  starters: z.array(z.object({ piece: z.number().int().min(0), x: coord, y: coord })),
});
/** Deduction: the not-to-scale drawing (layout units) with the givens; a square is named by its index. */
export const deductionPlaySchema = z.object({
  kind: z.literal('deduction'),
  drawing: z.object({ W: z.number().positive(), H: z.number().positive(), rects: z.array(z.object({ x: z.number(), y: z.number(), w: z.number(), h: z.number() })) }),
  /** a label per square (A, B, ..., as in the printed step list) */
  labels: z.array(z.string()),
  givens: z.array(z.object({ square: z.number().int().min(0), size })),
  /** the frame's width and height when the puzzle prints them */
  frame: z.object({ W: size, H: size }).nullable(),
});
export const playSchema = z.discriminatedUnion('kind', [assemblyPlaySchema, deductionPlaySchema]);
export type AssemblyPlay = z.infer<typeof assemblyPlaySchema>;
export type DeductionPlay = z.infer<typeof deductionPlaySchema>;
export type Play = z.infer<typeof playSchema>;

export const publicPuzzleSummarySchema = z.object({
  position: z.number().int(),
  kind: z.enum(['assembly', 'deduction']),
  title: z.string(),
  /** the grade shown to readers (the editor's adjustment, else the engine's), 1..5 */
  grade: z.number().int().min(1).max(5),
  gradeNote: z.string().nullable(),
  /** 'W x H' of the frame (Assembly) or the number of squares (Deduction) */
  sizeText: z.string(),
  instructions: richTextDocSchema,
  path: z.string(),
});
export type PublicPuzzleSummary = z.infer<typeof publicPuzzleSummarySchema>;

export const publicEditionSchema = z.object({
  publication: z.object({ slug: z.string(), title: z.string(), publisher: z.string(), timeZone: z.string() }),
  number: z.number().int(),
  date: z.string(),
  releasedAt: z.string(),
  introduction: richTextDocSchema,
  solutionsPublic: z.boolean(),
  /** when the solutions become public, when that is known */
  solutionsFrom: z.string().nullable(),
  solutionRule: solutionRuleSchema,
  puzzles: z.array(publicPuzzleSummarySchema),
  path: z.string(),
});
export type PublicEdition = z.infer<typeof publicEditionSchema>;

export const publicPuzzleSchema = publicPuzzleSummarySchema.extend({
  edition: publicEditionSchema.pick({ publication: true, number: true, date: true, solutionsPublic: true, solutionsFrom: true, solutionRule: true, path: true }),
  play: playSchema,
  /** this puzzle's place in the edition: the previous and next puzzles' paths */
  previousPath: z.string().nullable(),
  nextPath: z.string().nullable(),
});
export type PublicPuzzle = z.infer<typeof publicPuzzleSchema>;

export const publicEditionListSchema = z.object({
  publication: publicEditionSchema.shape.publication,
  editions: z.array(z.object({ number: z.number().int(), date: z.string(), path: z.string(), puzzles: z.number().int() })),
});
export type PublicEditionList = z.infer<typeof publicEditionListSchema>;

// ---- checking and revealing --------------------------------------------------------------

const placement = z.object({ piece: z.number().int().min(0).max(2000), x: z.number().int().min(0).max(100_000), y: z.number().int().min(0).max(100_000) }).strict();
const entry = z.object({ square: z.number().int().min(0).max(2000), size: z.number().int().min(1).max(1_000_000_000) }).strict();

export const checkInputSchema = z.union([
  z.object({ placements: z.array(placement).max(2000) }).strict(),
  z.object({ entries: z.array(entry).max(2000) }).strict(),
]);
export type CheckInput = z.infer<typeof checkInputSchema>;

export const checkResultSchema = z.object({
  /** pieces (Assembly) or squares (Deduction) whose entry is wrong */
  wrong: z.array(z.number().int()),
  /** every piece placed (every square filled) and none wrong */
  solved: z.boolean(),
});
export type CheckResult = z.infer<typeof checkResultSchema>;

/** Assembly reveals may send the placements so far: the answer then follows the symmetry the reader is building in. */
export const revealInputSchema = z.union([
  z.object({ piece: z.number().int().min(0).max(2000), placements: z.array(placement).max(2000).optional() }).strict(),
  z.object({ square: z.number().int().min(0).max(2000) }).strict(),
  z.object({ all: z.literal(true), placements: z.array(placement).max(2000).optional() }).strict(),
]);
export type RevealInput = z.infer<typeof revealInputSchema>;

export const revealResultSchema = z.union([
  z.object({ placements: z.array(placement) }),
  z.object({ entries: z.array(entry) }),
]);
export type RevealResult = z.infer<typeof revealResultSchema>;

// ---- anonymous solve events --------------------------------------------------------------

export const solveEventKinds = ['started', 'checked', 'revealed', 'finished'] as const;
export const solveEventKindSchema = z.enum(solveEventKinds);
export type SolveEventKind = z.infer<typeof solveEventKindSchema>;

/** At most a week of play on one puzzle (longer is taken as a stale timer). */
export const MAX_PLAY_MS = 7 * 24 * 3600 * 1000;

export const solveEventInputSchema = z
  .object({
    /** a random id of this play, made in the reader's browser and kept only in its progress store */
    playId: z.uuid({ error: 'playId must be a UUID' }),
    kind: solveEventKindSchema,
    /** time played so far, pauses excluded */
    elapsedMs: z.number().int().min(0).max(MAX_PLAY_MS),
    /** checked: how many entries were wrong; revealed: how many squares or pieces were revealed (all: every one) */
    count: z.number().int().min(0).max(2000).optional(),
  })
  .strict();
export type SolveEventInput = z.infer<typeof solveEventInputSchema>;

// ---- the editor's views --------------------------------------------------------------------

export const timeSummarySchema = z.object({ q1: z.number(), median: z.number(), q3: z.number() }).nullable();
export type TimeSummary = z.infer<typeof timeSummarySchema>;

export const puzzleSolveStatsSchema = z.object({
  puzzleId: z.number().int(),
  title: z.string(),
  kind: z.enum(['assembly', 'deduction']),
  publicationTitle: z.string(),
  editionNumber: z.number().int(),
  editionDate: z.string(),
  position: z.number().int(),
  /** the public page (absent while the edition is not public) */
  path: z.string().nullable(),
  engineGrade: z.number().int(),
  shownGrade: z.number().int(),
  gradeNote: z.string().nullable(),
  starts: z.number().int(),
  finishes: z.number().int(),
  /** finished without revealing anything */
  solved: z.number().int(),
  /** solve times (ms) of the plays finished without a reveal: quartiles */
  timeMs: timeSummarySchema,
  /** share of started plays that revealed at least one square or piece */
  revealRate: z.number().nullable(),
  demoRecords: z.number().int(),
});
export type PuzzleSolveStats = z.infer<typeof puzzleSolveStatsSchema>;

export const gradeSolveStatsSchema = z.object({
  grade: z.number().int(),
  puzzles: z.number().int(),
  starts: z.number().int(),
  finishes: z.number().int(),
  solved: z.number().int(),
  timeMs: timeSummarySchema,
  revealRate: z.number().nullable(),
});
export type GradeSolveStats = z.infer<typeof gradeSolveStatsSchema>;

export const solveStatsSchema = z.object({
  puzzles: z.array(puzzleSolveStatsSchema),
  grades: z.array(gradeSolveStatsSchema),
  records: z.number().int(),
  demoRecords: z.number().int(),
});
export type SolveStats = z.infer<typeof solveStatsSchema>;

export const calibrationPointSchema = z.object({
  puzzleId: z.number().int(),
  title: z.string(),
  kind: z.enum(['assembly', 'deduction']),
  engineGrade: z.number().int(),
  shownGrade: z.number().int(),
  /** the median solve time of readers who finished without a reveal */
  medianMs: z.number(),
  solved: z.number().int(),
  /** the grade readers' time gives under the suggested boundaries */
  readersGrade: z.number().int(),
  /** the engine's score the grade is cut from (Deduction: points; Assembly: pieces) */
  score: z.number(),
  starters: z.number().int(),
});
export type CalibrationPoint = z.infer<typeof calibrationPointSchema>;

export const formulaChangeSchema = z.object({
  kind: z.enum(['assembly', 'deduction']),
  /** what the score is */
  score: z.string(),
  /** lowest score of grades 2, 3, 4 and 5 now, and as the readers' times suggest (null: no data to say) */
  current: z.array(z.number()),
  suggested: z.array(z.number().nullable()),
  puzzles: z.number().int(),
  /** puzzles whose grade would change */
  changed: z.number().int(),
  text: z.string(),
});
export type FormulaChange = z.infer<typeof formulaChangeSchema>;

export const calibrationSchema = z.object({
  /** a puzzle counts once this many readers solved it without a reveal */
  minSolved: z.number().int(),
  points: z.array(calibrationPointSchema),
  /** solve-time boundaries between grades 1|2, 2|3, 3|4, 4|5 (ms) that fit the engine's grades best; null where no data */
  boundariesMs: z.array(z.number().nullable()),
  /** per engine grade: puzzles and the median of their median times */
  byGrade: z.array(z.object({ grade: z.number().int(), puzzles: z.number().int(), medianMs: z.number().nullable() })),
  /** Spearman's rank correlation between engine grade and median time (null below 3 puzzles) */
  spearman: z.number().nullable(),
  /** puzzles whose readers' grade differs from the engine's */
  disagreements: z.number().int(),
  formula: z.array(formulaChangeSchema),
  demoRecords: z.number().int(),
});
export type Calibration = z.infer<typeof calibrationSchema>;

export const gradeAdjustInputSchema = z
  .object({
    /** the grade readers see; null returns to the engine's */
    grade: z.number().int().min(1, 'grade must be 1 to 5').max(5, 'grade must be 1 to 5').nullable(),
    note: z.string().trim().min(1, 'say why the grade changes').max(500, 'the note may be at most 500 characters'),
  })
  .strict();
export type GradeAdjustInput = z.infer<typeof gradeAdjustInputSchema>;

export const gradeAdjustmentSchema = z.object({
  puzzleId: z.number().int(),
  engineGrade: z.number().int(),
  shownGrade: z.number().int(),
  note: z.string().nullable(),
  adjustedAt: z.string().nullable(),
  adjustedByName: z.string().nullable(),
});
export type GradeAdjustment = z.infer<typeof gradeAdjustmentSchema>;

/** Paths of the public pages (server and clients build them the same way). */
export const readerPaths = {
  publication: (slug: string) => `/read/${slug}`,
  edition: (slug: string, number: number) => `/read/${slug}/${number}`,
  puzzle: (slug: string, number: number, position: number) => `/read/${slug}/${number}/${position}`,
  solution: (slug: string, number: number, position: number) => `/read/${slug}/${number}/${position}/solution`,
  embedEdition: (slug: string, number: number) => `/embed/${slug}/${number}`,
  embedPuzzle: (slug: string, number: number, position: number) => `/embed/${slug}/${number}/${position}`,
} as const;
