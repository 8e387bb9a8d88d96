// From a plane network and a pole edge to a squared rectangle, solving Kirchhoff's
// equations exactly (Brooks, Smith, Stone & Tutte, "The dissection of rectangles into
// squares", Duke Math. J. 7 (1940)). The reduced Laplacian of G - e (row and column of the
// negative pole q deleted) is solved for current D = det = tau(G - e) entering at p by
// Bareiss elimination; node potentials are then integers and the positive pole's potential is
// tau(G / e) (matrix-tree theorem). Sizes are potential differences; x positions are face
// potentials found by a walk over the faces; everything is divided by the gcd and re-verified.

import { bareissSolve, bareissSolveNumber } from './bareiss';
import { analysePlaneGraph } from './plane-graph';
import { verifyTiling } from './verify';
import type { PlaneGraph, SolveResult, Square } from './types';

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

function gcd(a: bigint, b: bigint): bigint {
  if (a < 0n) a = -a;
  if (b < 0n) b = -b;
  while (b !== 0n) [a, b] = [b, a % b];
  return a;
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

  // reduced Laplacian of G - e without row/column q
  const k = n - 1;
  const idx = new Int32Array(n);
  for (let v = 0, r = 0; v < n; v++) idx[v] = v === q ? -1 : r++;
  const zero: number[] = [];
  for (let r = 0; r < k; r++) zero.push(0);
  const L: number[][] = [];
  for (let r = 0; r < k; r++) L.push(zero.slice());
  for (let d = 0; d < D; d++) {
    if (d === poleD || d === poleR) continue;
    const u = tail[d]!;
    const v = head[d]!;
    const iu = idx[u]!;
    if (iu < 0) continue;
    L[iu]![iu]! += 1;
    const iv = idx[v]!;
    if (iv >= 0) L[iu]![iv]! -= 1;
  }
  const b = zero.slice();
  b[idx[p]!] = 1;

  // potentials: Numbers when every intermediate fits below 2^53, else BigInt; then reduced
  // by the gcd so that the layout below always runs on Numbers
  let Wfull: bigint;
  let potFull: bigint[] = [];
  let Hfull: bigint;
  let gg: bigint;
  const pot: number[] = [];
  let Wn: number;
  let Hn: number;
  let red = 0;
  const fast = bareissSolveNumber(L, b);
  if (fast) {
    Wn = fast.det;
    for (let v = 0; v < n; v++) pot.push(v === q ? 0 : fast.x[idx[v]!]!);
    Hn = pot[p]!;
    red = gcdN(Wn, Hn);
    for (let d = 0; d < D; d++) {
      if (d === poleD || d === poleR) continue;
      const diff = pot[tail[d]!]! - pot[head[d]!]!;
      if (diff > 0) red = gcdN(red, diff);
    }
    Wfull = BigInt(Wn);
    Hfull = BigInt(Hn);
    potFull = pot.map((x) => BigInt(x));
    gg = BigInt(red);
  } else {
    const sol = bareissSolve(L, b);
    Wfull = sol.det;
    const potB: bigint[] = [];
    for (let v = 0; v < n; v++) potB.push(v === q ? 0n : sol.x[idx[v]!]!);
    Hfull = potB[p]!;
    potFull = potB;
    gg = Wfull === 0n ? 0n : gcd(Wfull, Hfull);
    for (let d = 0; d < D; d++) {
      if (d === poleD || d === poleR) continue;
      const diff = potB[tail[d]!]! - potB[head[d]!]!;
      if (diff > 0n) gg = gcd(gg, diff);
    }
    if (Wfull !== 0n) {
      if (Wfull / gg > 2n ** 31n || Hfull / gg > 2n ** 31n) {
        return { ok: false, code: 'too-large', message: `the reduced rectangle ${Wfull / gg} x ${Hfull / gg} exceeds the limit of 2^31 per side` };
      }
      for (let v = 0; v < n; v++) pot.push(Number(potB[v]! / gg));
    }
    Wn = Number(Wfull / (gg || 1n));
    Hn = Number(Hfull / (gg || 1n));
    red = 1;
  }
  if (Wfull === 0n) {
    return { ok: false, code: 'disconnected', message: `removing the pole edge ${p}-${q} disconnects the network (no spanning tree of G - e)` };
  }
  for (let d = 0; d < D; d++) {
    if (d === poleD || d === poleR) continue;
    const u = tail[d]!;
    const v = head[d]!;
    if (pot[u] === pot[v]) {
      return {
        ok: false,
        code: 'zero-current',
        message: `edge ${u}-${v} carries no current (both ends at potential ${BigInt(pot[u]!) * (fast ? 1n : gg)}): this pole choice gives no squared rectangle`,
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
        const diff = pot[tail[d]!]! - pot[head[d]!]!; // > 0 when d runs hi -> lo
        const other = face[rev[d]!]!;
        const want = xf + diff;
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
  const W = Wn / red;
  const H = Hn / red;
  if (W > 2 ** 31 || H > 2 ** 31) {
    return { ok: false, code: 'too-large', message: `the reduced rectangle ${W} x ${H} exceeds the limit of 2^31 per side` };
  }
  const squares: Square[] = [];
  for (let d = 0; d < D; d++) {
    if (d === poleD || d === poleR) continue;
    const hi = tail[d]!;
    const diff = pot[hi]! - pot[head[d]!]!;
    if (diff <= 0) continue; // take each edge once, from its high end
    const x1 = fx[face[d]!]!;
    const x2 = fx[face[rev[d]!]!]!;
    const x = (x1 < x2 ? x1 : x2) - minX;
    squares.push({ x: x / red, y: (Hn - pot[hi]!) / red, s: diff / red });
  }
  squares.sort((a, c) => a.y - c.y || a.x - c.x);
  const tiling = { W, H, squares };
  const v = verifyTiling(tiling);
  if (!v.ok) {
    return { ok: false, code: 'not-plane', message: `the solved squares do not tile the rectangle (${v.message}); the rotation system is probably not a plane embedding of a c-net` };
  }
  return { ok: true, tiling, fullWidth: Wfull, fullHeight: Hfull, spanningTrees: Wfull + Hfull, gcd: gg, potentials: potFull };
}
