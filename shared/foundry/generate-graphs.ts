// All 3-connected planar graphs with m edges, by levels (Bondy & Murty, Graph Theory with
// Applications, 12.2; Tutte's wheel theorem): L[6] = {K4}; L[m] = {wheel W_(m/2) if m is
// even} + face splits of L[m-1] + their duals (vertex splits), deduplicated by the canonical
// code of the embedding. A chord between two non-consecutive vertices of a face of a
// 3-connected plane graph is never a multiple edge (they would form a 2-cut).
import { canonicalForm, codeKey, graphFromCode, keyCode } from './canonical-graph';
import { dualOf, facesOf, splitFace, wheel, type PlaneGraph } from '../tiling/index';
import { FoundryInputError } from './errors';

export interface GeneratedGraph {
  /** Canonical code as a string (one char per code entry). */
  key: string;
  /** Canonical key of the planar dual. */
  dualKey: string;
}

export interface GenerateOptions {
  /** Polled between graphs; returning true ends the generator early. */
  shouldStop?: () => boolean;
  /** Called when a lower level is complete (m, number of graphs). */
  onLevel?: (m: number, count: number) => void;
  /** Progress inside a level: `done` of `total` graphs of level m - 1 extended (every 256). */
  onParents?: (m: number, done: number, total: number) => void;
}

export const MIN_EDGES = 6;
export const MAX_EDGES = 40;

function canonKey(g: PlaneGraph): string {
  return codeKey(canonicalForm(g).code);
}

export function graphFromKey(key: string): PlaneGraph {
  return graphFromCode(keyCode(key));
}

/** Every face split of g (chords between non-consecutive vertices of faces of size >= 4). */
export function* faceSplits(g: PlaneGraph): Generator<PlaneGraph> {
  for (const f of facesOf(g)) {
    const k = f.length;
    if (k < 4) continue;
    for (let i = 0; i < k; i++) {
      for (let j = i + 2; j < k; j++) {
        if (i === 0 && j === k - 1) continue;
        yield splitFace(g, f, i, j);
      }
    }
  }
}

function* level(prev: readonly string[], m: number, seen: Set<string>, opts: GenerateOptions = {}): Generator<GeneratedGraph> {
  const { shouldStop, onParents } = opts;
  if (m % 2 === 0) {
    const w = wheel(m / 2);
    const k = canonKey(w);
    seen.add(k);
    yield { key: k, dualKey: canonKey(dualOf(w)) };
  }
  let tick = 0;
  for (const gk of prev) {
    if ((++tick & 63) === 0 && shouldStop?.()) return;
    if ((tick & 255) === 0) onParents?.(m, tick, prev.length);
    const g = graphFromKey(gk);
    for (const h of faceSplits(g)) {
      const k = canonKey(h);
      if (seen.has(k)) continue;
      seen.add(k);
      const kd = canonKey(dualOf(h));
      yield { key: k, dualKey: kd };
      if (!seen.has(kd)) {
        seen.add(kd);
        yield { key: kd, dualKey: k };
      }
    }
  }
}

/**
 * Yields every 3-connected planar graph with exactly m edges, once each, as soon as it is
 * found (lower levels are built first). Stop early with opts.shouldStop or by leaving the loop.
 */
export function* planeGraphsWithEdges(m: number, opts: GenerateOptions = {}): Generator<GeneratedGraph> {
  if (!Number.isInteger(m) || m < MIN_EDGES || m > MAX_EDGES) {
    throw new FoundryInputError('bad-edges', `planeGraphsWithEdges: m must be an integer in ${MIN_EDGES}..${MAX_EDGES}, got ${m}`);
  }
  const k4 = canonKey(wheel(3));
  if (m === MIN_EDGES) {
    yield { key: k4, dualKey: k4 };
    return;
  }
  let prev: string[] = [k4];
  opts.onLevel?.(MIN_EDGES, 1);
  for (let e = MIN_EDGES + 1; e < m; e++) {
    const seen = new Set<string>();
    for (const _ of level(prev, e, seen, opts)) {
      if (opts.shouldStop?.()) return;
    }
    prev = [...seen];
    opts.onLevel?.(e, prev.length);
  }
  for (const g of level(prev, m, new Set<string>(), opts)) {
    if (opts.shouldStop?.()) return;
    yield g;
  }
}

/** Counts of 3-connected planar graphs for m = 6..mMax (index m). */
export function countPlaneGraphs(mMax: number): number[] {
  const counts: number[] = [];
  const k4 = canonKey(wheel(3));
  let prev: string[] = [k4];
  counts[MIN_EDGES] = 1;
  for (let e = MIN_EDGES + 1; e <= mMax; e++) {
    const seen = new Set<string>();
    for (const _ of level(prev, e, seen)) { /* drain */ }
    prev = [...seen];
    counts[e] = prev.length;
  }
  return counts;
}
