// Random simple perfect squared rectangles (engine.md 6.3): a random c-net with m = n + 1
// edges from the tiling engine (randomCNet: a wheel grown by random face and vertex splits),
// a random pole edge, an exact solve, classify, filter. Not uniform over graphs; reproducible
// from the seed (mulberry32).
import { edgesOf, mulberry32, randomCNet, randomInt, solvePlaneNetwork } from '../tiling/index';
import { FoundryInputError } from './errors';
import { factsOf, foundTiling, type FoundryRunControl } from './found-tiling';

export const MAX_RANDOM_ORDER = 40;
export const MIN_RANDOM_ORDER = 9;

export interface RandomOptions extends FoundryRunControl {
  count: number;
  orderMin: number;
  orderMax: number;
  /** largest square side at most this */
  maxSide?: number;
  /** aspect ratio long side / short side, >= 1 */
  aspectMin?: number;
  aspectMax?: number;
  squaresOnly?: boolean;
  seed: number;
  /** tries before giving up (default 5000 per wanted tiling) */
  maxTries?: number;
  /** the stock already has this canonical key */
  isKnown?: (key: string) => boolean;
  onProgress?: (p: { done: number; total: number; tries: number }) => void;
}

export interface RandomSummary {
  found: number;
  tries: number;
  zeroCurrent: number;
  rejectedFilter: number;
  rejectedKnown: number;
  rejectedNotSimplePerfect: number;
  ms: number;
  stopped: boolean;
  exhaustedTries: boolean;
}

function validate(o: RandomOptions): void {
  const bad = (msg: string) => { throw new FoundryInputError('bad-random-options', `randomTilings: ${msg}`); };
  if (!Number.isInteger(o.count) || o.count < 1) bad(`count must be a positive integer, got ${o.count}`);
  if (!Number.isInteger(o.orderMin) || o.orderMin < MIN_RANDOM_ORDER) bad(`orderMin must be an integer >= ${MIN_RANDOM_ORDER}, got ${o.orderMin}`);
  if (!Number.isInteger(o.orderMax) || o.orderMax > MAX_RANDOM_ORDER) bad(`orderMax must be an integer <= ${MAX_RANDOM_ORDER}, got ${o.orderMax}`);
  if (o.orderMax < o.orderMin) bad(`orderMax (${o.orderMax}) is below orderMin (${o.orderMin})`);
  if (!Number.isInteger(o.seed)) bad(`seed must be an integer, got ${o.seed}`);
  if (o.aspectMin !== undefined && o.aspectMax !== undefined && o.aspectMax < o.aspectMin) bad(`aspectMax (${o.aspectMax}) is below aspectMin (${o.aspectMin})`);
}

export function randomTilings(o: RandomOptions): RandomSummary {
  validate(o);
  const t0 = Date.now();
  const rnd = mulberry32(o.seed);
  const maxTries = o.maxTries ?? o.count * 5000;
  const seen = new Set<string>();
  const s: RandomSummary = { found: 0, tries: 0, zeroCurrent: 0, rejectedFilter: 0, rejectedKnown: 0, rejectedNotSimplePerfect: 0, ms: 0, stopped: false, exhaustedTries: false };
  while (s.found < o.count) {
    if (s.tries >= maxTries) { s.exhaustedTries = true; break; }
    if ((s.tries & 15) === 0) {
      if (o.shouldStop?.()) { s.stopped = true; break; }
      o.onProgress?.({ done: s.found, total: o.count, tries: s.tries });
    }
    s.tries++;
    const order = o.orderMin + randomInt(rnd, o.orderMax - o.orderMin + 1);
    const g = randomCNet(order + 1, rnd);
    const edges = edgesOf(g);
    const [p, q] = edges[randomInt(rnd, edges.length)]!;
    const r = solvePlaneNetwork(g, { p, q });
    if (!r.ok) {
      if (r.code === 'zero-current') { s.zeroCurrent++; continue; }
      throw new Error(`solvePlaneNetwork failed on a random graph: ${r.code}: ${r.message}`);
    }
    const t = r.tiling;
    const long = Math.max(t.W, t.H);
    const short = Math.min(t.W, t.H);
    let maxSize = 0;
    for (const sq of t.squares) if (sq.s > maxSize) maxSize = sq.s;
    if ((o.maxSide !== undefined && maxSize > o.maxSide) ||
      (o.aspectMin !== undefined && long / short < o.aspectMin) ||
      (o.aspectMax !== undefined && long / short > o.aspectMax) ||
      (o.squaresOnly === true && t.W !== t.H)) { s.rejectedFilter++; continue; }
    const f = factsOf(t);
    if (!f) throw new Error('a solved random network did not verify');
    if (!f.classification.simple || !f.classification.perfect) { s.rejectedNotSimplePerfect++; continue; }
    const ft = foundTiling(f, { method: 'random', seed: o.seed, try: s.tries, order, pole: [p, q] });
    if (seen.has(ft.key) || o.isKnown?.(ft.key) === true) { s.rejectedKnown++; continue; }
    seen.add(ft.key);
    s.found++;
    o.onFound?.(ft);
  }
  o.onProgress?.({ done: s.found, total: o.count, tries: s.tries });
  s.ms = Date.now() - t0;
  return s;
}
