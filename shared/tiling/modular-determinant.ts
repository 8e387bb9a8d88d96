// Determinants of large sparse symmetric integer matrices (reduced Laplacians of big c-nets)
// without dense O(k^3) BigInt work: Gaussian elimination modulo several primes below 2^26 in
// plain Numbers (every product < 2^52 is exact), in a minimum-degree order that keeps the
// fill-in of planar networks small (common practice: Tinney & Walker 1967; George & Liu,
// "Computer Solution of Large Sparse Positive Definite Systems", 1981), then the Chinese
// remainder theorem (Garner's method) in BigInt. Enough primes are used to exceed twice
// Hadamard's bound on |det|, so the result is exact, not probabilistic.

/** Primes just below 2^26, largest first (trial division; computed once on demand). */
const primes: number[] = [];
function prime(i: number): number {
  let c = primes.length === 0 ? 2 ** 26 - 1 : primes[primes.length - 1]! - 2;
  while (primes.length <= i) {
    let isPrime = c % 2 !== 0;
    for (let d = 3; isPrime && d * d <= c; d += 2) if (c % d === 0) isPrime = false;
    if (isPrime) primes.push(c);
    c -= 2;
  }
  return primes[i]!;
}

function mulmod(a: number, b: number, p: number): number {
  return (a * b) % p;
}

function invmod(a: number, p: number): number {
  let [r0, r1] = [a, p];
  let [s0, s1] = [1, 0];
  while (r1 !== 0) {
    const q = Math.floor(r0 / r1);
    [r0, r1] = [r1, r0 - q * r1];
    [s0, s1] = [s1, s0 - q * s1];
  }
  return ((s0 % p) + p) % p;
}

/**
 * A symmetric matrix given by its diagonal and its off-diagonal entries (i, j, value) with
 * i != j, each unordered pair listed once. Returns det exactly.
 */
export function sparseSymmetricDeterminant(diag: readonly number[], off: readonly (readonly [number, number, number])[]): bigint {
  const k = diag.length;
  if (k === 0) return 1n;
  // Hadamard's bound: |det| <= prod of row norms
  const norm2 = diag.map((d) => d * d);
  const nbrs: Set<number>[] = Array.from({ length: k }, () => new Set<number>());
  for (const [i, j, v] of off) {
    norm2[i]! += v * v;
    norm2[j]! += v * v;
    nbrs[i]!.add(j);
    nbrs[j]!.add(i);
  }
  let bits = 0;
  for (const n2 of norm2) bits += Math.log2(Math.max(1, n2)) / 2;
  const need = Math.ceil((bits + 2) / 25) + 1;

  // minimum-degree elimination order (symbolic, on the structure only)
  const order: number[] = [];
  {
    const s = nbrs.map((x) => new Set(x));
    const gone = new Uint8Array(k);
    for (let step = 0; step < k; step++) {
      let v = -1;
      for (let u = 0; u < k; u++) if (!gone[u] && (v < 0 || s[u]!.size < s[v]!.size)) v = u;
      order.push(v);
      gone[v] = 1;
      const nb = [...s[v]!];
      for (const a of nb) {
        s[a]!.delete(v);
        for (const b of nb) if (a !== b) s[a]!.add(b);
      }
    }
  }

  const residues: number[] = [];
  const mods: number[] = [];
  for (let pi = 0; residues.length < need; pi++) {
    const p = prime(pi);
    const r = detModP(diag, off, order, p);
    if (r === null) continue; // a pivot vanished modulo p: use another prime
    residues.push(r);
    mods.push(p);
  }
  // Garner / incremental CRT
  let x = BigInt(residues[0]!);
  let M = BigInt(mods[0]!);
  for (let i = 1; i < residues.length; i++) {
    const p = mods[i]!;
    const pb = BigInt(p);
    const xm = Number(x % pb);
    const t = mulmod((((residues[i]! - xm) % p) + p) % p, invmod(Number(M % pb), p), p);
    x += M * BigInt(t);
    M *= pb;
  }
  // the determinant lies in (-M/2, M/2)
  return x > M / 2n ? x - M : x;
}

function detModP(diag: readonly number[], off: readonly (readonly [number, number, number])[], order: readonly number[], p: number): number | null {
  const k = diag.length;
  const d = diag.map((v) => ((v % p) + p) % p);
  const rows: Map<number, number>[] = Array.from({ length: k }, () => new Map<number, number>());
  for (const [i, j, v] of off) {
    const m = ((v % p) + p) % p;
    rows[i]!.set(j, ((rows[i]!.get(j) ?? 0) + m) % p);
    rows[j]!.set(i, ((rows[j]!.get(i) ?? 0) + m) % p);
  }
  let det = 1;
  for (const v of order) {
    const a = d[v]!;
    if (a === 0) return null;
    det = mulmod(det, a, p);
    const inv = invmod(a, p);
    const rv = rows[v]!;
    const nb = [...rv.entries()];
    for (const [i] of nb) rows[i]!.delete(v);
    for (const [i, vi] of nb) {
      const f = mulmod(vi, inv, p); // m_iv / a
      const ri = rows[i]!;
      for (const [j, vj] of nb) {
        const delta = mulmod(f, vj, p);
        if (i === j) d[i] = (d[i]! - delta + p) % p;
        else ri.set(j, ((ri.get(j) ?? 0) - delta + p) % p);
      }
    }
  }
  return det;
}
