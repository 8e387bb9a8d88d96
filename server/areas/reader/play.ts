import type { CheckInput, CheckResult, RevealInput, RevealResult } from '../../../shared/contracts/reader';
import { frameImages } from '../../../shared/puzzle/index';
import { Conflict, Unprocessable } from '../../platform/http/errors';
import type { PuzzleForPrint } from '../editions/ports';
import { playOf } from './public-view';

// Checking and revealing a reader's entries on the server: the page never holds the answer
// (decision 080). An Assembly is right when each placed piece sits where a square of its size
// sits in the solution, read in any symmetry of the frame that keeps the starter pieces in
// place (the puzzle is unique up to those, so a mirrored build is as right as the printed one).

type Placement = { piece: number; x: number; y: number };

/** The solution's squares as 'size@x,y' keys, once per symmetry of the frame that keeps the starters where they are. */
function assemblyImages(p: PuzzleForPrint): Set<string>[] {
  const starters = p.assembly?.starters ?? [];
  return frameImages(p.solution.tiling)
    .map((t) => new Set(t.squares.map((q) => `${q.s}@${q.x},${q.y}`)))
    .filter((keys) => starters.every((s) => keys.has(`${s.size}@${s.x},${s.y}`)));
}

function checkPlacements(p: PuzzleForPrint, placements: Placement[]): { pieces: number[]; starters: Map<number, Placement>; placed: Placement[] } {
  const play = playOf(p, false);
  if (play.kind !== 'assembly') throw new Unprocessable('This puzzle is a Deduction: send entries (square and size), not placements.', [{ path: 'body', message: 'expected entries' }]);
  const starters = new Map(play.starters.map((s) => [s.piece, s]));
  const seen = new Set<number>();
  const placed: Placement[] = [];
  placements.forEach((pl, i) => {
    const size = play.pieces[pl.piece];
    if (size === undefined) throw new Unprocessable(`There is no piece ${pl.piece} (the puzzle has ${play.pieces.length}).`, [{ path: `body.placements.${i}.piece`, message: 'no such piece' }]);
    if (seen.has(pl.piece)) throw new Unprocessable(`Piece ${pl.piece} is placed twice.`, [{ path: `body.placements.${i}.piece`, message: 'placed twice' }]);
    seen.add(pl.piece);
    if (pl.x + size > play.frame.W || pl.y + size > play.frame.H) throw new Unprocessable(`Piece ${pl.piece} (size ${size}) does not fit in the frame at ${pl.x}, ${pl.y}.`, [{ path: `body.placements.${i}`, message: 'outside the frame' }]);
    if (starters.has(pl.piece)) return; // starter pieces are fixed: their place is the printed one
    placed.push(pl);
  });
  return { pieces: play.pieces, starters, placed };
}

/** The symmetry image that agrees with the most placements (the first on a tie). */
function bestImage(images: Set<string>[], pieces: number[], placed: Placement[]): Set<string> {
  let best = images[0]!;
  let bestHits = -1;
  for (const img of images) {
    const hits = placed.filter((pl) => img.has(`${pieces[pl.piece]}@${pl.x},${pl.y}`)).length;
    if (hits > bestHits) {
      best = img;
      bestHits = hits;
    }
  }
  return best;
}

export function checkEntries(p: PuzzleForPrint, input: CheckInput): CheckResult {
  if ('placements' in input) {
    const { pieces, starters, placed } = checkPlacements(p, input.placements);
    const images = assemblyImages(p);
    if (images.length === 0) throw new Error(`puzzle ${p.id}: its starter pieces are not where its solution has them`);
    const img = bestImage(images, pieces, placed);
    const wrong = placed.filter((pl) => !img.has(`${pieces[pl.piece]}@${pl.x},${pl.y}`)).map((pl) => pl.piece).sort((a, b) => a - b);
    return { wrong, solved: wrong.length === 0 && placed.length + starters.size === pieces.length };
  }
  if (p.kind !== 'deduction') throw new Unprocessable('This puzzle is an Assembly: send placements (piece, x, y), not entries.', [{ path: 'body', message: 'expected placements' }]);
  const sizes = p.solution.tiling.squares.map((q) => q.s);
  const givens = new Set((p.deduction?.givens ?? []).map((g) => g.rect));
  const seen = new Set<number>();
  const wrong: number[] = [];
  input.entries.forEach((e, i) => {
    const truth = sizes[e.square];
    if (truth === undefined) throw new Unprocessable(`There is no square ${e.square} (the puzzle has ${sizes.length}).`, [{ path: `body.entries.${i}.square`, message: 'no such square' }]);
    if (seen.has(e.square)) throw new Unprocessable(`Square ${e.square} has two entries.`, [{ path: `body.entries.${i}.square`, message: 'entered twice' }]);
    seen.add(e.square);
    if (e.size !== truth) wrong.push(e.square);
  });
  const filled = sizes.every((_, i) => givens.has(i) || seen.has(i));
  return { wrong: wrong.sort((a, b) => a - b), solved: filled && wrong.length === 0 };
}

/** Reveal one piece or square, or all of them: only once the edition's solutions are public. */
export function revealEntries(p: PuzzleForPrint, input: RevealInput, solutionsPublic: boolean, solutionsFrom: Date | null): RevealResult {
  if (!solutionsPublic) {
    const when = solutionsFrom ? ` on ${solutionsFrom.toISOString()}` : ' with the next edition';
    throw new Conflict(`The solutions of this edition are not public yet: revealing opens${when}.`);
  }
  if (p.kind === 'assembly') {
    if ('square' in input) throw new Unprocessable('This puzzle is an Assembly: reveal a piece, or all.', [{ path: 'body.square', message: 'expected piece' }]);
    const { pieces, starters, placed } = checkPlacements(p, input.placements ?? []);
    const img = bestImage(assemblyImages(p), pieces, placed);
    // each piece's place in that image: equal sizes take the places in reading order
    const places = new Map<number, Placement>();
    const bySize = new Map<number, { x: number; y: number }[]>();
    for (const key of img) {
      const m = /^(\d+)@(\d+),(\d+)$/.exec(key)!;
      const list = bySize.get(Number(m[1])) ?? [];
      list.push({ x: Number(m[2]), y: Number(m[3]) });
      bySize.set(Number(m[1]), list);
    }
    for (const list of bySize.values()) list.sort((a, b) => a.y - b.y || a.x - b.x);
    const taken = new Set<string>();
    const take = (piece: number, at: { x: number; y: number }) => {
      places.set(piece, { piece, ...at });
      taken.add(`${pieces[piece]}@${at.x},${at.y}`);
    };
    for (const [piece, s] of starters) take(piece, s);
    for (const pl of placed) if (img.has(`${pieces[pl.piece]}@${pl.x},${pl.y}`) && !taken.has(`${pieces[pl.piece]}@${pl.x},${pl.y}`)) take(pl.piece, pl);
    pieces.forEach((size, piece) => {
      if (places.has(piece)) return;
      const at = (bySize.get(size) ?? []).find((q) => !taken.has(`${size}@${q.x},${q.y}`));
      if (at) take(piece, at);
    });
    if ('piece' in input) {
      const one = places.get(input.piece);
      if (!one) throw new Unprocessable(`There is no piece ${input.piece}.`, [{ path: 'body.piece', message: 'no such piece' }]);
      return { placements: [one] };
    }
    return { placements: [...places.values()].sort((a, b) => a.piece - b.piece) };
  }
  if ('piece' in input) throw new Unprocessable('This puzzle is a Deduction: reveal a square, or all.', [{ path: 'body.piece', message: 'expected square' }]);
  const sizes = p.solution.tiling.squares.map((q) => q.s);
  if ('square' in input) {
    const size = sizes[input.square];
    if (size === undefined) throw new Unprocessable(`There is no square ${input.square}.`, [{ path: 'body.square', message: 'no such square' }]);
    return { entries: [{ square: input.square, size }] };
  }
  return { entries: sizes.map((size, square) => ({ square, size })) };
}
