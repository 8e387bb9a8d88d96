import { z } from 'zod';
import { toBouwkamp } from '../tiling/index';
import type { AssemblyResult, StarterPiece } from './assembly';
import type { Level } from './deduction-grade';
import type { DeductionPuzzle } from './deduction-puzzle';
import { PuzzleInputError } from './errors';

// The documented JSON answers of `cli assemble` and `cli deduce` (issue 4, item 6) and the
// parsing of their arguments, as pure functions so the command line only wires them.

const positive = z.coerce.number().int().positive().max(2 ** 31);
const coordinate = z.coerce.number().int().nonnegative().max(2 ** 31);

function parseWith<T>(schema: z.ZodType<T>, value: string, field: string, what: string): T {
  const r = schema.safeParse(value);
  if (!r.success) throw new PuzzleInputError('bad-argument', `${field}: ${what}, got "${value}"`, { field });
  return r.data;
}

/** "--frame WxH" -> { width, height } */
export function parseFrameArg(text: string): { width: number; height: number } {
  const m = /^\s*(\d+)\s*[xX]\s*(\d+)\s*$/.exec(text);
  if (!m) throw new PuzzleInputError('bad-argument', `--frame: expected WxH with whole numbers, e.g. 112x75, got "${text}"`, { field: 'frame' });
  return { width: parseWith(positive, m[1]!, 'frame', 'the width must be a positive whole number'), height: parseWith(positive, m[2]!, 'frame', 'the height must be a positive whole number') };
}

/** "--pieces a,b,c" -> [a, b, c] */
export function parsePiecesArg(text: string): number[] {
  const parts = text.split(',').map((p) => p.trim());
  if (parts.length === 0 || parts.some((p) => p === '')) throw new PuzzleInputError('bad-argument', `--pieces: expected sizes separated by commas, e.g. 3,2,2,1, got "${text}"`, { field: 'pieces' });
  return parts.map((p, i) => parseWith(positive, p, 'pieces', `piece ${i + 1} must be a positive whole number`));
}

/** "--starters s@x,y;s@x,y" -> [{ size, x, y }, ...] (empty text: none) */
export function parseStartersArg(text: string): StarterPiece[] {
  if (text.trim() === '') return [];
  return text.split(';').map((part, i) => {
    const m = /^\s*([^@\s]+)\s*@\s*([^,\s]+)\s*,\s*(\S+)\s*$/.exec(part);
    if (!m) throw new PuzzleInputError('bad-argument', `--starters: starter ${i + 1} must read size@x,y, got "${part}"`, { field: 'starters', index: i });
    return {
      size: parseWith(positive, m[1]!, 'starters', `starter ${i + 1}: the size must be a positive whole number`),
      x: parseWith(coordinate, m[2]!, 'starters', `starter ${i + 1}: x must be a whole number >= 0`),
      y: parseWith(coordinate, m[3]!, 'starters', `starter ${i + 1}: y must be a whole number >= 0`),
    };
  });
}

/** "--level k" -> k; "closure" or "inf" -> 'closure' */
export function parseLevelArg(text: string): Level {
  if (/^(closure|inf|infinity)$/i.test(text.trim())) return 'closure';
  return parseWith(positive.max(1000), text, 'level', 'the level must be a whole number >= 1 or "closure"');
}

export interface AssembleAnswer {
  verdict: AssemblyResult['verdict'];
  classes: number;
  complete: boolean;
  /** Bouwkamp codes with header of one solution per class found */
  solutions: string[];
  nodes: number;
  ms: number;
}

export function assembleAnswer(r: AssemblyResult): AssembleAnswer {
  return {
    verdict: r.verdict,
    classes: r.classes,
    complete: r.complete,
    solutions: r.solutions.map((t) => toBouwkamp(t, { header: true })),
    nodes: r.nodes,
    ms: Math.round(r.ms * 100) / 100,
  };
}

export interface DeduceAnswer {
  givens: { x: number; y: number; size: number }[];
  steps: { square: string; round: number; value: number; text: string }[];
  grade: number;
  unique: boolean;
  /** the requested level; "closure" for the full closure */
  level: Level;
}

export function deduceAnswer(p: Pick<DeductionPuzzle, 'givens' | 'steps' | 'grade' | 'proof' | 'solved' | 'level'>): DeduceAnswer {
  return {
    givens: p.givens.map((g) => ({ x: g.x, y: g.y, size: g.size })),
    steps: p.steps.map((s) => ({ square: s.label, round: s.round, value: s.value, text: s.text })),
    grade: p.grade,
    unique: p.solved && p.proof.unique,
    level: p.level,
  };
}
