import { readingOrder } from '../tiling/index';
import type { Tiling } from '../tiling/index';
import { solveAssembly } from './assembly';
import type { AssemblyOptions, AssemblyResult, StarterPiece } from './assembly';
import { canonicalJson } from './canonical-json';
import { evaluateDeduction } from './deduction-puzzle';
import type { DeductionPuzzle } from './deduction-puzzle';
import { PuzzleInputError } from './errors';
import { sha256Hex } from './sha256';

/**
 * The version of the puzzle engine's verdicts. Bump it whenever a change could alter a
 * verdict or a count; certificates of another version are no longer current and their
 * puzzles must be re-checked before they go into an edition.
 */
export const PUZZLE_ENGINE_VERSION = 'puzzle-engine/1';

export interface AssemblyCertificateInput {
  kind: 'assembly';
  width: number;
  height: number;
  pieces: number[];
  starters?: StarterPiece[];
}

export interface DeductionCertificateInput {
  kind: 'deduction';
  tiling: Tiling;
  /** the printed sizes, by position */
  givens: { x: number; y: number; size: number }[];
  /** locality level, or 'closure' for the full closure */
  level: number | 'closure';
  showFrame: boolean;
}

export type CertificateInput = AssemblyCertificateInput | DeductionCertificateInput;

/** Assembly: the solver's verdict. Deduction: 'unique' (solves at the level, rank proof), 'stuck' (unique by rank, but the level does not reach every size), 'not-unique'. */
export type CertificateVerdict = AssemblyResult['verdict'] | 'stuck' | 'not-unique';

export interface Certificate {
  kind: 'assembly' | 'deduction';
  verdict: CertificateVerdict;
  /** SHA-256 (hex) of the canonical JSON of the normalised input */
  inputHash: string;
  engineVersion: string;
  checks: string[];
  counts: { classes: number; rawSolutions?: number; rank?: number; unknowns?: number };
  nodes: number;
  ms: number;
  /** ISO 8601 */
  createdAt: string;
}

export interface CertifyOptions {
  /** hash of a text as lower-case hex SHA-256 (default: the pure TS one; the server may pass node's) */
  hash?: (text: string) => string;
  /** clock for createdAt (default: now) */
  createdAt?: () => Date;
  /** budget, cancellation and progress for the assembly search */
  assembly?: AssemblyOptions;
}

/** The input in a canonical form: pieces descending, starters and givens in reading order, squares in reading order. */
export function normaliseCertificateInput(input: CertificateInput): CertificateInput {
  const byPlace = <T extends { x: number; y: number }>(a: T, b: T) => a.y - b.y || a.x - b.x;
  if (input.kind === 'assembly') {
    const out: AssemblyCertificateInput = { kind: 'assembly', width: input.width, height: input.height, pieces: [...input.pieces].sort((a, b) => b - a) };
    if (input.starters && input.starters.length > 0) out.starters = input.starters.map((s) => ({ size: s.size, x: s.x, y: s.y })).sort(byPlace);
    return out;
  }
  if (input.kind === 'deduction') {
    return {
      kind: 'deduction',
      tiling: { W: input.tiling.W, H: input.tiling.H, squares: readingOrder(input.tiling.squares).map((q) => ({ x: q.x, y: q.y, s: q.s })) },
      givens: input.givens.map((g) => ({ x: g.x, y: g.y, size: g.size })).sort(byPlace),
      level: input.level,
      showFrame: input.showFrame,
    };
  }
  throw new PuzzleInputError('bad-certificate-input', `unknown certificate kind ${String((input as { kind?: unknown }).kind)}`, { field: 'kind' });
}

export function inputHash(input: CertificateInput, hash: (text: string) => string = sha256Hex): string {
  return hash(canonicalJson(normaliseCertificateInput(input)));
}

function deductionGivenIndexes(input: DeductionCertificateInput): number[] {
  return input.givens.map((g, i) => {
    const at = input.tiling.squares.findIndex((q) => q.x === g.x && q.y === g.y && q.s === g.size);
    if (at < 0) throw new PuzzleInputError('bad-given', `given ${i + 1} (size ${g.size} at ${g.x},${g.y}) is not a square of the tiling`, { field: 'givens', index: i });
    return at;
  });
}

export type Certified =
  | { kind: 'assembly'; result: AssemblyResult; certificate: Certificate }
  | { kind: 'deduction'; result: Omit<DeductionPuzzle, 'minimal'>; certificate: Certificate };

/** Run the engine on the input and issue its certificate. */
export function certify(input: CertificateInput, options: CertifyOptions = {}): Certified {
  const norm = normaliseCertificateInput(input);
  const hash = inputHash(norm, options.hash);
  const createdAt = (options.createdAt?.() ?? new Date()).toISOString();
  if (norm.kind === 'assembly') {
    const result = solveAssembly({ width: norm.width, height: norm.height, pieces: norm.pieces, ...(norm.starters ? { starters: norm.starters } : {}) }, options.assembly);
    const counts: Certificate['counts'] = { classes: result.classes };
    if (result.rawSolutions !== null) counts.rawSolutions = result.rawSolutions;
    const checks = [...result.checks];
    if (result.reason) checks.push(`reason: ${result.reason}`);
    return { kind: 'assembly', result, certificate: { kind: 'assembly', verdict: result.verdict, inputHash: hash, engineVersion: PUZZLE_ENGINE_VERSION, checks, counts, nodes: result.nodes, ms: result.ms, createdAt } };
  }
  const d = norm as DeductionCertificateInput;
  const now = (globalThis as { performance?: { now(): number } }).performance;
  const t0 = now?.now() ?? Date.now();
  const result = evaluateDeduction(d.tiling, deductionGivenIndexes(d), { level: d.level, showFrame: d.showFrame });
  const ms = (now?.now() ?? Date.now()) - t0;
  const verdict: CertificateVerdict = !result.proof.unique ? 'not-unique' : result.solved ? 'unique' : 'stuck';
  const checks = [
    `propagation at level ${d.level} in synchronous rounds (${result.features.rounds} rounds, ${result.steps.length} steps, every value checked against the true size)`,
    `rank of the Kirchhoff system with the givens fixed, exact (BigInt Bareiss): ${result.proof.rank} of ${result.proof.unknowns} unknowns`,
  ];
  return {
    kind: 'deduction',
    result,
    certificate: {
      kind: 'deduction', verdict, inputHash: hash, engineVersion: PUZZLE_ENGINE_VERSION, checks,
      counts: { classes: result.proof.unique ? 1 : 0, rank: result.proof.rank, unknowns: result.proof.unknowns },
      nodes: result.steps.length, ms, createdAt,
    },
  };
}

/** Was the certificate issued by this version of the engine? A puzzle whose certificate is not current cannot go into an edition. */
export function isCertificateCurrent(cert: Pick<Certificate, 'engineVersion'>): boolean {
  return cert.engineVersion === PUZZLE_ENGINE_VERSION;
}

export interface Recheck {
  holds: boolean;
  /** why it does not hold (empty when it holds) */
  reasons: string[];
  /** the certificate the recomputation issued */
  fresh: Certificate;
}

/**
 * Re-check a certificate by recomputation: the input must hash to the same value, and the
 * engine must reach the same verdict and counts; a certificate from another engine version
 * does not hold (recompute and store the fresh one instead).
 */
export function recheckCertificate(cert: Certificate, input: CertificateInput, options: CertifyOptions = {}): Recheck {
  const { certificate: fresh } = certify(input, options);
  const reasons: string[] = [];
  if (cert.kind !== fresh.kind) reasons.push(`the certificate is for ${cert.kind}, the input is ${fresh.kind}`);
  if (cert.inputHash !== fresh.inputHash) reasons.push('the input does not match the certificate (hash differs)');
  if (!isCertificateCurrent(cert)) reasons.push(`issued by engine ${cert.engineVersion}, current is ${PUZZLE_ENGINE_VERSION}`);
  if (cert.verdict !== fresh.verdict) reasons.push(`verdict was ${cert.verdict}, recomputed ${fresh.verdict}`);
  if (fresh.verdict === 'undecided') reasons.push('the recomputation did not finish within its budget');
  for (const k of ['classes', 'rawSolutions', 'rank', 'unknowns'] as const) {
    if (cert.counts[k] !== undefined && fresh.counts[k] !== undefined && cert.counts[k] !== fresh.counts[k]) reasons.push(`${k} was ${cert.counts[k]}, recomputed ${fresh.counts[k]}`);
  }
  return { holds: reasons.length === 0, reasons, fresh };
}
