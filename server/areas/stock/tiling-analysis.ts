import {
  canonicalForm,
  classifyTiling,
  parseTiling,
  smithDiagram,
  tilingFromSquares,
  toBouwkamp,
  TilingInputError,
  type Tiling,
} from '../../../shared/tiling/index';
import type { SmithDiagram } from '../../../shared/tiling/index';
import type { ClassificationData, SmithDrawing, SquaresInput, TilingError } from '../../../shared/contracts/tilings';

// Reading a tiling from outside: decode and verify with the tiling engine, classify, and
// derive everything we store and show (canonical code and key, drawing data).

export interface TilingAnalysis {
  tiling: Tiling;
  canonical: Tiling;
  canonicalCode: string;
  canonicalKey: string;
  /** the canonical key of the tiling divided by the gcd of its sizes: equal for scaled copies */
  reducedKey: string;
  /** the gcd of all sizes (1 for a reduced tiling) */
  gcd: number;
  bouwkamp: string;
  classification: ClassificationData;
}

export type AnalysisResult = { ok: true; analysis: TilingAnalysis } | { ok: false; error: TilingError };

function toError(e: unknown): TilingError {
  if (e instanceof TilingInputError) {
    const where = e.where ? { ...e.where } : undefined;
    return where ? { code: e.code, message: e.message, where } : { code: e.code, message: e.message };
  }
  throw e;
}

/** The engine's classification in our contract's shape (sub-rectangles capped at 200). */
export function classificationOf(tiling: Tiling): ClassificationData {
  const c = classifyTiling(tiling);
  return {
    order: c.order,
    width: c.width,
    height: c.height,
    square: c.square,
    perfect: c.perfect,
    simple: c.simple,
    trivialCompound: c.trivialCompound,
    subRectangles: c.subRectangles.slice(0, 200),
    gcd: c.gcd,
    minSize: c.minSize,
    maxSize: c.maxSize,
  };
}

/**
 * The canonical orientation with the engine's canonical code and key, from the engine's one
 * canonicalisation (canonicalForm).
 */
export function canonicalFormOf(tiling: Tiling): { canonical: Tiling; canonicalCode: string; canonicalKey: string } {
  const { tiling: canonical, code, key } = canonicalForm(tiling);
  return { canonical, canonicalCode: code, canonicalKey: key };
}

function gcd2(a: number, b: number): number {
  while (b) [a, b] = [b, a % b];
  return a;
}

/**
 * The reduced form's key: the tiling divided by the gcd of all its sizes, canonicalised by
 * the engine. Two tilings that are scaled copies of each other (2x, 3x, ...) have the same
 * reduced key (issue 16: duplicates at scale); the canonical key stays the stock's unique key.
 */
export function reducedFormOf(canonical: Tiling, canonicalKey: string): { reducedKey: string; gcd: number } {
  const g = canonical.squares.reduce((a, q) => gcd2(a, q.s), 0);
  if (g <= 1) return { reducedKey: canonicalKey, gcd: 1 };
  const reduced: Tiling = { W: canonical.W / g, H: canonical.H / g, squares: canonical.squares.map((q) => ({ x: q.x / g, y: q.y / g, s: q.s / g })) };
  return { reducedKey: canonicalForm(reduced).key, gcd: g };
}

/** The gcd of the sizes in a canonical key ("WxH:a,b,..."). */
export function gcdOfKey(key: string): number {
  const sizes = key.slice(key.indexOf(':') + 1).split(',').map(Number);
  return sizes.reduce((a, s) => gcd2(a, s), 0) || 1;
}

/** Analyse a tiling that the engine already decoded and verified. */
export function analyseTiling(tiling: Tiling): TilingAnalysis {
  const form = canonicalFormOf(tiling);
  return {
    tiling,
    ...form,
    ...reducedFormOf(form.canonical, form.canonicalKey),
    bouwkamp: toBouwkamp(tiling, { header: true }),
    classification: classificationOf(tiling),
  };
}

/** Decode with the engine and analyse; a bad input gives the engine's precise error (what and where). */
function analyse(decode: () => Tiling): AnalysisResult {
  let tiling: Tiling;
  try {
    tiling = decode();
  } catch (e) {
    return { ok: false, error: toError(e) };
  }
  return { ok: true, analysis: analyseTiling(tiling) };
}

/** A Bouwkamp or table code. */
export const analyseCode = (code: string): AnalysisResult => analyse(() => parseTiling(code));

/** Squares given explicitly (the network sketch sends these). */
export const analyseSquares = (input: SquaresInput): AnalysisResult => analyse(() => tilingFromSquares(input));

/** The engine's horizontal Smith diagram as our drawing data (see SmithDrawing in the contract). */
export function toSmithDrawing(d: SmithDiagram): SmithDrawing {
  return {
    width: d.width,
    height: d.height,
    nodes: d.nodes.map((n) => ({ id: n.id, y: n.at, x0: n.start, x1: n.end })),
    edges: d.edges.map((e) => ({ square: e.square, from: e.from, to: e.to, x: e.line.x1, current: e.current })),
    pole: { top: d.pole.from, bottom: d.pole.to },
  };
}

/** Drawing data of the horizontal Smith diagram, or null when the engine cannot draw it (it never should for a verified tiling). */
export function smithDrawingOf(tiling: Tiling): SmithDrawing | null {
  try {
    return toSmithDrawing(smithDiagram(tiling, 'horizontal'));
  } catch (e) {
    if (e instanceof TilingInputError) return null;
    throw e;
  }
}
