import { createHash } from 'node:crypto';
import { z } from 'zod';
import { placedSizeSchema, puzzleCertificateSchema, puzzleKindSchema, puzzleLevelSchema, puzzleStepSchema, puzzleTilingSchema, type PlacedSize, type PuzzleLevel } from '../../../shared/contracts/puzzles';
import { tilingSchema } from '../../../shared/contracts/tilings';
import { certify, findFewestStarters, makeDeductionPuzzle, recheckCertificate } from '../../../shared/puzzle/index';
import type { CertificateInput, CertificateVerdict, CertifyOptions, SearchControl } from '../../../shared/puzzle/index';

// The puzzle rules and the proof procedure, used by the puzzle service, the proof job
// (./prove-job.ts, in the worker pool) and the demo seeder. Three tasks:
// - make:    the engine proposes (Assembly: the fewest starter pieces when the bare set is not
//            unique; Deduction: givens for the level, or the level whose grade comes closest
//            to the grade wished) and certifies the result;
// - prove:   certify the starters / givens the editor chose;
// - recheck: recompute a stored certificate and compare.
// The SHA-256 of the certificate input is node's (node:crypto), injected into the engine.

export const PUZZLE_JOB_KIND = 'puzzle-prove';

/** Deduction levels tried when a grade is wished and no level given (our choice: 1..4, then the closure). */
const GRADE_LEVELS: PuzzleLevel[] = [1, 2, 3, 4, 'closure'];
/** Default Deduction level when neither a level nor a grade is given (our choice). */
export const DEFAULT_LEVEL = 3;
/** Time for one Assembly search inside a job [common practice: bound every search]. */
const ASSEMBLY_MS = 60_000;

export const nodeSha256 = (text: string): string => createHash('sha256').update(text, 'utf8').digest('hex');

// ---- the job's params, input and summary, and the stored shapes they share ----------------
// Each is a zod schema and its type is derived from it: the worker parses the input, the
// puzzle service parses the summary before it stores anything, and the puzzle table's JSON
// columns (./stored.ts) are read back through the same schemas the summary was checked with.

export const puzzleJobParamsSchema = z.object({ puzzleId: z.number().int().positive(), revision: z.number().int().min(1), task: z.enum(['make', 'prove', 'recheck']) });
export type PuzzleJobParams = z.infer<typeof puzzleJobParamsSchema>;

/** A starter piece or a given: a square of the tiling (top-left corner) and its size. */
export const placedListSchema = z.array(placedSizeSchema);
export type Placed = PlacedSize;

/** The verdicts the engine gives (shared/puzzle CertificateVerdict; the compiler keeps the two alike). */
const certificateVerdicts = ['unique', 'multiple', 'none', 'undecided', 'stuck', 'not-unique'] as const satisfies readonly CertificateVerdict[];

/** A certificate as the engine issues it: the API's certificate with the engine's verdicts. */
export const certificateSchema = puzzleCertificateSchema.extend({ verdict: z.enum(certificateVerdicts) });

/** The grade of a puzzle, 1..5 (Assembly: decision 070; Deduction: shared/puzzle/deduction-grade.ts). */
export const gradeSchema = z.number().int().min(1).max(5);

/** Assembly with several solutions: a second one and the squares (indexes into it) that differ. */
export const secondSolutionSchema = z.object({ tiling: puzzleTilingSchema, differ: z.array(z.number().int().nonnegative()) });

export const stepListSchema = z.array(puzzleStepSchema);
export const noteListSchema = z.array(z.string());

/** A re-check's outcome: does the stored certificate hold when recomputed, and if not, why. */
export const recheckOutcomeSchema = z.object({ holds: z.boolean(), reasons: z.array(z.string()) });

export const puzzleJobInputSchema = z.object({
  kind: puzzleKindSchema,
  tiling: tilingSchema,
  level: puzzleLevelSchema.nullable(),
  showFrame: z.boolean(),
  /** null: the engine chooses */
  starters: placedListSchema.nullable(),
  givens: placedListSchema.nullable(),
  /** the grade wished (Deduction without a level) */
  grade: gradeSchema.nullable(),
  seed: z.number().int().min(0),
  /** recheck: the stored certificate */
  certificate: certificateSchema.nullable().optional(),
});
export type PuzzleJobInput = z.infer<typeof puzzleJobInputSchema>;

export const puzzleJobSummarySchema = z.object({
  revision: z.number().int().min(1),
  task: puzzleJobParamsSchema.shape.task,
  certificate: certificateSchema,
  starters: placedListSchema,
  givens: placedListSchema,
  level: puzzleLevelSchema.nullable(),
  steps: stepListSchema,
  grade: gradeSchema.nullable(),
  second: secondSolutionSchema.nullable(),
  notes: noteListSchema,
  recheck: recheckOutcomeSchema.optional(),
});
export type PuzzleJobSummary = z.infer<typeof puzzleJobSummarySchema>;

export interface ProveControl {
  shouldStop?: () => boolean;
  progress?: (phase: string, done: number) => void;
  now?: () => Date;
}

/**
 * Our Assembly grade (decision 070): by the number of pieces, one easier for every two
 * starter pieces printed; 1..5.
 */
export function assemblyGrade(order: number, starters: number): number {
  const base = order <= 11 ? 1 : order <= 14 ? 2 : order <= 18 ? 3 : order <= 22 ? 4 : 5;
  return Math.max(1, Math.min(5, base - Math.floor(starters / 2)));
}

function levelArg(level: PuzzleLevel): number {
  return level === 'closure' ? Number.POSITIVE_INFINITY : level;
}

export function certificateInputOf(i: Pick<PuzzleJobInput, 'kind' | 'tiling' | 'level' | 'showFrame'>, starters: Placed[], givens: Placed[]): CertificateInput {
  if (i.kind === 'assembly') {
    return { kind: 'assembly', width: i.tiling.W, height: i.tiling.H, pieces: i.tiling.squares.map((q) => q.s), ...(starters.length > 0 ? { starters } : {}) };
  }
  return { kind: 'deduction', tiling: i.tiling, givens, level: i.level ?? DEFAULT_LEVEL, showFrame: i.showFrame };
}

/** Hash and clock of a certificate (issued or recomputed). */
function issuing(c: ProveControl): Pick<CertifyOptions, 'hash' | 'createdAt'> {
  return { hash: nodeSha256, ...(c.now ? { createdAt: c.now } : {}) };
}

/** Budget, cancellation and progress of one Assembly search, reported under `phase`. */
function assemblySearch(c: ProveControl, phase: string): SearchControl {
  return {
    budget: { maxMs: ASSEMBLY_MS },
    ...(c.shouldStop ? { shouldStop: c.shouldStop } : {}),
    onProgress: (nodes) => c.progress?.(phase, nodes),
  };
}

function certifyPuzzle(i: PuzzleJobInput, starters: Placed[], givens: Placed[], c: ProveControl) {
  return certify(certificateInputOf(i, starters, givens), { ...issuing(c), assembly: assemblySearch(c, 'assembly search nodes') });
}

function summaryOf(i: PuzzleJobInput, task: PuzzleJobParams['task'], revision: number, starters: Placed[], givens: Placed[], level: PuzzleLevel | null, notes: string[], c: ProveControl): PuzzleJobSummary {
  const r = certifyPuzzle({ ...i, level }, starters, givens, c);
  if (r.kind === 'assembly') {
    const second = r.result.second ? { tiling: r.result.second.tiling, differ: r.result.second.difference.second } : null;
    if (r.result.verdict === 'multiple' && r.result.second) notes.push(`a second solution moves the pieces of sizes ${r.result.second.difference.sizes.join(', ')}`);
    if (r.result.reason) notes.push(r.result.reason);
    return { revision, task, certificate: r.certificate, starters, givens: [], level: null, steps: [], grade: assemblyGrade(i.tiling.squares.length, starters.length), second, notes };
  }
  const res = r.result;
  if (r.certificate.verdict === 'stuck') notes.push(`unique by rank, but level ${String(level)} does not reach every size`);
  if (r.certificate.verdict === 'not-unique') notes.push(`the givens leave ${res.proof.unknowns - res.proof.rank} size(s) free: more than one solution`);
  return {
    revision, task, certificate: r.certificate, starters: [], givens, level,
    steps: res.steps.map((s) => ({ square: s.square, label: s.label, round: s.round, value: s.value, text: s.text })),
    grade: res.grade, second: null, notes,
  };
}

/** The work of one puzzle job, outside the worker too (the demo seeder calls it directly). */
export function provePuzzle(i: PuzzleJobInput, task: PuzzleJobParams['task'], revision: number, c: ProveControl = {}): PuzzleJobSummary {
  const notes: string[] = [];
  if (task === 'recheck') {
    if (!i.certificate) throw new Error('there is no certificate to re-check');
    const starters = i.starters ?? [];
    const givens = i.givens ?? [];
    const rc = recheckCertificate(i.certificate, certificateInputOf(i, starters, givens), issuing(c));
    const s = summaryOf(i, task, revision, starters, givens, i.level, notes, c);
    return { ...s, certificate: rc.fresh, recheck: { holds: rc.holds, reasons: rc.reasons } };
  }
  if (i.kind === 'assembly') {
    if (task === 'make' && i.starters === null) {
      c.progress?.('bare set', 0);
      const bare = certifyPuzzle(i, [], [], c);
      if (bare.certificate.verdict !== 'multiple') {
        if (bare.certificate.verdict === 'unique') notes.push('the bare set of pieces already assembles in exactly one way: no starter pieces needed');
        return summaryOf(i, task, revision, [], [], null, notes, c);
      }
      c.progress?.('fewest starter pieces', 0);
      const f = findFewestStarters(i.tiling, assemblySearch(c, 'fewest starter pieces: search nodes'));
      if (!f.starters) {
        notes.push(`no set of up to 4 starter pieces makes it unique${f.stoppedBy ? ` (stopped: ${f.stoppedBy})` : ''}`);
        return summaryOf(i, task, revision, [], [], null, notes, c);
      }
      notes.push(`${f.starters.length} starter piece(s) ${f.fewestProved ? 'are proved the fewest' : 'make it unique (fewer not ruled out within the budget)'}; ${f.solves} candidate set(s) searched`);
      return summaryOf(i, task, revision, f.starters.map((s) => ({ x: s.x, y: s.y, size: s.size })), [], null, notes, c);
    }
    return summaryOf(i, task, revision, i.starters ?? [], [], null, notes, c);
  }
  // deduction
  if (task === 'make' && i.givens === null) {
    const levels = i.level !== null ? [i.level] : i.grade !== null ? GRADE_LEVELS : [DEFAULT_LEVEL];
    let best: { level: PuzzleLevel; givens: Placed[]; grade: number } | null = null;
    for (const [n, level] of levels.entries()) {
      if (c.shouldStop?.()) break;
      c.progress?.('choosing givens', n);
      const p = makeDeductionPuzzle(i.tiling, { level: levelArg(level), showFrame: i.showFrame, seed: i.seed });
      const cand = { level, givens: p.givens.map((g) => ({ x: g.x, y: g.y, size: g.size })), grade: p.grade };
      const dist = (g: number) => (i.grade === null ? 0 : Math.abs(g - i.grade));
      if (!best || dist(cand.grade) < dist(best.grade)) best = cand;
      if (n === 0) notes.push(`givens chosen by seeded greedy removal (seed ${i.seed}), ${p.minimal === 'proved' ? 'proved the fewest' : p.minimal === 'inclusion' ? 'none can be left out' : 'minimality not checked'}`);
    }
    if (!best) throw new Error('cancelled before any givens were best');
    if (i.grade !== null && i.level === null) notes.push(`level ${String(best.level)} comes closest to the grade wished (${i.grade}): grade ${best.grade}`);
    return summaryOf(i, task, revision, [], best.givens, best.level, notes, c);
  }
  return summaryOf(i, task, revision, [], i.givens ?? [], i.level ?? DEFAULT_LEVEL, notes, c);
}

