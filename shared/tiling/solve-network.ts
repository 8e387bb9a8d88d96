// From a plane network and a pole edge to a squared rectangle, solving Kirchhoff's
// equations exactly (Brooks, Smith, Stone & Tutte, "The dissection of rectangles into
// squares", Duke Math. J. 7 (1940)). With L the reduced Laplacian of G - e (row and column of
// the negative pole q deleted), L x = det(L) e_p has integer solutions: det(L) = tau(G - e) is
// the unreduced width, x_p = tau(G / e) the unreduced height (matrix-tree theorem), and the
// node potentials x give the sizes as differences; x positions are face potentials found by a
// walk over the faces; everything is divided by the gcd.
//
// How it is solved: the reduced solution phi = x / gcd with width W = det / gcd is the unique
// integer solution of L phi = W e_p whose entries and W have no common factor. A floating-point
// solve y = L^-1 e_p (dense Gaussian elimination up to 40 unknowns, else LDL^T along a sparse
// elimination plan, sparse-elimination.ts) gives candidates w for a multiple of W: first det(L)
// as the product of the pivots, rounded, then the common denominator of the y_v (continued
// fractions); phi = w y rounded is accepted only when L phi = w e_p holds in exact integer
// arithmetic, and then it is exact whatever the rounding was (L is nonsingular, so the check
// pins phi down), and dividing w and phi by their gcd gives W and the reduced phi. When no
// candidate passes (sides near or past 2^31, where doubles run out), the exact solution comes
// from elimination modulo primes and the Chinese remainder theorem, with enough primes for a
// proven bound. The full width, height, number of spanning trees and unreduced potentials are
// exact BigInts, computed when first read (from a copy of the darts).
//
// Small networks are the common case (the foundry solves them by the thousand), where fixed
// costs dominate: the validation and the solve write into working memory kept at module level
// (typed arrays grown to the largest graph seen), closures and small typed arrays are avoided
// on the way, and the squares handed to the decode check are reused objects. Every check of the
// input is still made on every call.

import { analyseInto, DartBuffers } from './plane-graph';
import { EliminationPlan, exactSolve, floatSolve, type SparseSymmetric } from './sparse-elimination';
import { core } from './tiling-core';
import type { PlaneGraph, SolveResult, Square, Tiling } from './types';

/** Largest reduced side a solve gives as a tiling (the engine's MAX_SIDE). */
const LIMIT = 2 ** 31;
/** Up to this many unknowns the floating-point solve is dense (cheaper than planning the sparse one). */
const DENSE_MAX = 40;

/**
 * How the floating-point guess is made: 'auto' (dense up to DENSE_MAX unknowns, else sparse),
 * or forced 'dense' / 'sparse', or 'exact' (no guess: elimination modulo primes). Every mode
 * gives the same answer (the guess is only accepted after an exact check); the forced modes
 * exist for the tests that compare them.
 */
export type SolveMode = 'auto' | 'dense' | 'sparse' | 'exact';

// Working memory reused from call to call (the solver is not re-entrant, nor is `core`): the
// darts and faces of the last graph, and the arrays below, grown to the largest graph seen.
const darts = new DartBuffers();
let idx = new Int32Array(0);
let phi = new Float64Array(0);
let yv = new Float64Array(0);
let fx = new Float64Array(0);
let queue = new Int32Array(0);
let dense = new Float64Array(0);
/** views[c]: an array of c reusable squares (c <= VIEW_MAX), handed to core.load */
const VIEW_MAX = 256;
const views: Square[][] = [];
const frame: Tiling = { W: 0, H: 0, squares: [] };

function ensure(n: number, D: number): void {
  if (idx.length < n) {
    idx = new Int32Array(n);
    phi = new Float64Array(n);
    yv = new Float64Array(n);
  }
  // faces: F = 2 - n + D / 2 <= D
  if (fx.length < D) {
    fx = new Float64Array(D);
    queue = new Int32Array(D);
  }
}

/** The first len entries of a as a plain array (sized up front: about twice as fast as pushing, and far cheaper than a small typed array). */
function copyOf(a: ArrayLike<number>, len: number): number[] {
  // oxlint-disable-next-line unicorn/no-new-array -- the length is the point: one allocation of the final size
  const out = new Array<number>(len);
  for (let i = 0; i < len; i++) out[i] = a[i]!;
  return out;
}

function gcdN(a: number, b: number): number {
  if (a < 0) a = -a;
  if (b < 0) b = -b;
  while (b !== 0) {
    const t = a % b;
    a = b;
    b = t;
  }
  return a;
}

/** gcd of 0 <= a, b < 2^31 in int32 arithmetic (far cheaper than floating-point remainders). */
function gcdI(a: number, b: number): number {
  a |= 0;
  b |= 0;
  while (b !== 0) {
    const t = a % b | 0;
    a = b;
    b = t;
  }
  return a;
}

function gcdB(a: bigint, b: bigint): bigint {
  if (a < 0n) a = -a;
  if (b < 0n) b = -b;
  while (b !== 0n) [a, b] = [b, a % b];
  return a;
}

/** The denominator (at most maxDen) of the fraction within 1e-7 / den of x in (0, 1), or 0. */
function denominatorOf(x: number, maxDen: number): number {
  let h0 = 0;
  let h1 = 1;
  let k0 = 1;
  let k1 = 0;
  let v = x;
  for (let it = 0; it < 64; it++) {
    const a = Math.floor(v);
    const h2 = a * h1 + h0;
    const k2 = a * k1 + k0;
    if (k2 > maxDen) return 0;
    if (Math.abs(x * k2 - h2) < 1e-7) return k2;
    h0 = h1;
    h1 = h2;
    k0 = k1;
    k1 = k2;
    const f = v - a;
    if (f < 1e-15) return k2;
    v = 1 / f;
  }
  return 0;
}

/**
 * The reduced Laplacian of G - e without row and column q (unknown idx[v] for vertex v != q),
 * from the darts of G (first, head) and the pole darts; and `bits`, log2 of prod deg(v) over
 * v != q plus 2, rounded up: a proven bound on tau(G), which is at least every unreduced value.
 */
function laplacian(n: number, first: ArrayLike<number>, head: ArrayLike<number>, p: number, q: number, poleD: number, poleR: number): { A: SparseSymmetric; bits: number } {
  const k = n - 1;
  const ix = new Int32Array(n);
  for (let v = 0, r = 0; v < n; v++) ix[v] = v === q ? -1 : r++;
  const diag = new Float64Array(k);
  let bits = 0;
  let m = 0;
  for (let v = 0; v < n; v++) {
    if (v === q) continue;
    const deg = first[v + 1]! - first[v]!;
    bits += Math.log2(deg);
    diag[ix[v]!] = v === p ? deg - 1 : deg;
    for (let d = first[v]!; d < first[v + 1]!; d++) if (v < head[d]! && head[d] !== q && d !== poleD && d !== poleR) m++;
  }
  const offI = new Int32Array(m);
  const offJ = new Int32Array(m);
  for (let v = 0, e = 0; v < n; v++) {
    if (v === q) continue;
    for (let d = first[v]!; d < first[v + 1]!; d++) {
      const u = head[d]!;
      if (v < u && u !== q && d !== poleD && d !== poleR) {
        offI[e] = ix[v]!;
        offJ[e] = ix[u]!;
        e++;
      }
    }
  }
  return { A: { k, diag, offI, offJ, offV: new Float64Array(m).fill(-1), m }, bits: Math.ceil(bits + 2) };
}

/**
 * What the exact facts of a solved network are computed from, when first read: a copy of the
 * darts (plain arrays: far cheaper to allocate than small typed arrays).
 */
interface Source {
  n: number;
  first: number[];
  head: number[];
  p: number;
  q: number;
  poleD: number;
  poleR: number;
}

/** The solved network (ok result) with its exact BigInt facts computed when first read. */
class SolvedNetwork {
  readonly ok = true as const;
  private det: bigint | null;
  constructor(
    readonly tiling: Tiling,
    /** reduced potentials (negative pole 0) */
    private readonly phi: number[],
    private readonly W: number,
    private readonly H: number,
    exactDet: bigint | null,
    private readonly src: Source | null,
  ) {
    this.det = exactDet;
  }

  /** tau(G - e): the unreduced width */
  get fullWidth(): bigint {
    if (this.det === null) {
      const s = this.src!;
      const { A, bits } = laplacian(s.n, s.first, s.head, s.p, s.q, s.poleD, s.poleR);
      this.det = exactSolve(new EliminationPlan(A), A, -1, bits).det;
    }
    return this.det;
  }

  /** the gcd the unreduced rectangle was divided by */
  get gcd(): bigint {
    return this.fullWidth / BigInt(this.W);
  }

  /** tau(G / e): the unreduced height */
  get fullHeight(): bigint {
    return this.gcd * BigInt(this.H);
  }

  /** tau(G) = fullWidth + fullHeight */
  get spanningTrees(): bigint {
    return this.fullWidth + this.fullHeight;
  }

  /** unreduced node potentials (negative pole 0, positive pole fullHeight), by vertex */
  get potentials(): bigint[] {
    const g = this.gcd;
    return Array.from(this.phi, (v) => BigInt(v) * g);
  }

  toJSON() {
    return { ok: true, tiling: this.tiling, fullWidth: this.fullWidth, fullHeight: this.fullHeight, spanningTrees: this.spanningTrees, gcd: this.gcd, potentials: this.potentials };
  }
}

/**
 * Solves A y = e_r (A the reduced Laplacian, k unknowns, built here from the darts) by dense
 * Gaussian elimination without pivoting into yv (A is positive definite: every pivot is
 * positive); returns det A as the product of the pivots. Approximate.
 */
function denseSolve(n: number, first: Int32Array, head: Int32Array, q: number, p: number, poleD: number, poleR: number, r: number): number {
  const k = n - 1;
  if (dense.length < k * k) dense = new Float64Array(Math.max(k * k, 2 * dense.length));
  const M = dense;
  M.fill(0, 0, k * k);
  for (let v = 0; v < n; v++) {
    if (v === q) continue;
    const iv = idx[v]!;
    const row = iv * k;
    M[row + iv] = first[v + 1]! - first[v]! - (v === p ? 1 : 0);
    for (let d = first[v]!; d < first[v + 1]!; d++) {
      const u = head[d]!;
      if (u !== q && d !== poleD && d !== poleR) M[row + idx[u]!] = -1;
    }
  }
  const y = yv;
  y.fill(0, 0, k);
  y[r] = 1;
  // the active part stays symmetric, so only its upper triangle is updated: row c's entries
  // right of the diagonal are both U's row c and (by symmetry) the multipliers' numerators
  let det = 1;
  for (let c = 0; c < k; c++) {
    const rc = c * k;
    const pv = M[rc + c]!;
    det *= pv;
    const inv = 1 / pv;
    const yc = y[c]!;
    for (let i = c + 1; i < k; i++) {
      const f = M[rc + i]! * inv;
      if (f === 0) continue;
      const ri = i * k;
      for (let j = i; j < k; j++) M[ri + j] = M[ri + j]! - f * M[rc + j]!;
      y[i] = y[i]! - f * yc;
    }
  }
  for (let c = k - 1; c >= 0; c--) {
    const rc = c * k;
    let acc = y[c]!;
    for (let j = c + 1; j < k; j++) acc -= M[rc + j]! * y[j]!;
    y[c] = acc / M[rc + c]!;
  }
  return det;
}

/**
 * A candidate multiple w of the reduced width: phi = round(w y) (into `phi`) is accepted only
 * when L phi = w e_p holds exactly, every value and sum below 2^52 (cap), and then it is the
 * exact solution times w / W, whatever the rounding was (L is nonsingular: G - e is connected);
 * dividing by gcd(w, phi) gives the reduced one, whose width is returned. 0 when rejected.
 */
function trial(w: number, y: Float64Array, n: number, first: Int32Array, head: Int32Array, p: number, q: number, poleD: number, poleR: number, cap: number): number {
  if (!(w > 0 && w <= cap && Number.isInteger(w))) return 0;
  for (let v = 0; v < n; v++) {
    if (v === q) {
      phi[v] = 0;
      continue;
    }
    const x = Math.round(y[idx[v]!]! * w);
    if (!(x >= 0 && x <= cap)) return 0;
    phi[v] = x;
  }
  for (let v = 0; v < n; v++) {
    if (v === q) continue;
    let acc = 0;
    const pv = phi[v]!;
    for (let d = first[v]!; d < first[v + 1]!; d++) {
      if (d === poleD || d === poleR) continue;
      acc += pv - phi[head[d]!]!;
    }
    if (acc !== (v === p ? w : 0)) return 0;
  }
  let gg = w;
  for (let v = 0; v < n && gg !== 1; v++) {
    const x = phi[v]!;
    gg = gg < 2 ** 31 && x < 2 ** 31 ? gcdI(gg, x) : gcdN(gg, x);
  }
  if (gg !== 1) for (let v = 0; v < n; v++) phi[v] = phi[v]! / gg;
  return w / gg;
}

export function solvePlaneNetwork(g: PlaneGraph, pole: { p: number; q: number }): SolveResult {
  return solveWith(g, pole, 'auto');
}

/** solvePlaneNetwork with the floating-point guess made as `mode` says (for tests; the answer is the same). */
export function solveWith(g: PlaneGraph, pole: { p: number; q: number }, mode: SolveMode): SolveResult {
  const fail = analyseInto(g, darts);
  if (fail) return fail;
  const { n, D, tail, head, first, rev, face, faceNext, faceFirst, faceCount } = darts;
  const p = pole?.p;
  const q = pole?.q;
  if (!Number.isInteger(p) || !Number.isInteger(q) || p < 0 || q < 0 || p >= n || q >= n) {
    return { ok: false, code: 'bad-pole', message: `the poles must be vertices 0..${n - 1} (got p=${String(p)}, q=${String(q)})` };
  }
  if (p === q) return { ok: false, code: 'bad-pole', message: `the two poles must differ (both are ${p})` };
  const poleDart = g.adj[p]!.indexOf(q);
  if (poleDart < 0) return { ok: false, code: 'bad-pole', message: `there is no edge between the poles ${p} and ${q}` };
  const poleD = first[p]! + poleDart;
  const poleR = rev[poleD]!;
  // in a connected plane graph an edge is a bridge exactly when one face lies on both its sides
  if (face[poleD] === face[poleR]) {
    return { ok: false, code: 'disconnected', message: `removing the pole edge ${p}-${q} disconnects the network (no spanning tree of G - e)` };
  }
  // from here on G - e is connected, so its reduced Laplacian L is positive definite

  const k = n - 1;
  ensure(n, D);
  for (let v = 0, r = 0; v < n; v++) idx[v] = v === q ? -1 : r++;
  // the sparse system and its elimination plan, built only when needed (no closures here:
  // the hot path allocates as little as it can)
  let built: { A: SparseSymmetric; bits: number } | null = null;
  let planned: EliminationPlan | null = null;

  // reduced potentials phi (q = 0) and width W: doubles with an exact check, else exact
  let W = 0;
  let exactDet: bigint | null = null;
  const ip = idx[p]!;
  if (mode !== 'exact') {
    let y: Float64Array;
    let det: number;
    if (mode === 'dense' || (mode === 'auto' && k <= DENSE_MAX)) {
      det = denseSolve(n, first, head, q, p, poleD, poleR, ip);
      y = yv;
    } else {
      built = laplacian(n, first, head, p, q, poleD, poleR);
      planned = new EliminationPlan(built.A);
      const fl = floatSolve(planned, built.A, ip);
      y = fl.y;
      det = Math.exp(fl.logDet);
    }
    let maxDeg = 1;
    for (let v = 0; v < n; v++) if (first[v + 1]! - first[v]! > maxDeg) maxDeg = first[v + 1]! - first[v]!;
    const cap = Math.floor(2 ** 52 / (maxDeg + 1));
    // first the determinant as the product of the pivots (exact after rounding while it is
    // well below 2^52), then the common denominator of the y_v by continued fractions
    W = det < cap ? trial(Math.round(det), y, n, first, head, p, q, poleD, poleR, cap) : 0;
    if (W === 0) {
      let w = 1;
      for (let t = 0; t < k && w > 0; t++) {
        const v = t === 0 ? ip : t <= ip ? t - 1 : t;
        const x = y[v]! * w;
        if (!(x >= -1e-9) || x > LIMIT) {
          w = 0;
          break;
        }
        const f = x - Math.floor(x);
        if (f < 1e-7 || f > 1 - 1e-7) continue;
        const den = denominatorOf(f, Math.floor(LIMIT / w));
        w = den === 0 ? 0 : w * den;
      }
      W = trial(w, y, n, first, head, p, q, poleD, poleR, cap);
    }
  }
  if (W === 0) {
    built ??= laplacian(n, first, head, p, q, poleD, poleR);
    planned ??= new EliminationPlan(built.A);
    const ex = exactSolve(planned, built.A, ip, built.bits);
    if (ex.det === 0n) {
      return { ok: false, code: 'disconnected', message: `removing the pole edge ${p}-${q} disconnects the network (no spanning tree of G - e)` };
    }
    let gg = ex.det;
    for (const x of ex.x) gg = gcdB(gg, x);
    const Wb = ex.det / gg;
    const Hb = ex.x[ip]! / gg;
    if (Wb > BigInt(LIMIT) || Hb > BigInt(LIMIT)) {
      return { ok: false, code: 'too-large', message: `the reduced rectangle ${Wb} x ${Hb} exceeds the limit of 2^31 per side` };
    }
    W = Number(Wb);
    for (let v = 0; v < n; v++) phi[v] = v === q ? 0 : Number(ex.x[idx[v]!]! / gg);
    exactDet = ex.det;
  }
  const H = phi[p]!;
  if (H > LIMIT || W > LIMIT) {
    return { ok: false, code: 'too-large', message: `the reduced rectangle ${W} x ${H} exceeds the limit of 2^31 per side` };
  }
  for (let d = 0; d < D; d++) {
    if (d === poleD || d === poleR) continue;
    const u = tail[d]!;
    const v = head[d]!;
    if (phi[u] === phi[v]) {
      return {
        ok: false,
        code: 'zero-current',
        message: `edge ${u}-${v} carries no current (both ends at the same potential, ${phi[u]} of ${H} in reduced units): this pole choice gives no squared rectangle`,
      };
    }
  }

  // face potentials (x): for a non-pole edge hi -> lo, x(face(lo->hi)) = x(face(hi->lo)) + size
  fx.fill(NaN, 0, faceCount);
  fx[face[poleD]!] = 0;
  queue[0] = face[poleD]!;
  let qn = 1;
  let minX = 0;
  for (let qi = 0; qi < qn; qi++) {
    const f = queue[qi]!;
    const xf = fx[f]!;
    const d0 = faceFirst[f]!;
    let d = d0;
    do {
      if (d !== poleD && d !== poleR) {
        const other = face[rev[d]!]!;
        const want = xf + phi[tail[d]!]! - phi[head[d]!]!;
        const seen = fx[other]!;
        if (Number.isNaN(seen)) {
          fx[other] = want;
          if (want < minX) minX = want;
          queue[qn++] = other;
        } else if (seen !== want) {
          return { ok: false, code: 'not-plane', message: `the face potentials are inconsistent at edge ${tail[d]}-${head[d]}: the rotation system is not a plane embedding of this network` };
        }
      }
      d = faceNext[d]!;
    } while (d !== d0);
  }
  for (let f = 0; f < faceCount; f++) {
    if (Number.isNaN(fx[f]!)) return { ok: false, code: 'not-plane', message: `face ${f} cannot be reached from the pole faces` };
  }
  // one square per non-pole edge (none carries zero current), each taken from its high end
  const count = D / 2 - 1;
  let squares: Square[];
  if (count <= VIEW_MAX) {
    squares = views[count] ??= Array.from({ length: count }, () => ({ x: 0, y: 0, s: 0 }));
  } else squares = Array.from({ length: count }, () => ({ x: 0, y: 0, s: 0 }));
  let c = 0;
  for (let d = 0; d < D; d++) {
    if (d === poleD || d === poleR) continue;
    const hi = tail[d]!;
    const diff = phi[hi]! - phi[head[d]!]!;
    if (diff <= 0) continue;
    const x1 = fx[face[d]!]!;
    const x2 = fx[face[rev[d]!]!]!;
    const sq = squares[c++]!;
    sq.x = (x1 < x2 ? x1 : x2) - minX;
    sq.y = H - phi[hi]!;
    sq.s = diff;
  }
  // the decode check: the squares tile the W x H frame exactly (also puts them in reading order)
  frame.W = W;
  frame.H = H;
  frame.squares = squares;
  const tiles = core.load(frame);
  frame.squares = [];
  if (!tiles) {
    return { ok: false, code: 'not-plane', message: `the solved squares do not tile the rectangle; the rotation system is probably not a plane embedding of a c-net` };
  }
  let src: Source | null = null;
  if (exactDet === null) {
    src = { n, first: copyOf(first, n + 1), head: copyOf(head, D), p, q, poleD, poleR };
  }
  return new SolvedNetwork(core.tiling(), copyOf(phi, n), W, H, exactDet, src);
}
