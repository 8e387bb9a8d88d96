import { canonicalKey, checkKirchhoff, verifyTiling } from '../tiling/index';
import type { Square, Tiling } from '../tiling/index';
import { PuzzleInputError } from './errors';
import { NodeMeter, SearchStopped } from './search-control';
import type { SearchControl, StopReason } from './search-control';

/** A piece the solver is given already in place: a square of side `size` at (x, y). */
export interface StarterPiece {
  size: number;
  x: number;
  y: number;
}

export interface AssemblyInput {
  width: number;
  height: number;
  /** the multiset of square sizes, starters included */
  pieces: number[];
  starters?: StarterPiece[];
}

export interface AssemblyOptions extends SearchControl {
  /**
   * 'decide' (default) stops as soon as two classes are found (enough to refute
   * uniqueness); 'count' searches everything and reports all classes and raw solutions.
   */
  mode?: 'decide' | 'count';
  /** Break the left-right mirror for perfect sets (default true). Off only for checks. */
  mirrorBreak?: boolean;
  /** How many class representatives to keep in `solutions` (default 2). */
  keepSolutions?: number;
}

export type AssemblyVerdict = 'unique' | 'multiple' | 'none' | 'undecided';

/** How a second solution differs from the first (after turning it to match best). */
export interface SolutionDifference {
  /** indexes into the first solution's squares that are not in the second at the same place */
  first: number[];
  /** indexes into the second solution's squares that are not in the first at the same place */
  second: number[];
  /** the sizes of the squares that moved, ascending */
  sizes: number[];
}

export interface AssemblyResult {
  verdict: AssemblyVerdict;
  /** true when the search ran to the end (the verdict then is a proof) */
  complete: boolean;
  /** distinct solutions up to the frame's symmetries found (all of them when complete) */
  classes: number;
  /** distinct solutions as placements (equal sizes never permuted); null unless complete in 'count' mode */
  rawSolutions: number | null;
  /** one tiling per class found, in the order found, at most keepSolutions */
  solutions: Tiling[];
  /** for 'multiple': the second solution and what differs from the first */
  second?: { tiling: Tiling; difference: SolutionDifference };
  /** for 'none' and 'undecided': why, in words */
  reason?: string;
  stoppedBy?: StopReason;
  /** what was checked, in words (for the certificate) */
  checks: string[];
  nodes: number;
  ms: number;
}

/** Thrown to unwind the search once enough classes are found ('decide' mode). */
const DONE = new Error('assembly: enough classes found');

interface Problem {
  W: number;
  H: number;
  /** free sizes, descending */
  sizes: number[];
  fixed: StarterPiece[];
}

/** Largest frame side accepted (the subset-sum tables grow with the height). */
export const MAX_FRAME_SIDE = 1_000_000;

function isPositiveInt(v: unknown): v is number {
  return typeof v === 'number' && Number.isSafeInteger(v) && v > 0;
}

function validate(input: AssemblyInput): Problem {
  if (!input || typeof input !== 'object') throw new PuzzleInputError('bad-input', 'assembly input must be an object');
  const { width: W, height: H, pieces } = input;
  if (!isPositiveInt(W)) throw new PuzzleInputError('bad-frame', `frame width must be a positive integer, got ${String(W)}`, { field: 'width' });
  if (!isPositiveInt(H)) throw new PuzzleInputError('bad-frame', `frame height must be a positive integer, got ${String(H)}`, { field: 'height' });
  if (W > MAX_FRAME_SIDE || H > MAX_FRAME_SIDE) throw new PuzzleInputError('bad-frame', `frame sides are limited to ${MAX_FRAME_SIDE}, got ${W}x${H}`, { field: W > MAX_FRAME_SIDE ? 'width' : 'height' });
  if (!Array.isArray(pieces) || pieces.length === 0) throw new PuzzleInputError('bad-pieces', 'pieces must be a non-empty list of sizes', { field: 'pieces' });
  if (pieces.length > 200) throw new PuzzleInputError('bad-pieces', `at most 200 pieces, got ${pieces.length}`, { field: 'pieces' });
  pieces.forEach((p, i) => {
    if (!isPositiveInt(p)) throw new PuzzleInputError('bad-pieces', `piece ${i + 1} must be a positive integer size, got ${String(p)}`, { field: 'pieces', index: i });
  });
  const pool = new Map<number, number>();
  for (const p of pieces) pool.set(p, (pool.get(p) ?? 0) + 1);
  const fixed: StarterPiece[] = [];
  (input.starters ?? []).forEach((st, i) => {
    if (!st || !isPositiveInt(st.size) || !Number.isSafeInteger(st.x) || !Number.isSafeInteger(st.y) || st.x < 0 || st.y < 0) {
      throw new PuzzleInputError('bad-starter', `starter ${i + 1} must be {size, x, y} with a positive size and x, y >= 0`, { field: 'starters', index: i });
    }
    const left = pool.get(st.size) ?? 0;
    if (left === 0) throw new PuzzleInputError('bad-starter', `starter ${i + 1} has size ${st.size}, which is not among the pieces (or used up)`, { field: 'starters', index: i });
    if (st.x + st.size > W || st.y + st.size > H) throw new PuzzleInputError('bad-starter', `starter ${i + 1} (size ${st.size} at ${st.x},${st.y}) sticks out of the ${W}x${H} frame`, { field: 'starters', index: i });
    for (let j = 0; j < fixed.length; j++) {
      const o = fixed[j]!;
      if (st.x < o.x + o.size && o.x < st.x + st.size && st.y < o.y + o.size && o.y < st.y + st.size) {
        throw new PuzzleInputError('bad-starter', `starters ${j + 1} and ${i + 1} overlap`, { field: 'starters', index: i });
      }
    }
    pool.set(st.size, left - 1);
    fixed.push({ size: st.size, x: st.x, y: st.y });
  });
  const sizes: number[] = [];
  for (const [s, c] of pool) for (let k = 0; k < c; k++) sizes.push(s);
  sizes.sort((a, b) => b - a);
  return { W, H, sizes, fixed };
}

/** A quick check that settles the question without search, or null. */
function quickRefusal(p: Problem): string | null {
  // exact: sides up to 10^6 give areas beyond 2^53 when summed
  let area = 0n;
  let max = 0;
  for (const s of p.sizes) { area += BigInt(s) * BigInt(s); max = Math.max(max, s); }
  for (const f of p.fixed) area += BigInt(f.size) * BigInt(f.size);
  if (area !== BigInt(p.W) * BigInt(p.H)) return `the areas do not add up: the pieces cover ${area}, the ${p.W}x${p.H} frame has ${p.W * p.H}`;
  if (max > Math.min(p.W, p.H)) return `a piece of size ${max} is larger than the ${p.W}x${p.H} frame`;
  return null;
}

/**
 * Compare two solutions: turn the second into the orientation that keeps the most squares
 * in place and list what moved.
 */
export function compareSolutions(a: Tiling, b: Tiling): { aligned: Tiling; difference: SolutionDifference } {
  const key = (q: Square) => `${q.x},${q.y},${q.s}`;
  const inA = new Set(a.squares.map(key));
  let best: Tiling = b;
  let bestSame = -1;
  for (const o of frameImages(b)) {
    if (o.W !== a.W || o.H !== a.H) continue;
    let same = 0;
    for (const q of o.squares) if (inA.has(key(q))) same++;
    if (same > bestSame) { bestSame = same; best = o; }
  }
  const inB = new Set(best.squares.map(key));
  const first: number[] = [];
  const second: number[] = [];
  a.squares.forEach((q, i) => { if (!inB.has(key(q))) first.push(i); });
  best.squares.forEach((q, i) => { if (!inA.has(key(q))) second.push(i); });
  const sizes = first.map((i) => a.squares[i]!.s).sort((x, y) => x - y);
  return { aligned: best, difference: { first, second, sizes } };
}

/** The images of a tiling under the symmetries of its own frame (4, or 8 for a square). */
export function frameImages(t: Tiling): Tiling[] {
  const out: Tiling[] = [];
  const maps = t.W === t.H ? 8 : 4;
  for (let m = 0; m < maps; m++) {
    const tr = m >= 4;
    const fx = (m & 1) === 1;
    const fy = (m & 2) === 2;
    const squares = t.squares.map((q) => {
      let x = tr ? q.y : q.x;
      let y = tr ? q.x : q.y;
      if (fx) x = t.W - x - q.s;
      if (fy) y = t.H - y - q.s;
      return { x, y, s: q.s };
    });
    squares.sort((p, q) => p.y - q.y || p.x - q.x);
    out.push({ W: t.W, H: t.H, squares });
  }
  return out;
}

/**
 * Exact Assembly search: every way to tile the W x H frame with the given multiset of
 * square sizes (and the starter pieces in place), counted up to the frame's symmetries.
 *
 * Two phases, x-coordinates first (the idea of Huang & Korf, IJCAI-09, for rectangle
 * packing): phase X sweeps the columns left to right; at the leftmost column whose load is
 * below H, the squares that start there form an unordered SUBSET whose sizes fill the
 * deficit exactly (pruned by suffix subset-sum bitsets); equal sizes are taken in index
 * order so permutations are never counted; for perfect sets the left-right mirror is
 * broken (the largest square on the left side must beat the largest on the right side).
 * Phase Y then places the squares top-down on a skyline with their x already fixed.
 * Every solution is verified by the tiling engine (geometry and Kirchhoff's laws in both
 * directions) before it counts; classes are told apart by canonicalKey.
 */
export function solveAssembly(input: AssemblyInput, options: AssemblyOptions = {}): AssemblyResult {
  const p = validate(input);
  const meter = new NodeMeter(options);
  const mode = options.mode ?? 'decide';
  const keep = options.keepSolutions ?? 2;
  const checks: string[] = [];
  const refusal = quickRefusal(p);
  if (refusal) {
    meter.finish();
    checks.push('quick check: areas and piece sizes against the frame');
    return { verdict: 'none', complete: true, classes: 0, rawSolutions: 0, solutions: [], reason: refusal, checks, nodes: 0, ms: meter.elapsed() };
  }

  const { W, H, sizes, fixed } = p;
  const n = sizes.length;
  const s = Int32Array.from(sizes);
  const prevSame = new Int32Array(n).fill(-1);
  for (let i = 1; i < n; i++) if (s[i] === s[i - 1]) prevSame[i] = i - 1;
  const distinct = new Set(sizes.concat(fixed.map((f) => f.size))).size === n + fixed.length;
  const maxSize = n > 0 ? s[0]! : 0;
  const mirror = (options.mirrorBreak ?? true) && fixed.length === 0 && distinct && maxSize < W;
  if (mirror) checks.push('left-right mirror broken (perfect set): raw count = 2 x solutions found');

  const xs = new Int32Array(n).fill(-1);
  const ys = new Int32Array(n).fill(-1);
  let placedX = 0;
  let leftMax = 0;

  const classes = new Map<string, Tiling>();
  const solutions: Tiling[] = [];
  let raw = 0;
  let doneEarly = false;

  // ---- phase Y: skyline top-down with fixed x ---------------------------------------
  const fixedPlaced = new Uint8Array(fixed.length);
  const placedY = new Uint8Array(n);

  function overlapsUnplacedFixed(x: number, y: number, size: number): boolean {
    for (let j = 0; j < fixed.length; j++) {
      if (fixedPlaced[j]) continue;
      const f = fixed[j]!;
      if (x < f.x + f.size && f.x < x + size && y < f.y + f.size && f.y < y + size) return true;
    }
    return false;
  }

  function record(): void {
    const squares: Square[] = [];
    for (let i = 0; i < n; i++) squares.push({ x: xs[i]!, y: ys[i]!, s: s[i]! });
    for (const f of fixed) squares.push({ x: f.x, y: f.y, s: f.size });
    squares.sort((a, b) => a.y - b.y || a.x - b.x);
    const t: Tiling = { W, H, squares };
    const v = verifyTiling(t);
    if (!v.ok) throw new Error(`assembly produced an invalid tiling: ${v.message}`);
    const k = checkKirchhoff(t);
    if (!k.ok) throw new Error(`assembly produced a tiling that breaks Kirchhoff's laws: ${k.violations[0]?.message ?? ''}`);
    raw++;
    const key = canonicalKey(t);
    if (!classes.has(key)) {
      classes.set(key, t);
      if (solutions.length < keep) solutions.push(t);
      if (mode === 'decide' && classes.size >= 2) { doneEarly = true; throw DONE; }
    }
  }

  // skyline as parallel arrays: segment starts, widths, depths (from the top)
  function phaseY(sx: number[], sw: number[], sh: number[]): void {
    meter.tick();
    let best = -1;
    for (let j = 0; j < sh.length; j++) if (best < 0 || sh[j]! < sh[best]!) best = j;
    const h = sh[best]!;
    if (h === H) { record(); return; }
    const x0 = sx[best]!;
    const w = sw[best]!;
    // a starter whose corner is this point must be the square here
    for (let j = 0; j < fixed.length; j++) {
      const f = fixed[j]!;
      if (!fixedPlaced[j] && f.x === x0 && f.y === h) {
        if (f.size > w) return;
        fixedPlaced[j] = 1;
        place(sx, sw, sh, best, f.size);
        fixedPlaced[j] = 0;
        return;
      }
    }
    let lastSize = -1;
    for (let i = 0; i < n; i++) {
      if (placedY[i] || xs[i] !== x0) continue;
      const si = s[i]!;
      if (si === lastSize || si > w || h + si > H) continue;
      lastSize = si;
      if (fixed.length > 0 && overlapsUnplacedFixed(x0, h, si)) continue;
      placedY[i] = 1;
      ys[i] = h;
      place(sx, sw, sh, best, si);
      placedY[i] = 0;
      ys[i] = -1;
    }
  }

  function place(sx: number[], sw: number[], sh: number[], j: number, size: number): void {
    const x0 = sx[j]!;
    const w = sw[j]!;
    const nh = sh[j]! + size;
    const nx: number[] = [];
    const nw: number[] = [];
    const nhs: number[] = [];
    for (let k = 0; k < sx.length; k++) {
      if (k === j) {
        if (nhs.length > 0 && nhs[nhs.length - 1] === nh) nw[nw.length - 1]! += size;
        else { nx.push(x0); nw.push(size); nhs.push(nh); }
        if (size < w) { nx.push(x0 + size); nw.push(w - size); nhs.push(sh[j]!); }
      } else if (nhs.length > 0 && nhs[nhs.length - 1] === sh[k]) {
        nw[nw.length - 1]! += sw[k]!;
      } else {
        nx.push(sx[k]!); nw.push(sw[k]!); nhs.push(sh[k]!);
      }
    }
    phaseY(nx, nw, nhs);
  }

  // ---- phase X: column sweep choosing subsets ----------------------------------------
  const fixedByX = new Map<number, number[]>();
  fixed.forEach((f, j) => {
    const list = fixedByX.get(f.x) ?? [];
    list.push(j);
    fixedByX.set(f.x, list);
  });
  const fixedStarts = [...fixedByX.keys()].sort((a, b) => a - b);

  // one subset-sum table per deficit column on the current path (reused, never reallocated)
  const maxWords = (H >> 5) + 1;
  const pool: Uint32Array[] = [];
  let depth = 0;

  function phaseX(c: number): void {
    meter.tick();
    if (c === W) {
      if (placedX === n) phaseY([0], [W], [0]);
      return;
    }
    let load = 0;
    let next = W;
    let largestUnused = 0;
    for (let i = 0; i < n; i++) {
      const x = xs[i]!;
      if (x < 0) { if (largestUnused === 0) largestUnused = s[i]!; continue; }
      if (x <= c && x + s[i]! > c) { load += s[i]!; if (x + s[i]! < next) next = x + s[i]!; }
    }
    // every unused square starts at this column or later: the largest must still fit
    if (largestUnused > W - c) return;
    for (const f of fixed) {
      if (f.x <= c && f.x + f.size > c) { load += f.size; if (f.x + f.size < next) next = f.x + f.size; }
    }
    for (const fx of fixedStarts) if (fx > c) { if (fx < next) next = fx; break; }
    const D = H - load;
    if (D < 0) return;
    if (D === 0) { phaseX(next); return; }
    // a column with a deficit: squares must start here; build suffix subset sums
    const limit = Math.min(D, W - c);
    const words = (D >> 5) + 1;
    const bits = pool[depth] ?? (pool[depth] = new Uint32Array((n + 1) * maxWords));
    bits.fill(0, 0, (n + 1) * words);
    bits[n * words] = 1;
    for (let i = n - 1; i >= 0; i--) {
      const base = i * words;
      const src = base + words;
      for (let w = 0; w < words; w++) bits[base + w] = bits[src + w]!;
      const si = s[i]!;
      if (xs[i]! >= 0 || si > limit) continue;
      const ws = si >> 5;
      const bs = si & 31;
      for (let w = words - 1; w >= ws; w--) {
        let v = bits[src + w - ws]! << bs;
        if (bs > 0 && w - ws - 1 >= 0) v |= bits[src + w - ws - 1]! >>> (32 - bs);
        bits[base + w]! |= v;
      }
    }
    if (((bits[D >> 5]! >>> (D & 31)) & 1) === 0) return;
    depth++;
    try {
      chooseSubset(c, D, 0, bits, words, limit);
    } finally {
      depth--;
    }
  }

  function chooseSubset(c: number, rem: number, from: number, bits: Uint32Array, words: number, limit: number): void {
    for (let i = from; i < n; i++) {
      if (xs[i]! >= 0) continue;
      const si = s[i]!;
      if (si > rem || si > limit) continue;
      const ps = prevSame[i]!;
      if (ps >= 0 && xs[ps]! < 0) continue; // equal sizes: canonical (index) order
      const r = rem - si;
      if (r !== 0 && ((bits[(i + 1) * words + (r >> 5)]! >>> (r & 31)) & 1) === 0) continue;
      if (mirror && c > 0 && c + si === W && si > leftMax) continue;
      meter.tick();
      xs[i] = c;
      placedX++;
      const savedLeft = leftMax;
      if (c === 0 && si > leftMax) leftMax = si;
      if (r === 0) phaseX(c);
      else chooseSubset(c, r, i + 1, bits, words, limit);
      leftMax = savedLeft;
      placedX--;
      xs[i] = -1;
    }
  }

  let stoppedBy: StopReason | undefined;
  try {
    phaseX(0);
  } catch (e) {
    if (e === DONE) { /* enough classes found */ } else if (e instanceof SearchStopped) stoppedBy = e.reason;
    else throw e;
  }
  meter.finish();
  const complete = !doneEarly && !stoppedBy;
  const found = classes.size;
  checks.push('column sweep over x, then skyline placement over y (exhaustive unless stopped)');
  checks.push('every solution verified: inside the frame, no overlaps, areas add up, Kirchhoff current and voltage laws');
  checks.push('classes told apart by the canonical code over the frame symmetries');
  const base = { complete, classes: found, solutions, checks, nodes: meter.nodes, ms: meter.elapsed() };
  const rawSolutions = complete && mode === 'count' ? raw * (mirror ? 2 : 1) : complete && found <= 1 ? raw * (mirror ? 2 : 1) : null;
  let result: AssemblyResult;
  if (found >= 2) {
    const [a, b] = solutions as [Tiling, Tiling];
    const cmp = compareSolutions(a, b);
    result = { verdict: 'multiple', ...base, rawSolutions, second: { tiling: cmp.aligned, difference: cmp.difference } };
  } else if (!complete) {
    result = {
      verdict: 'undecided', ...base, rawSolutions: null, stoppedBy: stoppedBy!,
      reason: `the search was stopped (${stoppedBy === 'cancelled' ? 'cancelled' : stoppedBy === 'max-ms' ? 'time budget spent' : 'node budget spent'}) after ${meter.nodes} nodes with ${found} solution class${found === 1 ? '' : 'es'} found; uniqueness is not proved`,
    };
  } else if (found === 1) {
    result = { verdict: 'unique', ...base, rawSolutions };
  } else {
    result = { verdict: 'none', ...base, rawSolutions: 0, reason: 'the exhaustive search found no arrangement that fills the frame' };
  }
  if (stoppedBy && result.verdict !== 'undecided') result.stoppedBy = stoppedBy;
  return result;
}
