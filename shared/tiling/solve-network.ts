// From a plane network and a pole edge to a squared rectangle, solving Kirchhoff's
// equations exactly (Brooks, Smith, Stone & Tutte, "The dissection of rectangles into
// squares", Duke Math. J. 7 (1940)). With L the reduced Laplacian of G - e (row and column of
// the negative pole q deleted), L x = det(L) e_p has integer solutions: det(L) = tau(G - e) is
// the unreduced width, x_p = tau(G / e) the unreduced height (matrix-tree theorem), and the
// node potentials x give the sizes as differences; x positions are face potentials found by a
// walk over the faces; everything is divided by the gcd.
//
// How it is solved (sparse-elimination.ts, one symbolic elimination per call): the reduced
// solution phi = x / gcd with width W = det / gcd is the unique integer solution of
// L phi = W e_p whose entries and W have no common factor. A floating-point LDL^T solve
// y = L^-1 e_p gives W as the common denominator of the y_v (continued fractions), phi = W y
// rounded, and then L phi = W e_p is checked in exact integer arithmetic: when it holds, the
// answer is exact whatever the rounding was. When it does not (sides near or past 2^31, where
// doubles run out), the exact solution comes from elimination modulo primes and the Chinese
// remainder theorem, with enough primes for a proven bound. The full width, height, number of
// spanning trees and unreduced potentials are exact BigInts, computed when first read.

import { analysePlaneGraph } from './plane-graph';
import { denseFloatSolve, EliminationPlan, exactSolve, floatSolve, type SparseSymmetric } from './sparse-elimination';
import { core } from './tiling-core';
import type { PlaneGraph, SolveResult, Square, Tiling } from './types';

/** Largest reduced side a solve gives as a tiling (the engine's MAX_SIDE). */
const LIMIT = 2 ** 31;
/** Up to this many unknowns the floating-point solve is dense (cheaper than planning the sparse one). */
const DENSE_MAX = 40;

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

/** The solved network (ok result) with its exact BigInt facts computed when first read. */
class SolvedNetwork {
  readonly ok = true as const;
  private det: bigint | null;
  constructor(
    readonly tiling: Tiling,
    /** reduced potentials (negative pole 0) */
    private readonly phi: Float64Array,
    private readonly W: number,
    private readonly H: number,
    exactDet: bigint | null,
    private readonly plan: () => EliminationPlan,
    private readonly A: SparseSymmetric,
    private readonly bits: number,
  ) {
    this.det = exactDet;
  }

  /** tau(G - e): the unreduced width */
  get fullWidth(): bigint {
    this.det ??= exactSolve(this.plan(), this.A, -1, this.bits).det;
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

export function solvePlaneNetwork(g: PlaneGraph, pole: { p: number; q: number }): SolveResult {
  const check = analysePlaneGraph(g);
  if (!check.ok) return check;
  const { n } = g;
  const { tail, head, first, rev, face, faceNext, faceFirst, faceCount } = check.darts;
  const D = tail.length;
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

  // reduced Laplacian of G - e without row/column q
  const k = n - 1;
  const idx = new Int32Array(n);
  for (let v = 0, r = 0; v < n; v++) idx[v] = v === q ? -1 : r++;
  const diag = new Float64Array(k);
  const offI: number[] = [];
  const offJ: number[] = [];
  let bits = 0; // log2 of prod deg(v), v != q: a proven bound on tau(G) >= every unreduced value
  for (let v = 0; v < n; v++) {
    if (v === q) continue;
    const deg = first[v + 1]! - first[v]!;
    bits += Math.log2(deg);
    diag[idx[v]!] = v === p ? deg - 1 : deg;
  }
  for (let d = 0; d < D; d++) {
    if (d === poleD || d === poleR) continue;
    const u = tail[d]!;
    const v = head[d]!;
    if (u < v && u !== q && v !== q) {
      offI.push(idx[u]!);
      offJ.push(idx[v]!);
    }
  }
  const m = offI.length;
  const A: SparseSymmetric = { k, diag, offI: Int32Array.from(offI), offJ: Int32Array.from(offJ), offV: new Float64Array(m).fill(-1), m };
  let planned: EliminationPlan | null = null;
  const plan = () => (planned ??= new EliminationPlan(A));
  bits = Math.ceil(bits + 2);

  // reduced potentials phi (q = 0) and width W: doubles with an exact check, else exact
  const phi = new Float64Array(n);
  let W = 0;
  let exactDet: bigint | null = null;
  const ip = idx[p]!;
  {
    const fl = k <= DENSE_MAX ? denseFloatSolve(A, ip) : floatSolve(plan(), A, ip);
    const y = fl.y;
    // a candidate multiple w of the reduced width: phi = round(w y) is accepted only when
    // L phi = w e_p holds exactly (every sum below 2^53), and then it is the exact solution
    // times w / W, whatever the rounding was; dividing by the gcd gives the reduced one
    let maxDeg = 1;
    for (let v = 0; v < n; v++) maxDeg = Math.max(maxDeg, first[v + 1]! - first[v]!);
    const cap = Math.floor(2 ** 52 / (maxDeg + 1));
    const trial = (w: number): boolean => {
      if (!(w > 0 && w <= cap && Number.isInteger(w))) return false;
      for (let v = 0; v < n; v++) {
        if (v === q) continue;
        const x = Math.round(y[idx[v]!]! * w);
        if (!(x >= 0 && x <= cap)) return false;
        phi[v] = x;
      }
      for (let v = 0; v < n; v++) {
        if (v === q) continue;
        let acc = 0;
        for (let d = first[v]!; d < first[v + 1]!; d++) {
          if (d === poleD || d === poleR) continue;
          acc += phi[v]! - phi[head[d]!]!;
        }
        if (acc !== (v === p ? w : 0)) return false;
      }
      let gg = w;
      for (let v = 0; v < n && gg !== 1; v++) gg = gcdN(gg, phi[v]!);
      if (gg !== 1) for (let v = 0; v < n; v++) phi[v] = phi[v]! / gg;
      W = w / gg;
      return true;
    };
    // first the common denominator of the y_v by continued fractions (small sides), then the
    // determinant as estimated from the pivots (larger sides while doubles hold it)
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
    if (!trial(w)) {
      W = 0;
      if (fl.logDet < 52 * Math.LN2 && !trial(Math.round(Math.exp(fl.logDet)))) W = 0;
    }
  }
  if (W === 0) {
    const ex = exactSolve(plan(), A, ip, bits);
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
  const fx = new Float64Array(faceCount).fill(NaN);
  fx[face[poleD]!] = 0;
  const queue = new Int32Array(faceCount);
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
  const squares: Square[] = [];
  for (let d = 0; d < D; d++) {
    if (d === poleD || d === poleR) continue;
    const hi = tail[d]!;
    const diff = phi[hi]! - phi[head[d]!]!;
    if (diff <= 0) continue; // take each edge once, from its high end
    const x1 = fx[face[d]!]!;
    const x2 = fx[face[rev[d]!]!]!;
    squares.push({ x: (x1 < x2 ? x1 : x2) - minX, y: H - phi[hi]!, s: diff });
  }
  // the decode check: the squares tile the W x H frame exactly (also puts them in reading order)
  if (!core.load({ W, H, squares })) {
    return { ok: false, code: 'not-plane', message: `the solved squares do not tile the rectangle; the rotation system is probably not a plane embedding of a c-net` };
  }
  return new SolvedNetwork(core.tiling(), phi, W, H, exactDet, plan, A, bits);
}
