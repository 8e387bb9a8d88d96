import { z } from 'zod';
import { richTextDocSchema } from '../../../shared/contracts/editions';
import type { PreflightReport } from '../../../shared/contracts/preflight';
import { pressSettingsSchema } from '../../../shared/contracts/press';
import { pageTemplateSchema } from '../../../shared/contracts/templates';

// Plain data handed to the print layout. The editions service builds it from the
// database; the renderer knows nothing about storage. The print document is stored with
// every proof (edition_proof.document_json) and the press file is rendered from it, so its
// shape is a schema: the stored copy is parsed through editionDocumentSchema, never cast.

const placedSquareSchema = z.object({ x: z.number(), y: z.number(), s: z.number() });
export type PlacedSquare = z.infer<typeof placedSquareSchema>;

export const solvedTilingSchema = z.object({ W: z.number(), H: z.number(), squares: z.array(placedSquareSchema) });
export type SolvedTiling = z.infer<typeof solvedTilingSchema>;

/** A not-to-scale layout rectangle of a Deduction puzzle (layout units, y downward). */
const layoutRectSchema = z.object({ x: z.number(), y: z.number(), w: z.number(), h: z.number() });
export type LayoutRect = z.infer<typeof layoutRectSchema>;

/** What every printed puzzle carries, whatever its kind. */
const puzzlePrintBase = z.object({
  slot: z.number().int(),
  title: z.string(),
  instructions: richTextDocSchema,
  grade: z.number().int(),
});

const assemblyPrintSchema = puzzlePrintBase.extend({
  kind: z.literal('assembly'),
  frame: z.object({ W: z.number(), H: z.number() }),
  /** The sizes the solver must place (starter pieces included or not: all pieces). */
  pieces: z.array(z.number()),
  starters: z.array(z.object({ size: z.number(), x: z.number(), y: z.number() })),
});
export type AssemblyPrint = z.infer<typeof assemblyPrintSchema>;

const deductionPrintSchema = puzzlePrintBase.extend({
  kind: z.literal('deduction'),
  layout: z.object({ W: z.number(), H: z.number(), rects: z.array(layoutRectSchema) }),
  /** Sizes shown on the page: rect index into layout.rects and its size. */
  givens: z.array(z.object({ rect: z.number().int(), size: z.number() })),
});
export type DeductionPrint = z.infer<typeof deductionPrintSchema>;

const puzzlePrintSchema = z.discriminatedUnion('kind', [assemblyPrintSchema, deductionPrintSchema]);
export type PuzzlePrint = z.infer<typeof puzzlePrintSchema>;

const solutionPrintSchema = z.object({
  /** The slot the puzzle had (in this or the previous edition). */
  slot: z.number().int(),
  /** Where the puzzle appeared, e.g. "No. 41, puzzle 2" when it was the previous edition. */
  caption: z.string().optional(),
  kind: z.enum(['assembly', 'deduction']),
  tiling: solvedTilingSchema,
  steps: z.array(z.string()).optional(),
});
export type SolutionPrint = z.infer<typeof solutionPrintSchema>;

/** Everything one edition prints: what the layout draws and what a proof stores. */
export const editionDocumentSchema = z.object({
  publicationTitle: z.string(),
  editionNumber: z.number().int(),
  /** ISO date, yyyy-mm-dd. */
  editionDate: z.string(),
  template: pageTemplateSchema,
  /** the publication's press spec in force when the proof was made (documents stored before PDF/X have none: the template's defaults apply) */
  press: pressSettingsSchema.optional(),
  introduction: richTextDocSchema,
  puzzles: z.array(puzzlePrintSchema),
  solutions: z.array(solutionPrintSchema),
});
export type EditionDocument = z.infer<typeof editionDocumentSchema>;

export type PreflightWarning = PreflightReport['warnings'][number];

/** The preflight report of one PDF (the API's PreflightReport, shared/contracts/preflight.ts). */
export type Preflight = PreflightReport;

export type RenderResult = { pdf: Buffer; pages: number; preflight: Preflight };
