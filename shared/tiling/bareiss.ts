// Exact integer linear algebra by Bareiss' fraction-free elimination (E. H. Bareiss,
// "Sylvester's identity and multistep integer-preserving Gaussian elimination",
// Math. Comp. 22 (1968) 565-578). Every intermediate entry is a minor of the input, so all
// divisions are exact. Steps run on plain Numbers while every product stays below 2^53 and
// switch to BigInt for the rest of the elimination as soon as one might not.

const SAFE = 2 ** 53;

export interface BareissSolution {
  /** det(A) */
  det: bigint;
  /** det(A) * A^-1 * b (the adjugate applied to b); integral; all zero when det = 0 */
  x: bigint[];
}

function maxAbs(m: number[][], from: number, cols: number): number {
  let best = 0;
  for (let i = from; i < m.length; i++) {
    const row = m[i]!;
    for (let j = from; j < cols; j++) {
      const v = Math.abs(row[j]!);
      if (v > best) best = v;
    }
  }
  return best;
}

/** The first row from r down with a nonzero entry in column c, or -1. */
function pivotRow(a: readonly bigint[][], r: number, c: number): number {
  for (let i = r; i < a.length; i++) if (a[i]![c] !== 0n) return i;
  return -1;
}

function swapRows<T>(a: T[], i: number, j: number): void {
  const t = a[i]!;
  a[i] = a[j]!;
  a[j] = t;
}

/**
 * One Bareiss step in BigInt: clears column c below the pivot a[r][c] (columns c..cols-1);
 * each new entry is a minor of the input, so the division by the previous pivot is exact.
 */
function clearBelow(a: bigint[][], r: number, c: number, cols: number, prev: bigint): void {
  const prow = a[r]!;
  const p = prow[c]!;
  for (let i = r + 1; i < a.length; i++) {
    const row = a[i]!;
    const f = row[c]!;
    for (let j = c + 1; j < cols; j++) row[j] = (p * row[j]! - f * prow[j]!) / prev;
    row[c] = 0n;
  }
}

/**
 * Runs the elimination in place on an augmented matrix (k rows, `cols` columns, the first k
 * square). Returns the triangular rows (Number rows until `switchedAt`, BigInt rows after),
 * the determinant sign from row swaps and whether the matrix is singular.
 */
function eliminate(m0: number[][], k: number, cols: number) {
  const m = m0;
  let sign = 1n;
  let prevN = 1;
  let step = 0;
  let big: bigint[][] | null = null;
  let prevB = 1n;
  let bound = maxAbs(m, 0, cols);
  for (; step < k - 1; step++) {
    // pivot search (only needed for singular or indefinite input; Laplacians never swap)
    if (m[step]![step] === 0) {
      let r = step + 1;
      while (r < k && m[r]![step] === 0) r++;
      if (r === k) return { singular: true as const };
      const t = m[r]!;
      m[r] = m[step]!;
      m[step] = t;
      sign = -sign;
    }
    if (2 * bound * bound >= SAFE) break;
    const prow = m[step]!;
    const p = prow[step]!;
    let nb = 0;
    for (let i = step + 1; i < k; i++) {
      const row = m[i]!;
      const f = row[step]!;
      for (let j = step + 1; j < cols; j++) {
        const v = (p * row[j]! - f * prow[j]!) / prevN;
        row[j] = v;
        const av = v < 0 ? -v : v;
        if (av > nb) nb = av;
      }
      row[step] = 0;
    }
    prevN = p;
    if (nb > bound) bound = nb;
  }
  if (step < k - 1) {
    big = m.map((row) => row.map((v) => BigInt(v)));
    prevB = BigInt(prevN);
    for (; step < k - 1; step++) {
      const r = pivotRow(big, step, step);
      if (r < 0) return { singular: true as const };
      if (r !== step) {
        swapRows(big, r, step);
        sign = -sign;
      }
      clearBelow(big, step, step, cols, prevB);
      prevB = big[step]![step]!;
    }
  }
  const last = big ? big[k - 1]![k - 1]! : BigInt(m[k - 1]![k - 1]!);
  if (last === 0n) return { singular: true as const };
  return { singular: false as const, m, big, sign, det: sign * last };
}

/**
 * Exact rank of an integer matrix (any shape; copied, the input is not changed): BigInt
 * elimination, a column without a pivot is skipped, so no rounding can hide a dependency.
 */
export function bareissRank(rows: readonly (readonly number[])[]): number {
  const a = rows.map((r) => r.map((v) => BigInt(v)));
  const cols = a.length > 0 ? a[0]!.length : 0;
  let rank = 0;
  let prev = 1n;
  for (let c = 0; c < cols && rank < a.length; c++) {
    const p = pivotRow(a, rank, c);
    if (p < 0) continue;
    if (p !== rank) swapRows(a, p, rank);
    clearBelow(a, rank, c, cols, prev);
    // rows above the pivot row keep their old scale; Bareiss needs the same divisor for all
    prev = a[rank]![c]!;
    rank++;
  }
  return rank;
}

/** Exact determinant of a square integer matrix (copied; the input is not changed). */
export function bareissDeterminant(a: readonly (readonly number[])[]): bigint {
  const k = a.length;
  if (k === 0) return 1n;
  const m = a.map((row) => row.slice());
  const r = eliminate(m, k, k);
  return r.singular ? 0n : r.det;
}

/**
 * Solves A x = b exactly for a square integer matrix A and integer vector b, returning
 * det(A) and det(A) * x (fraction-free back substitution: X_i = (D b_i - sum_{j>i} a_ij X_j) / a_ii,
 * each division exact because the result is a column of the adjugate applied to b).
 */
export function bareissSolve(a: readonly (readonly number[])[], b: readonly number[]): BareissSolution {
  const k = a.length;
  if (k === 0) return { det: 1n, x: [] };
  const m = a.map((row, i) => {
    const r = row.slice();
    r.push(b[i]!);
    return r;
  });
  const r = eliminate(m, k, k + 1);
  if (r.singular) return { det: 0n, x: Array.from({ length: k }, () => 0n) };
  // The determinant sign from swaps: X = det * A^-1 b uses the signed det; the triangular
  // system is unchanged by row order, so solve it and multiply by the sign at the end.
  const rows: bigint[][] = r.big ?? r.m.map((row) => row.map((v) => BigInt(v)));
  const D = rows[k - 1]![k - 1]!;
  const X: bigint[] = [];
  for (let i = k - 1; i >= 0; i--) {
    const row = rows[i]!;
    let acc = D * row[k]!;
    for (let j = i + 1; j < k; j++) acc -= row[j]! * X[j]!;
    X[i] = acc / row[i]!;
  }
  if (r.sign < 0n) for (let i = 0; i < k; i++) X[i] = -X[i]!;
  return { det: r.det, x: X };
}

/**
 * The same solve entirely in Numbers, or null as soon as some product might exceed 2^53
 * (the caller then uses bareissSolve). Returns det(A) and det(A) * A^-1 b. Needs nonzero
 * leading minors (true for a reduced Laplacian of a connected network); null otherwise.
 */
export function bareissSolveNumber(a: readonly (readonly number[])[], b: readonly number[]): { det: number; x: number[] } | null {
  const k = a.length;
  if (k === 0) return { det: 1, x: [] };
  const cols = k + 1;
  const m: number[][] = [];
  let bound = 0;
  for (let i = 0; i < k; i++) {
    const r = a[i]!.slice();
    r.push(b[i]!);
    for (let j = 0; j < cols; j++) {
      const v = Math.abs(r[j]!);
      if (v > bound) bound = v;
    }
    m.push(r);
  }
  let prev = 1;
  for (let step = 0; step < k - 1; step++) {
    const prow = m[step]!;
    const p = prow[step]!;
    if (p === 0 || 2 * bound * bound >= SAFE) return null;
    for (let i = step + 1; i < k; i++) {
      const row = m[i]!;
      const f = row[step]!;
      if (f === 0) {
        // (p * row[j] - 0) / prev: still exact, and keeps sparse rows cheap
        for (let j = step + 1; j < cols; j++) {
          const v = (p * row[j]!) / prev;
          row[j] = v;
          const av = v < 0 ? -v : v;
          if (av > bound) bound = av;
        }
        continue;
      }
      for (let j = step + 1; j < cols; j++) {
        const v = (p * row[j]! - f * prow[j]!) / prev;
        row[j] = v;
        const av = v < 0 ? -v : v;
        if (av > bound) bound = av;
      }
    }
    prev = p;
  }
  const D = m[k - 1]![k - 1]!;
  if (D === 0) return null;
  const X: number[] = [];
  for (let i = k - 1; i >= 0; i--) {
    const row = m[i]!;
    let acc = D * row[k]!;
    if (Math.abs(acc) >= SAFE) return null;
    for (let j = i + 1; j < k; j++) {
      const c = row[j]!;
      if (c === 0) continue;
      const prod = c * X[j]!;
      if (Math.abs(prod) >= SAFE) return null;
      acc -= prod;
      if (Math.abs(acc) >= SAFE) return null;
    }
    X[i] = acc / row[i]!;
  }
  return { det: D, x: X };
}
