// Every pole choice of one c-net at once (Brooks, Smith, Stone & Tutte, Duke Math. J. 7
// (1940)). With A = adj(L) the adjugate of the Laplacian L of G with one vertex grounded
// (an integer matrix; det L = tau(G), the number of spanning trees, by the matrix-tree
// theorem), injecting tau(G) units of current at p and taking them out at q puts vertex v at
// potential A[v][p] - A[v][q]. With the edge pq present, it carries the potential drop
// A[p][p] + A[q][q] - 2 A[p][q] = tau(G / pq) and the rest of the network the remaining
// tau(G) - tau(G / pq) = tau(G - pq): the squared rectangle of pole edge pq is
// tau(G - pq) wide and tau(G / pq) high, its squares the potential drops across the other
// edges. One elimination serves every pole edge: a square needs only
// 2 tau(G / pq) = tau(G), an O(1) test per edge, before anything is laid out.
// The adjugate comes from Bareiss' fraction-free elimination in Numbers (every entry a minor,
// every division exact), refused (false) as soon as a value might pass 2^53; the caller then
// solves that graph the general way.
import type { Square, Tiling } from '../tiling/index';
import type { PlaneMap } from './plane-map';

const SAFE = 2 ** 53;

function gcd(a: number, b: number): number {
  if (a < 0) a = -a;
  if (b < 0) b = -b;
  while (b !== 0) {
    const t = a % b;
    a = b;
    b = t;
  }
  return a;
}

export class MapSolver {
  /** tau(G) of the last adjugate */
  tau = 0;
  /** order of the reduced matrix (vertices - 1; vertex n - 1 is grounded) */
  private k = 0;
  private a = new Float64Array(0);
  private adj = new Float64Array(0);
  private pot = new Float64Array(0);
  private fx = new Float64Array(0);
  private queue = new Int32Array(0);

  /** Computes the adjugate of m's grounded Laplacian; false when Numbers might not be exact. */
  adjugate(m: PlaneMap): boolean {
    const n = m.n;
    const k = n - 1;
    this.k = k;
    const cols = 2 * k;
    if (this.a.length < k * cols) {
      this.a = new Float64Array(k * cols * 2);
      this.adj = new Float64Array(n * n * 2);
      this.pot = new Float64Array(n * 2);
    }
    const a = this.a;
    a.fill(0, 0, k * cols);
    const { tail, head, D } = m;
    for (let d = 0; d < D; d++) {
      const u = tail[d]!;
      if (u === k) continue;
      a[u * cols + u]! += 1;
      const v = head[d]!;
      if (v !== k) a[u * cols + v] = -1;
    }
    for (let i = 0; i < k; i++) a[i * cols + k + i] = 1;
    // forward elimination (pivots are leading principal minors of a reduced Laplacian: > 0);
    // `bound` bounds every entry, so p * x - f * y stays exact while 2 bound^2 < 2^53
    let prev = 1;
    let bound = 0;
    for (let i = 0; i < k; i++) if (a[i * cols + i]! > bound) bound = a[i * cols + i]!;
    for (let s = 0; s < k - 1; s++) {
      if (2 * bound * bound >= SAFE) return false;
      const ps = s * cols;
      const p = a[ps + s]!;
      for (let i = s + 1; i < k; i++) {
        const pi = i * cols;
        const f = a[pi + s]!;
        if (f === 0) {
          for (let j = s + 1; j < cols; j++) {
            const v = (p * a[pi + j]!) / prev;
            a[pi + j] = v;
            if (v > bound) bound = v;
            else if (-v > bound) bound = -v;
          }
          continue;
        }
        for (let j = s + 1; j < cols; j++) {
          const v = (p * a[pi + j]! - f * a[ps + j]!) / prev;
          a[pi + j] = v;
          if (v > bound) bound = v;
          else if (-v > bound) bound = -v;
        }
        a[pi + s] = 0;
      }
      prev = p;
    }
    const det = a[(k - 1) * cols + k - 1]!;
    if (!(det > 0)) return false;
    this.tau = det;
    // back substitution for each column of the identity: X = det * L^-1 (integral)
    const adj = this.adj;
    for (let c = 0; c < k; c++) {
      for (let i = k - 1; i >= 0; i--) {
        const pi = i * cols;
        let acc = det * a[pi + k + c]!;
        if (acc >= SAFE || acc <= -SAFE) return false;
        for (let j = i + 1; j < k; j++) {
          const x = a[pi + j]!;
          if (x === 0) continue;
          const prod = x * adj[j * n + c]!;
          if (prod >= SAFE || prod <= -SAFE) return false;
          acc -= prod;
        }
        if (acc >= SAFE || acc <= -SAFE) return false;
        const xi = acc / a[pi + i]!;
        if (!Number.isInteger(xi)) return false;
        adj[i * n + c] = xi;
      }
    }
    for (let i = 0; i < n; i++) {
      adj[i * n + k] = 0;
      adj[k * n + i] = 0;
    }
    return true;
  }

  /** tau(G / pq) for the edge pq (the unreduced height of its rectangle). */
  height(p: number, q: number, n: number): number {
    const A = this.adj;
    return A[p * n + p]! + A[q * n + q]! - 2 * A[p * n + q]!;
  }

  /**
   * The squared rectangle of pole dart pd (from the positive pole p to q), or null when some
   * other edge carries no current. Faces of m must be computed. The squares come in dart order.
   */
  tiling(m: PlaneMap, pd: number): Tiling | null {
    const n = m.n;
    const A = this.adj;
    const { tail, head, rev, face, next, D, F } = m;
    const p = tail[pd]!;
    const q = head[pd]!;
    const pot = this.pot;
    for (let v = 0; v < n; v++) pot[v] = A[v * n + p]! - A[v * n + q]!;
    const pr = rev[pd]!;
    const Hfull = pot[p]! - pot[q]!;
    const Wfull = this.tau - Hfull;
    let g = gcd(Wfull, Hfull);
    for (let d = 0; d < D; d++) {
      if (d === pd || d === pr) continue;
      const diff = pot[tail[d]!]! - pot[head[d]!]!;
      if (diff === 0) return null;
      if (diff > 0) g = gcd(g, diff);
    }
    // face potentials (x): x(face(rev d)) = x(face(d)) + drop along d
    if (this.fx.length < F) {
      this.fx = new Float64Array(2 * F);
      this.queue = new Int32Array(2 * F);
    }
    const fx = this.fx;
    fx.fill(NaN, 0, F);
    const queue = this.queue;
    fx[face[pd]!] = 0;
    queue[0] = face[pd]!;
    let qn = 1;
    let minX = 0;
    const firstOf = m.ffirst;
    for (let qi = 0; qi < qn; qi++) {
      const f = queue[qi]!;
      const xf = fx[f]!;
      const d0 = firstOf[f]!;
      let d = d0;
      do {
        if (d !== pd && d !== pr) {
          const other = face[rev[d]!]!;
          if (Number.isNaN(fx[other]!)) {
            const want = xf + pot[tail[d]!]! - pot[head[d]!]!;
            fx[other] = want;
            if (want < minX) minX = want;
            queue[qn++] = other;
          }
        }
        d = next[rev[d]!]!;
      } while (d !== d0);
    }
    const squares: Square[] = [];
    const top = pot[p]!;
    for (let d = 0; d < D; d++) {
      if (d === pd || d === pr) continue;
      const hi = tail[d]!;
      const diff = pot[hi]! - pot[head[d]!]!;
      if (diff <= 0) continue;
      const x1 = fx[face[d]!]!;
      const x2 = fx[face[rev[d]!]!]!;
      squares.push({ x: ((x1 < x2 ? x1 : x2) - minX) / g, y: (top - pot[hi]!) / g, s: diff / g });
    }
    return { W: Wfull / g, H: Hfull / g, squares };
  }
}
