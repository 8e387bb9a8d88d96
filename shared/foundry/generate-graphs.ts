// All 3-connected planar graphs with m edges as canonical keys: the tree walk of
// generate-maps.ts (each map once, no table of seen maps), keyed by the canonical code of the
// embedding (canonical-graph.ts; the same code as map-canonical.ts computes on a map).
import { codeKey, graphFromCode, keyCode } from './canonical-graph';
import { facesOf, splitFace, type PlaneGraph } from '../tiling/index';
import { FoundryInputError } from './errors';
import { forEachPlaneMap } from './generate-maps';
import { MapCanonizer } from './map-canonical';
import { PlaneMap } from './plane-map';

export interface GeneratedGraph {
  /** Canonical code as a string (one char per code entry). */
  key: string;
  /** Canonical key of the planar dual. */
  dualKey: string;
}

export interface GenerateOptions {
  /** Polled between parts of the walk; returning true ends the generator early. */
  shouldStop?: () => boolean;
  /** Only part index of count of the graphs (disjoint parts, together all of them). */
  shard?: { index: number; count: number };
}

export const MIN_EDGES = 6;
export const MAX_EDGES = 40;

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

function checkEdges(m: number): void {
  if (!Number.isInteger(m) || m < MIN_EDGES || m > MAX_EDGES) {
    throw new FoundryInputError('bad-edges', `planeGraphsWithEdges: m must be an integer in ${MIN_EDGES}..${MAX_EDGES}, got ${m}`);
  }
}

/**
 * Every 3-connected planar graph with exactly m edges, once each, with the key of its dual.
 * The walk runs when the generator is first asked; stop early with opts.shouldStop.
 */
export function* planeGraphsWithEdges(m: number, opts: GenerateOptions = {}): Generator<GeneratedGraph> {
  checkEdges(m);
  const out: GeneratedGraph[] = [];
  const canon = new MapCanonizer();
  const dual = new PlaneMap();
  let stopped = false;
  const code = (h: PlaneMap) => {
    canon.run(h, false);
    return codeKey(canon.code.subarray(0, canon.length));
  };
  forEachPlaneMap(
    m,
    (h) => {
      if (stopped) return;
      h.dualInto(dual);
      out.push({ key: code(h), dualKey: code(dual) });
    },
    { ...(opts.shard ? { shard: opts.shard } : {}), shouldStop: () => (stopped ||= opts.shouldStop?.() === true) },
  );
  for (const g of out) {
    if (opts.shouldStop?.()) return;
    yield g;
  }
}

/** Counts of 3-connected planar graphs for m = 6..mMax (index m). */
export function countPlaneGraphs(mMax: number): number[] {
  checkEdges(mMax);
  const counts: number[] = [];
  for (let m = MIN_EDGES; m <= mMax; m++) {
    let c = 0;
    forEachPlaneMap(m, () => { c++; });
    counts[m] = c;
  }
  return counts;
}
