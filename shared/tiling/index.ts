// The tiling engine's public API (the contract other areas code against).
// Entry points for outside data (parseTiling, tilingFromSquares, verifyTiling, checkKirchhoff,
// solvePlaneNetwork, planeGraphFromDrawing) validate everything; the others (classify,
// canonical forms, orientations, Smith diagrams, codes) expect a verified tiling.
export type {
  Square,
  Tiling,
  PlaneGraph,
  Rect,
  Classification,
  Direction,
  SmithNode,
  SmithEdge,
  SmithDiagram,
  KirchhoffViolation,
  VerifyResult,
  SolveResult,
} from './types';
export { TilingInputError } from './errors';
export type { InputLocation } from './errors';
export { parseTiling, tilingFromSquares, readCode, decodeSizes, MAX_INPUT_LENGTH } from './parse';
export { verifyTiling, MAX_SIDE, MAX_SQUARES } from './verify';
export { classifyTiling, isSimple, subRectangles, reduceTiling } from './classify';
export { canonicalForm, canonicalTiling, canonicalCode, canonicalKey, orientations, readingOrder } from './orientations';
export type { CanonicalTilingForm } from './orientations';
export { toBouwkamp, toTableCode } from './bouwkamp';
export { solvePlaneNetwork } from './solve-network';
export { bareissDeterminant, bareissRank, bareissSolve, bareissSolveNumber } from './bareiss';
export { smithDiagram } from './smith-diagram';
export { checkKirchhoff } from './kirchhoff';
export { countSpanningTrees, tilingSpanningTrees } from './spanning-trees';
export { planeGraphFromDrawing } from './drawing';
export { analysePlaneGraph, dartArrays, dualOf, edgeCount, edgesOf, facesOf, splitFace, wheel } from './plane-graph';
export { randomCNet } from './random-network';
export { mulberry32, randomInt, shuffled } from './prng';
export { sparseSymmetricDeterminant } from './modular-determinant';
export { acceptCode, tilingFacts } from './tiling-facts';
export type { TilingFacts } from './tiling-facts';
