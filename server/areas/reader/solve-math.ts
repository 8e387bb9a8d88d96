// The numbers behind the solve statistics and the grade calibration, pure.

/**
 * The p-quantile of sorted values by linear interpolation between closest ranks (Hyndman &
 * Fan's definition 7, the default of R, NumPy, d3-array and mathjs' quantileSeq).
 */
export function quantileSorted(sorted: readonly number[], p: number): number {
  const n = sorted.length;
  if (n === 0) throw new Error('quantile of no values');
  const h = (n - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.min(n - 1, lo + 1);
  return sorted[lo]! + (h - lo) * (sorted[hi]! - sorted[lo]!);
}

/** First quartile, median and third quartile (definition 7), or null for no values. */
export function quartiles(values: readonly number[]): { q1: number; median: number; q3: number } | null {
  if (values.length === 0) return null;
  const s = [...values].sort((a, b) => a - b);
  return { q1: quantileSorted(s, 0.25), median: quantileSorted(s, 0.5), q3: quantileSorted(s, 0.75) };
}

/** Ranks 1..n, ties sharing their mean rank (as Spearman's coefficient needs). */
export function ranks(values: readonly number[]): number[] {
  const order = values.map((v, i) => ({ v, i })).sort((a, b) => a.v - b.v);
  const out = Array.from({ length: values.length }, () => 0);
  for (let k = 0; k < order.length; ) {
    let j = k;
    while (j + 1 < order.length && order[j + 1]!.v === order[k]!.v) j++;
    const mean = (k + j) / 2 + 1;
    for (let m = k; m <= j; m++) out[order[m]!.i] = mean;
    k = j + 1;
  }
  return out;
}

/** Spearman's rank correlation: Pearson's correlation of the (tie-averaged) ranks; null when undefined. */
export function spearman(a: readonly number[], b: readonly number[]): number | null {
  if (a.length !== b.length || a.length < 3) return null;
  const ra = ranks(a);
  const rb = ranks(b);
  const mean = (xs: number[]) => xs.reduce((s, x) => s + x, 0) / xs.length;
  const ma = mean(ra);
  const mb = mean(rb);
  let num = 0;
  let da = 0;
  let db = 0;
  for (let i = 0; i < ra.length; i++) {
    num += (ra[i]! - ma) * (rb[i]! - mb);
    da += (ra[i]! - ma) ** 2;
    db += (rb[i]! - mb) ** 2;
  }
  return da === 0 || db === 0 ? null : num / Math.sqrt(da * db);
}

export type FitItem = { key: number; target: number };

/**
 * Grades 1..5 that never go down as `key` goes up, closest to the targets: the least total
 * |grade - target| (an isotonic regression in L1 on the five grades, by dynamic programming;
 * items with equal keys get one grade). Returns each item's grade and, for each boundary
 * g|g+1 (g = 1..4), the first key of grade g+1 and the last key below it, or null when no
 * item changes from g or below to g+1 or above there.
 */
export function monotoneGradeFit(items: readonly FitItem[]): { grades: number[]; cuts: ({ below: number; from: number } | null)[] } {
  const order = items.map((it, i) => ({ ...it, i })).sort((a, b) => a.key - b.key || a.i - b.i);
  // groups of equal keys
  const groups: { key: number; members: number[] }[] = [];
  for (const it of order) {
    const last = groups[groups.length - 1];
    if (last && last.key === it.key) last.members.push(it.i);
    else groups.push({ key: it.key, members: [it.i] });
  }
  const G = 5;
  const n = groups.length;
  // cost[k][g]: best total for groups 0..k with group k at grade g+1; from[k][g]: grade of group k-1
  const cost: number[][] = [];
  const from: number[][] = [];
  for (let k = 0; k < n; k++) {
    const here = Array.from({ length: G }, (_, g) => groups[k]!.members.reduce((s, m) => s + Math.abs(g + 1 - items[m]!.target), 0));
    cost.push(Array.from({ length: G }, () => Infinity));
    from.push(Array.from({ length: G }, () => -1));
    for (let g = 0; g < G; g++) {
      if (k === 0) {
        cost[k]![g] = here[g]!;
        continue;
      }
      // best predecessor at a grade <= g (the lowest on a tie, so grades climb as late as they can)
      let best = Infinity;
      let arg = -1;
      for (let h = 0; h <= g; h++) if (cost[k - 1]![h]! < best) [best, arg] = [cost[k - 1]![h]!, h];
      cost[k]![g] = best + here[g]!;
      from[k]![g] = arg;
    }
  }
  const grades = Array.from({ length: items.length }, () => 1);
  const groupGrade = Array.from({ length: n }, () => 0);
  if (n > 0) {
    let g = 0;
    for (let h = 1; h < G; h++) if (cost[n - 1]![h]! < cost[n - 1]![g]!) g = h;
    for (let k = n - 1; k >= 0; k--) {
      groupGrade[k] = g;
      for (const m of groups[k]!.members) grades[m] = g + 1;
      g = from[k]![g]!;
    }
  }
  const cuts: ({ below: number; from: number } | null)[] = [];
  for (let b = 1; b <= 4; b++) {
    let cut: { below: number; from: number } | null = null;
    for (let k = 1; k < n; k++) {
      if (groupGrade[k - 1]! + 1 <= b && groupGrade[k]! + 1 > b) cut = { below: groups[k - 1]!.key, from: groups[k]!.key };
    }
    cuts.push(cut);
  }
  return { grades, cuts };
}
