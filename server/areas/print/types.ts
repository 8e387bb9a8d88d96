import type { RichTextDoc } from '../../../shared/contracts/editions';
import type { PageTemplate } from '../../../shared/contracts/templates';

// Plain data handed to the print layout. The editions service builds it from the
// database; the renderer knows nothing about storage.

export type PlacedSquare = { x: number; y: number; s: number };
export type SolvedTiling = { W: number; H: number; squares: PlacedSquare[] };

/** A not-to-scale layout rectangle of a Deduction puzzle (layout units, y downward). */
export type LayoutRect = { x: number; y: number; w: number; h: number };

export type AssemblyPrint = {
  slot: number;
  kind: 'assembly';
  title: string;
  instructions: RichTextDoc;
  grade: number;
  frame: { W: number; H: number };
  /** The sizes the solver must place (starter pieces included or not: all pieces). */
  pieces: number[];
  starters: { size: number; x: number; y: number }[];
};

export type DeductionPrint = {
  slot: number;
  kind: 'deduction';
  title: string;
  instructions: RichTextDoc;
  grade: number;
  layout: { W: number; H: number; rects: LayoutRect[] };
  /** Sizes shown on the page: rect index into layout.rects and its size. */
  givens: { rect: number; size: number }[];
};

export type PuzzlePrint = AssemblyPrint | DeductionPrint;

export type SolutionPrint = {
  /** The slot the puzzle had (in this or the previous edition). */
  slot: number;
  /** Where the puzzle appeared, e.g. "No. 41, puzzle 2" when it was the previous edition. */
  caption?: string | undefined;
  kind: 'assembly' | 'deduction';
  tiling: SolvedTiling;
  steps?: string[] | undefined;
};

export type EditionDocument = {
  publicationTitle: string;
  editionNumber: number;
  /** ISO date, yyyy-mm-dd. */
  editionDate: string;
  template: PageTemplate;
  introduction: RichTextDoc;
  puzzles: PuzzlePrint[];
  solutions: SolutionPrint[];
};

export type PreflightWarning = { code: string; message: string };

export type Preflight = {
  ok: boolean;
  templateId: string;
  pages: number;
  trimMm: { width: number; height: number };
  bleedMm: number;
  pageSizePt: { width: number; height: number };
  /** Font families registered for print. */
  fontsRegistered: string[];
  /** Embedded TrueType font programs found in the produced file (/FontFile2). */
  embeddedFontFiles: number;
  fontsEmbedded: boolean;
  smallestSquareMm: number | null;
  smallestDigitPt: number | null;
  /** Size labels left out because they could not be printed legibly. */
  omittedLabels: { slot: number; where: 'puzzle' | 'solution'; size: number }[];
  warnings: PreflightWarning[];
};

export type RenderResult = { pdf: Buffer; pages: number; preflight: Preflight };
