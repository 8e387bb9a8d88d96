import { canonicalKey, verifyTiling } from '../tiling/index';
import type { Tiling } from '../tiling/index';
import { frameImages, solveAssembly } from './assembly';
import type { StarterPiece } from './assembly';
import { PuzzleInputError } from './errors';
import { defaultClock, SearchStopped } from './search-control';
import type { SearchControl } from './search-control';

export interface FewestStartersOptions extends SearchControl {
  /** give up beyond this many starters (default 4) */
  maxStarters?: number;
  /** node budget of each single proof (default 2 000 000) */
  maxNodesPerSolve?: number;
}

export interface FewestStartersResult {
  /** the starters that make the set unique (empty when the bare set already is); null if none found */
  starters: StarterPiece[] | null;
  /** true when every smaller candidate set was refuted by a complete search or a known second solution */
  fewestProved: boolean;
  /** candidate sets tried with the solver */
  solves: number;
  /** candidate sets ruled out by a second solution already known */
  skipped: number;
  stoppedBy?: SearchStopped['reason'];
  nodes: number;
  ms: number;
}

/**
 * The fewest starter pieces, taken from the intended tiling, that make its Assembly unique.
 * Tries 0, 1, 2, ... starters; every candidate is proved with the solver (a complete search
 * with exactly one class). A candidate that a known second solution also contains (in any
 * orientation of the frame) cannot work and is skipped without search; each refuting
 * search adds its second solution to that list.
 */
export function findFewestStarters(tiling: Tiling, options: FewestStartersOptions = {}): FewestStartersResult {
  const v = verifyTiling(tiling);
  if (!v.ok) throw new PuzzleInputError('bad-tiling', `the tiling does not verify: ${v.message}`, { field: 'tiling' });
  const now = options.budget?.now ?? defaultClock();
  const started = now();
  const deadline = started + (options.budget?.maxMs ?? Number.POSITIVE_INFINITY);
  const maxNodes = options.budget?.maxNodes ?? Number.POSITIVE_INFINITY;
  const outOfBudget = (): SearchStopped['reason'] | null =>
    options.shouldStop?.() ? 'cancelled' : now() > deadline ? 'max-ms' : nodes >= maxNodes ? 'max-nodes' : null;
  const maxStarters = options.maxStarters ?? 4;
  const perSolve = options.maxNodesPerSolve ?? 2_000_000;
  const pieces = tiling.squares.map((q) => q.s);
  const intended = canonicalKey(tiling);
  const known: Set<string>[] = []; // placements of second solutions, all frame images
  const key = (x: number, y: number, s: number) => `${x},${y},${s}`;
  let solves = 0;
  let skipped = 0;
  let proved = true;
  let nodes = 0;
  const learn = (sols: Tiling[]) => {
    for (const s of sols) {
      if (canonicalKey(s) === intended) continue;
      for (const img of frameImages(s)) known.push(new Set(img.squares.map((q) => key(q.x, q.y, q.s))));
    }
  };
  const result = (starters: StarterPiece[] | null, stoppedBy?: SearchStopped['reason']): FewestStartersResult => {
    options.onProgress?.(nodes);
    const r: FewestStartersResult = { starters, fewestProved: proved && starters !== null, solves, skipped, nodes, ms: now() - started };
    if (stoppedBy) r.stoppedBy = stoppedBy;
    return r;
  };
  try {
    for (let m = 0; m <= Math.min(maxStarters, tiling.squares.length); m++) {
      const idx = Array.from({ length: m }, (_, i) => i);
      for (;;) {
        const starters = idx.map((i) => { const q = tiling.squares[i]!; return { size: q.s, x: q.x, y: q.y }; });
        const refuted = known.some((set) => starters.every((st) => set.has(key(st.x, st.y, st.size))));
        if (refuted) skipped++;
        else {
          solves++;
          const r = solveAssembly(
            { width: tiling.W, height: tiling.H, pieces, starters },
            { budget: { maxNodes: Math.min(perSolve, Math.max(1, maxNodes - nodes)), now }, shouldStop: () => outOfBudget() !== null },
          );
          nodes += r.nodes;
          if (r.verdict === 'unique' && r.complete) return result(starters);
          if (r.verdict === 'multiple') learn(r.solutions);
          else proved = false; // undecided: this candidate might have worked
          const stop = outOfBudget();
          if (stop) throw new SearchStopped(stop);
        }
        let j = m - 1;
        while (j >= 0 && idx[j] === tiling.squares.length - m + j) j--;
        if (j < 0) break;
        idx[j]!++;
        for (let t = j + 1; t < m; t++) idx[t] = idx[t - 1]! + 1;
      }
    }
  } catch (e) {
    if (e instanceof SearchStopped) { proved = false; return result(null, e.reason); }
    throw e;
  }
  return result(null);
}
