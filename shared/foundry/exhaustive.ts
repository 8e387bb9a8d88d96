// Exhaustive squared rectangles of order n from the c-nets with m = n + 1 edges
// (Brooks, Smith, Stone & Tutte, Duke Math. J. 7 (1940)): every 3-connected planar graph
// with every pole edge up to symmetry is solved exactly; zero currents are skipped; every
// result is re-verified, classified and deduplicated by its canonical key (never by
// dividing counts). (G, e) and (G*, e*) give the same rectangle turned a quarter turn, so of
// a dual pair only the graph whose canonical code is not larger is solved [common practice].
import { classifyTiling, dualOf, facesOf, solvePlaneNetwork, type PlaneGraph, type Tiling } from '../tiling/index';
import { canonicalGraphKey, edgeOrbits } from './canonical-graph';
import { cNetsOf, crossPoints } from './tiling-networks';
import { graphFromKey, planeGraphsWithEdges } from './generate-graphs';
import { describeTiling, type FoundryRunControl } from './found-tiling';
import { FoundryInputError } from './errors';

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
  /** 'levels': graph levels built; 'last-level': graphs with m - 1 edges extended; 'solving': graphs solved */
  onProgress?: (p: { phase: 'levels' | 'last-level' | 'solving'; done: number; total: number; found: number }) => void;
}

export interface ExhaustiveSummary {
  order: number;
  squaresOnly: boolean;
  /** 3-connected planar graphs with order + 1 edges */
  graphs: number;
  /** (graph, pole-edge orbit) pairs solved */
  pairs: number;
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

function dartFaceSizes(g: PlaneGraph): Map<string, number> {
  const m = new Map<string, number>();
  for (const f of facesOf(g)) {
    for (let i = 0; i < f.length; i++) m.set(`${f[i]},${f[(i + 1) % f.length]}`, f.length);
  }
  return m;
}

/** The canonical key of the graph a run solves for g: of a dual pair only the one with the smaller key. */
function solvedKey(g: PlaneGraph): string {
  const k = canonicalGraphKey(g);
  const d = canonicalGraphKey(dualOf(g));
  return k <= d ? k : d;
}

/**
 * Whether the run reports tiling t when it meets it from the graph with key `key`: always for
 * a tiling without crosses (it has one c-net); for one with crosses only from its owner, the
 * 3-connected c-net with the smallest solved key.
 */
function ownedBy(t: Tiling, key: string): boolean {
  if (crossPoints(t).length === 0) return true;
  let owner: string | null = null;
  for (const g of cNetsOf(t)) {
    const k = solvedKey(g);
    if (owner === null || k < owner) owner = k;
  }
  return owner === null || owner === key;
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
  const m = order + 1;
  // keys only: the tilings themselves go to onFound (memory stays small at order 18+)
  const found = new Set<string>();
  const summary: ExhaustiveSummary = {
    order, squaresOnly, graphs: 0, pairs: 0, zeroCurrent: 0, simplePerfect: 0, simpleImperfect: 0, compound: 0, squares: 0, ms: 0, stopped: false,
  };
  const compoundKeys = new Set<string>();
  let stop = false;
  const shouldStop = () => (stop ||= opts.shouldStop?.() === true);
  const levels = m - 6;
  const graphs: { key: string; dualKey: string }[] = [];
  for (const g of planeGraphsWithEdges(m, {
    shouldStop,
    onLevel: (e) => opts.onProgress?.({ phase: 'levels', done: e - 6, total: levels, found: 0 }),
    onParents: (e, done, total) => { if (e === m) opts.onProgress?.({ phase: 'last-level', done, total, found: 0 }); },
  })) graphs.push(g);
  if (shouldStop()) {
    summary.stopped = true;
    summary.ms = Date.now() - t0;
    return summary;
  }
  let done = 0;
  for (const { key, dualKey } of graphs) {
    if ((done & 31) === 0) {
      if (shouldStop()) break;
      opts.onProgress?.({ phase: 'solving', done, total: graphs.length, found: found.size });
    }
    if (done++ % shard.count !== shard.index) continue;
    summary.graphs++;
    if (key > dualKey) continue;
    const g = graphFromKey(key);
    const faceSizes = squaresOnly ? dartFaceSizes(g) : null;
    for (const { edge } of edgeOrbits(g)) {
      const [p, q] = edge;
      if (faceSizes && !passesGambini(g, p, q, faceSizes)) continue;
      summary.pairs++;
      const r = solvePlaneNetwork(g, { p, q });
      if (!r.ok) {
        if (r.code === 'zero-current') summary.zeroCurrent++;
        else throw new Error(`solvePlaneNetwork failed on a generated graph: ${r.code}: ${r.message}`);
        continue;
      }
      if (squaresOnly && r.tiling.W !== r.tiling.H) continue;
      if (!ownedBy(r.tiling, key)) continue;
      const cls = classifyTiling(r.tiling);
      if (!cls.simple) {
        // count each compound tiling once as well
        const ft = describeTiling(r.tiling, {}, cls);
        if (ft) compoundKeys.add(ft.key);
        continue;
      }
      const ft = describeTiling(r.tiling, { method: 'exhaustive', graph: Array.from(key, (ch) => ch.charCodeAt(0)), pole: [p, q] }, cls);
      if (!ft) throw new Error('a solved network did not verify');
      if (found.has(ft.key)) continue;
      found.add(ft.key);
      if (ft.perfect) summary.simplePerfect++;
      else summary.simpleImperfect++;
      if (ft.perfect && ft.square) summary.squares++;
      opts.onFound?.(ft);
    }
  }
  summary.compound = compoundKeys.size;
  summary.stopped = stop;
  opts.onProgress?.({ phase: 'solving', done, total: graphs.length, found: found.size });
  summary.ms = Date.now() - t0;
  return summary;
}
