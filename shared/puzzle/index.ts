// The puzzle engine's public entry. Pure TypeScript (no Node, DOM or framework imports):
// every input and output is plain JSON-able data, every search takes a budget, a
// cancellation callback and a progress callback, so it can run in a worker thread.

// ---- Assembly (the solver gets the frame and the pieces) --------------------------------
/** solveAssembly(input, options): exact search, verdict unique | multiple | none | undecided, classes up to the frame's symmetries. */
/** compareSolutions(a, b): turn b to match a best and list the squares that differ. */
/** frameImages(t): the images of a tiling under its frame's symmetries (4, or 8 for a square). */
export { solveAssembly, compareSolutions, frameImages } from './assembly';
export type { AssemblyInput, AssemblyOptions, AssemblyResult, AssemblyVerdict, SolutionDifference, StarterPiece } from './assembly';
/** findFewestStarters(tiling, options): the fewest starter pieces from the tiling that make its Assembly unique. */
export { findFewestStarters } from './assembly-starters';
export type { FewestStartersOptions, FewestStartersResult } from './assembly-starters';

// ---- Deduction (the solver sees the layout and a few sizes) ------------------------------
/** makeDeductionPuzzle(tiling, { level, showFrame, seed }): fewest givens for the level, steps, rank proof, grade. */
/** evaluateDeduction(tiling, givenSquares, { level, showFrame }): steps, rank proof, features and grade of a chosen set of givens. */
/** deductionBoard(tiling): the layout and true sizes the deduction modules work on (verifies the tiling). */
export { makeDeductionPuzzle, evaluateDeduction, deductionBoard } from './deduction-puzzle';
export type { DeductionPuzzle, DeductionGiven, DeductionRequest } from './deduction-puzzle';
/** chooseGivens(board, rules, options): seeded greedy removal with restarts, then bounded exact search. */
export { chooseGivens } from './deduction-givens';
export type { GivensChoice, GivensOptions } from './deduction-givens';
/** explainDeduction: synchronous rounds with the step list; isSolvable / knownAtFixedPoint: fast fixed point; squareLabel: A, B, ... AA. */
export { explainDeduction, isSolvable, knownAtFixedPoint, squareLabel } from './deduction-propagate';
export type { DeductionBoard, DeductionRules, DeductionRun, DeductionStep, StepTerm } from './deduction-propagate';
/** proveUniqueByRank: rank of the Kirchhoff system with the givens fixed (by the tiling engine's bareissRank) = unknowns; kirchhoffSystem: that system. */
export { proveUniqueByRank, kirchhoffSystem } from './deduction-rank';
export type { LinearSystem, UniquenessProof } from './deduction-rank';
/** gradeFromFeatures (1..5, formula in docs/decisions/020) and gradePoints (its points before the cut), gradeFeatures, levelNeeded; levelValue / levelName convert 'closure' <-> Infinity. */
export { gradeFromFeatures, gradePoints, gradeFeatures, levelNeeded, levelValue, levelName } from './deduction-grade';
export type { GradeFeatures, Level } from './deduction-grade';
/** WeightedUnionFind: knowledge of segment coordinates as relative offsets. */
export { WeightedUnionFind } from './deduction-knowledge';

// ---- Layout and the not-to-scale drawing -------------------------------------------------
/** layoutGraph / tilingLayout: maximal segments in both directions and each cell's four sides. */
export { layoutGraph, tilingLayout } from './layout-graph';
export type { LayoutGraph, LayoutRect, LayoutSegment } from './layout-graph';
/** notToScaleLayout(tiling, box): monotone even remap of the coordinates; notToScaleRects: the same as { W, H, rects } for print; sameSmithDiagram(tiling, drawing): the check. */
export { notToScaleLayout, notToScaleRects, sameSmithDiagram } from './not-to-scale';
export type { NotToScaleBox, NotToScaleDrawing, NotToScaleRects } from './not-to-scale';

// ---- Certificates ---------------------------------------------------------------------
/** certify(input, options): run the engine and issue a certificate; recheckCertificate: recompute and compare; isCertificateCurrent: engine version matches. */
export { certify, recheckCertificate, isCertificateCurrent, inputHash, normaliseCertificateInput, PUZZLE_ENGINE_VERSION } from './certificate';
export type { Certificate, CertificateInput, CertificateVerdict, AssemblyCertificateInput, DeductionCertificateInput, CertifyOptions, Certified, Recheck } from './certificate';
/** sha256Hex(text): SHA-256 of the UTF-8 text, lower-case hex; canonicalJson(value): sorted-key JSON. */
export { sha256Hex } from './sha256';
export { canonicalJson } from './canonical-json';

// ---- Command line ----------------------------------------------------------------------
/** parseFrameArg / parsePiecesArg / parseStartersArg / parseLevelArg: the CLI arguments; assembleAnswer / deduceAnswer: the documented JSON answers. */
export { parseFrameArg, parsePiecesArg, parseStartersArg, parseLevelArg, assembleAnswer, deduceAnswer } from './cli-format';
export type { AssembleAnswer, DeduceAnswer } from './cli-format';

// ---- Plumbing -------------------------------------------------------------------------
/** PuzzleInputError: bad input, with a stable code and the field at fault. */
export { PuzzleInputError } from './errors';
/** Budgets and cancellation for searches; mulberry32 / shuffled: seeded randomness. */
export type { SearchBudget, SearchControl, StopReason } from './search-control';
export { mulberry32, shuffled } from '../tiling/index';
