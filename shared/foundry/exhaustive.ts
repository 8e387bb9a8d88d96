// Exhaustive squared rectangles of order n from the c-nets with m = n + 1 edges
// (Brooks, Smith, Stone & Tutte, Duke Math. J. 7 (1940)): every 3-connected planar graph
// (generate-maps.ts: each once, as a tree walk that splits into shards) with every edge as
// the pole edge is solved exactly (map-solver.ts: one adjugate per graph gives every pole);
// zero currents are skipped; every result is verified as an exact cover, classified and
// reported once. (G, e) and (G*, e*) give the same rectangle turned a quarter turn, so of a
// dual pair only the graph with fewer vertices is solved, and of a pair with as many vertices
// as faces the one whose canonical code is not larger [common practice]. Squares only: the
// square test 2 tau(G / e) = tau(G) and Gambini's filter come before any layout.
import { solvePlaneNetwork, type PlaneGraph, type Tiling } from '../tiling/index';
import { FoundryInputError } from './errors';
import { factsOf, foundTiling, type FoundryRunControl } from './found-tiling';
import { forEachPlaneMap } from './generate-maps';
import { MapCanonizer } from './map-canonical';
import { MapSolver } from './map-solver';
import { PlaneMap, mapFromPlaneGraph } from './plane-map';
import { cNetsOf, crossPoints } from './tiling-networks';

export const MIN_ORDER = 5;
export const MAX_EXHAUSTIVE_ORDER = 25;

/** onFound is called once per distinct simple tiling, when first found. */
export interface ExhaustiveOptions extends FoundryRunControl {
  order: number;
  /** only squared squares, with Gambini's filter on the pole edges */
  squaresOnly?: boolean;
  /**
   * Run only part `index` (0-based) of `count` disjoint parts. Each part is deterministic, the
   * parts together do exactly the whole run, and every tiling is reported by exactly one part
   * (a tiling with a cross, met from two c-nets, only by the part holding its owner c-net), so
   * the parts' counts add up to the whole run's and their tilings are the run's.
   */
  shard?: { index: number; count: number };
  /**
   * Progress of the walk over the graphs: `done` of `total` parts of this run's search
   * finished ('solving'; the other phases are no longer reported).
   */
  onProgress?: (p: { phase: 'levels' | 'last-level' | 'solving'; done: number; total: number; found: number }) => void;
}

export interface ExhaustiveSummary {
  order: number;
  squaresOnly: boolean;
  /** 3-connected planar graphs with order + 1 edges (in this shard) */
  graphs: number;
  /** (graph, pole edge) pairs tested: every edge of every solved graph */
  pairs: number;
  /** pairs laid out whose network has an edge without current */
  zeroCurrent: number;
  simplePerfect: number;
  simpleImperfect: number;
  compound: number;
  /** simple perfect squared squares */
  squares: number;
  ms: number;
  stopped: boolean;
}

/**
 * Gambini's observation (squaring.net): in a perfect squared square at most one side meets
 * only two squares. The top and bottom sides meet deg(p) - 1 and deg(q) - 1 squares, the left
 * and right sides |f| - 1 for the two faces beside the pole edge.
 */
export function passesGambini(g: PlaneGraph, p: number, q: number, faceSizes: Map<string, number>): boolean {
  let threes = 0;
  if (g.adj[p]!.length === 3) threes++;
  if (g.adj[q]!.length === 3) threes++;
  if ((faceSizes.get(`${p},${q}`) ?? 0) === 3) threes++;
  if ((faceSizes.get(`${q},${p}`) ?? 0) === 3) threes++;
  return threes <= 1;
}

/** passesGambini on a map, for the pole dart d. */
function gambini(h: PlaneMap, d: number): boolean {
  let threes = 0;
  if (h.deg[h.tail[d]!] === 3) threes++;
  if (h.deg[h.head[d]!] === 3) threes++;
  if (h.fsize[h.face[d]!] === 3) threes++;
  if (h.fsize[h.face[h.rev[d]!]!] === 3) threes++;
  return threes <= 1;
}

/** Picks and keys the graph of each dual pair a run solves. */
class Representatives {
  private readonly canon = new MapCanonizer();
  private readonly dual = new PlaneMap();

  /** The canonical key of h (faces computed). */
  key(h: PlaneMap): string {
    this.canon.run(h, false);
    return this.canon.key();
  }

  /** True when the run solves h (not its dual): fewer vertices than faces, or as many and a code not larger. */
  solves(h: PlaneMap): boolean {
    if (h.n !== h.F) return h.n < h.F;
    const k = this.key(h);
    h.dualInto(this.dual);
    return k <= this.key(this.dual);
  }

  /** The key of the graph a run solves for the dual pair of h. */
  solvedKey(h: PlaneMap): string {
    if (h.n < h.F) return this.key(h);
    h.dualInto(this.dual);
    const d = this.key(this.dual);
    if (h.n > h.F) return d;
    const k = this.key(h);
    return k <= d ? k : d;
  }

  /**
   * Whether the run reports tiling t from the graph with key `key`: always for a tiling
   * without crosses (it has one c-net); for one with crosses only from its owner, the
   * 3-connected c-net with the smallest solved key.
   */
  owns(t: Tiling, key: string): boolean {
    if (crossPoints(t).length === 0) return true;
    let owner: string | null = null;
    const m = new PlaneMap();
    for (const g of cNetsOf(t)) {
      const k = this.solvedKey(mapFromPlaneGraph(g, m));
      if (owner === null || k < owner) owner = k;
    }
    return owner === null || owner === key;
  }
}

function checkShard(shard: ExhaustiveOptions['shard']): { index: number; count: number } {
  if (shard === undefined) return { index: 0, count: 1 };
  const { index, count } = shard;
  if (!Number.isInteger(count) || count < 1 || !Number.isInteger(index) || index < 0 || index >= count) {
    throw new FoundryInputError('bad-shard', `exhaustiveTilings: shard must be { index, count } with 0 <= index < count, got ${JSON.stringify(shard)}`);
  }
  return { index, count };
}

export function exhaustiveTilings(opts: ExhaustiveOptions): ExhaustiveSummary {
  const { order } = opts;
  if (!Number.isInteger(order) || order < MIN_ORDER || order > MAX_EXHAUSTIVE_ORDER) {
    throw new FoundryInputError('bad-order', `exhaustiveTilings: order must be an integer in ${MIN_ORDER}..${MAX_EXHAUSTIVE_ORDER}, got ${order}`);
  }
  const shard = checkShard(opts.shard);
  const squaresOnly = opts.squaresOnly === true;
  const t0 = Date.now();
  const summary: ExhaustiveSummary = {
    order, squaresOnly, graphs: 0, pairs: 0, zeroCurrent: 0, simplePerfect: 0, simpleImperfect: 0, compound: 0, squares: 0, ms: 0, stopped: false,
  };
  const reps = new Representatives();
  const solver = new MapSolver();
  // one graph's tilings: its pole edges in one orbit (or a self-dual graph's dual poles) repeat them
  const ofGraph = new Set<string>();
  let found = 0;
  let stop = false;
  const shouldStop = () => (stop ||= opts.shouldStop?.() === true);

  const visit = (h: PlaneMap) => {
    summary.graphs++;
    if (!reps.solves(h)) return;
    ofGraph.clear();
    let key: string | null = null;
    const exact = solver.adjugate(h);
    const n = h.n;
    const { tail, head, rev, D } = h;
    for (let d = 0; d < D; d++) {
      if (rev[d]! < d) continue;
      summary.pairs++;
      if (squaresOnly) {
        if (exact && 2 * solver.height(tail[d]!, head[d]!, n) !== solver.tau) continue;
        if (!gambini(h, d)) continue;
      }
      let t: Tiling | null;
      if (exact) {
        t = solver.tiling(h, d);
      } else {
        const r = solvePlaneNetwork(h.toPlaneGraph(), { p: tail[d]!, q: head[d]! });
        if (!r.ok && r.code !== 'zero-current') throw new Error(`solvePlaneNetwork failed on a generated graph: ${r.code}: ${r.message}`);
        t = r.ok ? r.tiling : null;
      }
      if (t === null) {
        summary.zeroCurrent++;
        continue;
      }
      if (squaresOnly && t.W !== t.H) continue;
      // one decode verifies the exact cover, classifies and gives the canonical code
      const f = factsOf(t);
      if (!f) throw new Error('a solved network did not verify');
      key ??= reps.key(h);
      if (!reps.owns(t, key)) continue;
      if (ofGraph.has(f.key)) continue;
      ofGraph.add(f.key);
      if (!f.classification.simple) {
        summary.compound++;
        continue;
      }
      const ft = foundTiling(f, { method: 'exhaustive', graph: Array.from(key, (ch) => ch.charCodeAt(0)), pole: [tail[d]!, head[d]!] });
      found++;
      if (ft.perfect) summary.simplePerfect++;
      else summary.simpleImperfect++;
      if (ft.perfect && ft.square) summary.squares++;
      opts.onFound?.(ft);
    }
  };
  let lastTotal = 0;
  const finished = forEachPlaneMap(order + 1, visit, {
    shard,
    shouldStop,
    onProgress: (done, total) => {
      lastTotal = total;
      opts.onProgress?.({ phase: 'solving', done, total, found });
    },
  });
  summary.stopped = !finished || stop;
  if (!summary.stopped) opts.onProgress?.({ phase: 'solving', done: lastTotal, total: lastTotal, found });
  summary.ms = Date.now() - t0;
  return summary;
}
