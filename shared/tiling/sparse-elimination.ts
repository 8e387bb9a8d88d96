// Symmetric sparse elimination for reduced Laplacians (the Kirchhoff systems of c-nets):
// one symbolic phase (a minimum-degree order and the fill it causes; common practice: Tinney
// & Walker 1967; George & Liu, "Computer Solution of Large Sparse Positive Definite Systems",
// 1981) serves several numeric phases: an LDL^T factorisation in floating point, and the same
// modulo primes below 2^26 (every product below 2^52, exact in Numbers). Exact integers come
// from the residues by the Chinese remainder theorem (Garner's mixed radix) with enough primes
// to pass a proven bound, so nothing here is approximate unless its name says float.

/** Primes just below 2^26, largest first (computed once on demand). */
const PRIMES: number[] = [];
export function prime(i: number): number {
  let c = PRIMES.length === 0 ? 2 ** 26 - 1 : PRIMES[PRIMES.length - 1]! - 2;
  while (PRIMES.length <= i) {
    let isPrime = c % 2 !== 0;
    for (let d = 3; isPrime && d * d <= c; d += 2) if (c % d === 0) isPrime = false;
    if (isPrime) PRIMES.push(c);
    c -= 2;
  }
  return PRIMES[i]!;
}

export function invmod(a: number, p: number): number {
  let r0 = a;
  let r1 = p;
  let s0 = 1;
  let s1 = 0;
  while (r1 !== 0) {
    const q = Math.floor(r0 / r1);
    const r2 = r0 - q * r1;
    r0 = r1;
    r1 = r2;
    const s2 = s0 - q * s1;
    s0 = s1;
    s1 = s2;
  }
  return ((s0 % p) + p) % p;
}

/**
 * A symmetric matrix with the sparsity of a graph: diag[0..k) and off-diagonal entries
 * (i, j, value), each unordered pair once.
 */
export interface SparseSymmetric {
  k: number;
  diag: Float64Array;
  offI: Int32Array;
  offJ: Int32Array;
  offV: Float64Array;
  /** number of off-diagonal entries */
  m: number;
}

/** The elimination plan: order, the later neighbours of each pivot (with fill) and the update operations. */
export class EliminationPlan {
  readonly k: number;
  /** order[t] = the vertex eliminated at step t */
  readonly order: Int32Array;
  /** later neighbours of the pivot of step t: nbr[start[t] .. start[t+1]) (vertices); one value slot each */
  readonly start: Int32Array;
  readonly nbr: Int32Array;
  /** update operations of step t: opStart[t] .. opStart[t+1]; slots a, b and the target (slot, or -1 - vertex for a diagonal) */
  readonly opStart: Int32Array;
  readonly opA: Int32Array;
  readonly opB: Int32Array;
  readonly opT: Int32Array;
  /** slot of each off-diagonal input entry */
  readonly offSlot: Int32Array;

  constructor(a: SparseSymmetric) {
    const k = a.k;
    this.k = k;
    const adj: number[][] = Array.from({ length: k }, () => []);
    const words = (k + 31) >>> 5;
    const bits = new Uint32Array(k * words);
    const has = (x: number, y: number) => (bits[x * words + (y >>> 5)]! & (1 << (y & 31))) !== 0;
    const link = (x: number, y: number) => {
      bits[x * words + (y >>> 5)]! |= 1 << (y & 31);
      bits[y * words + (x >>> 5)]! |= 1 << (x & 31);
      adj[x]!.push(y);
      adj[y]!.push(x);
    };
    for (let e = 0; e < a.m; e++) {
      const i = a.offI[e]!;
      const j = a.offJ[e]!;
      if (i !== j && !has(i, j)) link(i, j);
    }
    const gone = new Uint8Array(k);
    const deg = new Int32Array(k);
    for (let v = 0; v < k; v++) deg[v] = adj[v]!.length;
    const order = new Int32Array(k);
    const lists: number[][] = [];
    for (let t = 0; t < k; t++) {
      let v = -1;
      let best = Infinity;
      for (let u = 0; u < k; u++) if (!gone[u] && deg[u]! < best) { best = deg[u]!; v = u; }
      order[t] = v;
      gone[v] = 1;
      const N = adj[v]!.filter((u) => !gone[u]);
      lists.push(N);
      for (let x = 0; x < N.length; x++) {
        const a1 = N[x]!;
        deg[a1]!--;
        for (let y = x + 1; y < N.length; y++) {
          const b1 = N[y]!;
          if (!has(a1, b1)) {
            link(a1, b1);
            deg[a1]!++;
            deg[b1]!++;
          }
        }
      }
    }
    this.order = order;
    const start = new Int32Array(k + 1);
    for (let t = 0; t < k; t++) start[t + 1] = start[t]! + lists[t]!.length;
    const nbr = new Int32Array(start[k]!);
    const slotOf = new Map<number, number>();
    for (let t = 0; t < k; t++) {
      const v = order[t]!;
      const N = lists[t]!;
      for (let x = 0; x < N.length; x++) {
        const s = start[t]! + x;
        nbr[s] = N[x]!;
        const u = N[x]!;
        slotOf.set(v < u ? v * k + u : u * k + v, s);
      }
    }
    this.start = start;
    this.nbr = nbr;
    let ops = 0;
    for (let t = 0; t < k; t++) {
      const d = lists[t]!.length;
      ops += (d * (d + 1)) / 2;
    }
    const opStart = new Int32Array(k + 1);
    const opA = new Int32Array(ops);
    const opB = new Int32Array(ops);
    const opT = new Int32Array(ops);
    let o = 0;
    for (let t = 0; t < k; t++) {
      opStart[t] = o;
      const s0 = start[t]!;
      const d = start[t + 1]! - s0;
      for (let x = 0; x < d; x++) {
        const ax = nbr[s0 + x]!;
        for (let y = x; y < d; y++) {
          const by = nbr[s0 + y]!;
          opA[o] = s0 + x;
          opB[o] = s0 + y;
          opT[o] = x === y ? -1 - ax : slotOf.get(ax < by ? ax * k + by : by * k + ax)!;
          o++;
        }
      }
    }
    opStart[k] = o;
    this.opStart = opStart;
    this.opA = opA;
    this.opB = opB;
    this.opT = opT;
    const offSlot = new Int32Array(a.m);
    for (let e = 0; e < a.m; e++) {
      const i = a.offI[e]!;
      const j = a.offJ[e]!;
      offSlot[e] = i === j ? -1 : slotOf.get(i < j ? i * k + j : j * k + i)!;
    }
    this.offSlot = offSlot;
  }

  /** The most later neighbours of any pivot. */
  get maxDegree(): number {
    let m = 0;
    for (let t = 0; t < this.k; t++) m = Math.max(m, this.start[t + 1]! - this.start[t]!);
    return m;
  }

  /** Number of stored entries (off-diagonal, with fill). */
  get size(): number {
    return this.nbr.length;
  }
}

/**
 * Solves A y = e_r in floating point by LDL^T along the plan; also the natural logarithm of
 * det A (every pivot of a positive definite matrix is positive). Approximate.
 */
export function floatSolve(plan: EliminationPlan, a: SparseSymmetric, r: number): { y: Float64Array; logDet: number } {
  const k = plan.k;
  const d = Float64Array.from(a.diag.subarray(0, k));
  const s = new Float64Array(plan.size);
  for (let e = 0; e < a.m; e++) {
    const sl = plan.offSlot[e]!;
    if (sl >= 0) s[sl] = s[sl]! + a.offV[e]!;
  }
  const { order, start, nbr, opStart, opA, opB, opT } = plan;
  let logDet = 0;
  for (let t = 0; t < k; t++) {
    const v = order[t]!;
    const pv = d[v]!;
    logDet += Math.log(pv);
    const inv = 1 / pv;
    for (let o = opStart[t]!; o < opStart[t + 1]!; o++) {
      const c = s[opA[o]!]! * s[opB[o]!]! * inv;
      const tg = opT[o]!;
      if (tg < 0) d[-1 - tg] = d[-1 - tg]! - c;
      else s[tg] = s[tg]! - c;
    }
    for (let sl = start[t]!; sl < start[t + 1]!; sl++) s[sl] = s[sl]! * inv;
  }
  const y = new Float64Array(k);
  y[r] = 1;
  for (let t = 0; t < k; t++) {
    const v = order[t]!;
    const yv = y[v]!;
    if (yv !== 0) for (let sl = start[t]!; sl < start[t + 1]!; sl++) y[nbr[sl]!] = y[nbr[sl]!]! - s[sl]! * yv;
  }
  for (let v = 0; v < k; v++) y[v] = y[v]! / d[v]!;
  for (let t = k - 1; t >= 0; t--) {
    const v = order[t]!;
    let acc = y[v]!;
    for (let sl = start[t]!; sl < start[t + 1]!; sl++) acc -= s[sl]! * y[nbr[sl]!]!;
    y[v] = acc;
  }
  return { y, logDet };
}

/**
 * det A mod p and, when r >= 0, x = det(A) * A^-1 e_r mod p (the adjugate's column r).
 * Null when a pivot vanishes modulo p (use another prime).
 */
export function modularSolve(plan: EliminationPlan, a: SparseSymmetric, r: number, p: number, x: Float64Array | null): number | null {
  const k = plan.k;
  const d = new Float64Array(k);
  for (let v = 0; v < k; v++) d[v] = ((a.diag[v]! % p) + p) % p;
  const s = new Float64Array(plan.size);
  for (let e = 0; e < a.m; e++) {
    const sl = plan.offSlot[e]!;
    if (sl >= 0) s[sl] = (((s[sl]! + a.offV[e]!) % p) + p) % p;
  }
  const { order, start, nbr, opStart, opA, opB, opT } = plan;
  const lsc = new Float64Array(plan.maxDegree);
  let det = 1;
  for (let t = 0; t < k; t++) {
    const v = order[t]!;
    const pv = d[v]!;
    if (pv === 0) return null;
    det = (det * pv) % p;
    const inv = invmod(pv, p);
    // l_b = s_b / pv; every update s_a * s_b / pv = s_a * l_b is one product
    const s0 = start[t]!;
    const d1 = start[t + 1]! - s0;
    for (let x1 = 0; x1 < d1; x1++) lsc[x1] = (s[s0 + x1]! * inv) % p;
    for (let o = opStart[t]!; o < opStart[t + 1]!; o++) {
      const c = (s[opA[o]!]! * lsc[opB[o]! - s0]!) % p;
      const tg = opT[o]!;
      if (tg < 0) {
        const w = d[-1 - tg]! - c;
        d[-1 - tg] = w < 0 ? w + p : w;
      } else {
        const w = s[tg]! - c;
        s[tg] = w < 0 ? w + p : w;
      }
    }
    for (let x1 = 0; x1 < d1; x1++) s[s0 + x1] = lsc[x1]!;
  }
  if (x === null || r < 0) return det;
  x.fill(0, 0, k);
  x[r] = 1;
  for (let t = 0; t < k; t++) {
    const v = order[t]!;
    const xv = x[v]!;
    if (xv !== 0) {
      for (let sl = start[t]!; sl < start[t + 1]!; sl++) {
        const u = nbr[sl]!;
        const w = (x[u]! - ((s[sl]! * xv) % p)) % p;
        x[u] = w < 0 ? w + p : w;
      }
    }
  }
  for (let v = 0; v < k; v++) x[v] = (x[v]! * invmod(d[v]!, p)) % p;
  for (let t = k - 1; t >= 0; t--) {
    const v = order[t]!;
    let acc = x[v]!;
    for (let sl = start[t]!; sl < start[t + 1]!; sl++) {
      acc = (acc - ((s[sl]! * x[nbr[sl]!]!) % p)) % p;
      if (acc < 0) acc += p;
    }
    x[v] = acc;
  }
  for (let v = 0; v < k; v++) x[v] = (x[v]! * det) % p;
  return det;
}

/** Garner's mixed-radix reconstruction of integers in [0, prod p) from residues r[i][j] (value j modulo prime i). */
export function crt(primes: readonly number[], residues: readonly Float64Array[], count: number): bigint[] {
  const r = primes.length;
  // inv[i][j] = p_j^-1 mod p_i for j < i
  const inv: number[][] = [];
  for (let i = 0; i < r; i++) {
    const row: number[] = [];
    for (let j = 0; j < i; j++) row.push(invmod(primes[j]! % primes[i]!, primes[i]!));
    inv.push(row);
  }
  const bigP = primes.map((p) => BigInt(p));
  const out: bigint[] = [];
  const digit = new Float64Array(r);
  for (let v = 0; v < count; v++) {
    for (let i = 0; i < r; i++) {
      const pi = primes[i]!;
      let t = residues[i]![v]!;
      for (let j = 0; j < i; j++) {
        t = ((t - digit[j]!) % pi) * inv[i]![j]!;
        t %= pi;
        if (t < 0) t += pi;
      }
      digit[i] = t;
    }
    let x = BigInt(digit[r - 1]!);
    for (let i = r - 2; i >= 0; i--) x = x * bigP[i]! + BigInt(digit[i]!);
    out.push(x);
  }
  return out;
}

/**
 * Exact det A and, when r >= 0, det(A) * A^-1 e_r, given a proven bound 2^bits on the
 * absolute values of all of them (det >= 0 and the solution entries >= 0 for reduced
 * Laplacians; the bound is then on their size).
 */
export function exactSolve(plan: EliminationPlan, a: SparseSymmetric, r: number, bits: number): { det: bigint; x: bigint[] } {
  const k = plan.k;
  const need = Math.ceil((bits + 1) / 25.9) + 1;
  const primes: number[] = [];
  const residues: Float64Array[] = [];
  for (let i = 0; primes.length < need; i++) {
    // a positive definite integer matrix has nonzero leading minors, so only finitely many
    // primes fail; this many failures means the matrix is singular, which callers rule out
    if (i >= need + 64) throw new Error('exactSolve: the matrix is singular modulo every prime tried');
    const p = prime(i);
    const x = new Float64Array(k + 1);
    const det = modularSolve(plan, a, r, p, r >= 0 ? x : null);
    if (det === null) continue;
    x[k] = det;
    primes.push(p);
    residues.push(x);
  }
  const all = r >= 0 ? crt(primes, residues, k + 1) : crt(primes, residues.map((x) => Float64Array.of(x[k]!)), 1);
  return r >= 0 ? { det: all[k]!, x: all.slice(0, k) } : { det: all[0]!, x: [] };
}

/**
 * Solves A y = e_r in floating point by dense Gaussian elimination without pivoting (A
 * symmetric positive definite, so every pivot is positive); for small k, where building an
 * elimination plan costs more than the dense work. Approximate.
 */
export function denseFloatSolve(a: SparseSymmetric, r: number): { y: Float64Array; logDet: number } {
  const k = a.k;
  const M = new Float64Array(k * k);
  for (let v = 0; v < k; v++) M[v * k + v] = a.diag[v]!;
  for (let e = 0; e < a.m; e++) {
    const i = a.offI[e]!;
    const j = a.offJ[e]!;
    M[i * k + j] = M[i * k + j]! + a.offV[e]!;
    M[j * k + i] = M[j * k + i]! + a.offV[e]!;
  }
  const y = new Float64Array(k);
  y[r] = 1;
  let logDet = 0;
  for (let c = 0; c < k; c++) {
    const rc = c * k;
    logDet += Math.log(M[rc + c]!);
    const inv = 1 / M[rc + c]!;
    for (let i = c + 1; i < k; i++) {
      const f = M[i * k + c]! * inv;
      if (f === 0) continue;
      const ri = i * k;
      for (let j = c + 1; j < k; j++) M[ri + j] = M[ri + j]! - f * M[rc + j]!;
      y[i] = y[i]! - f * y[c]!;
    }
  }
  for (let c = k - 1; c >= 0; c--) {
    const rc = c * k;
    let acc = y[c]!;
    for (let j = c + 1; j < k; j++) acc -= M[rc + j]! * y[j]!;
    y[c] = acc / M[rc + c]!;
  }
  return { y, logDet };
}
