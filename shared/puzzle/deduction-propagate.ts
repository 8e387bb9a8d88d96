import { WeightedUnionFind } from './deduction-knowledge';
import type { LayoutGraph } from './layout-graph';

/**
 * A Deduction board: the layout the solver sees (segments and which squares touch them)
 * and the true sizes (used only by the bug guard: every deduced value must equal them).
 */
export interface DeductionBoard {
  layout: LayoutGraph;
  sizes: readonly number[];
}

export interface DeductionRules {
  /**
   * Locality level k: a step may use a chain of at most k known lengths (k = 2 is one
   * addition or subtraction). Infinity = the full closure of the union-find.
   */
  level: number;
  /** whether the frame's width and height are printed (they count as known lengths) */
  showFrame: boolean;
}

/** A known length used in a step: a square's size, or the frame's W or H. */
export interface StepTerm {
  ref: number | 'W' | 'H';
  label: string;
  sign: 1 | -1;
  value: number;
}

export interface DeductionStep {
  square: number;
  label: string;
  /** 1-based synchronous round in which the step became available */
  round: number;
  /** 'x': a horizontal chain between the square's left and right sides; 'y': vertical */
  direction: 'x' | 'y';
  value: number;
  terms: StepTerm[];
  /** the arithmetic for the solution page, e.g. "C = 33 - 18 = 15" */
  text: string;
}

export interface DeductionRun {
  solved: boolean;
  known: boolean[];
  steps: DeductionStep[];
  /** number of deductions available in each round */
  available: number[];
}

/** A, B, ..., Z, AA, AB, ... for square i (reading order of the tiling). */
export function squareLabel(i: number): string {
  let s = '';
  let n = i + 1;
  while (n > 0) {
    const r = (n - 1) % 26;
    s = String.fromCharCode(65 + r) + s;
    n = Math.floor((n - 1) / 26);
  }
  return s;
}

function guard(board: DeductionBoard, i: number, value: number): void {
  if (value !== board.sizes[i]) {
    throw new Error(`deduction bug guard: square ${squareLabel(i)} deduced as ${value}, its true size is ${String(board.sizes[i])}`);
  }
}

/**
 * Fast solvability test (no step list): propagate to the fixed point and say whether every
 * size becomes known. The fixed point does not depend on the order of the deductions
 * (knowledge only grows), so a worklist gives the same answer as synchronous rounds.
 */
export function isSolvable(board: DeductionBoard, givens: readonly number[], rules: DeductionRules): boolean {
  return knownAtFixedPoint(board, givens, rules).every(Boolean);
}

export function knownAtFixedPoint(board: DeductionBoard, givens: readonly number[], rules: DeductionRules): boolean[] {
  return Number.isFinite(rules.level) ? closureLocal(board, givens, rules) : closureUnionFind(board, givens, rules);
}

/**
 * Sweeps the unknown cells in order, again and again, until a sweep learns nothing;
 * `tryLearn(i)` says whether cell i became known.
 */
function sweepToFixedPoint(known: readonly boolean[], tryLearn: (i: number) => boolean): void {
  let changed = true;
  while (changed) {
    changed = false;
    for (let i = 0; i < known.length; i++) if (!known[i] && tryLearn(i)) changed = true;
  }
}

function closureUnionFind(board: DeductionBoard, givens: readonly number[], rules: DeductionRules): boolean[] {
  const { layout, sizes } = board;
  const n = layout.cells.length;
  const ux = new WeightedUnionFind(layout.vertical.length);
  const uy = new WeightedUnionFind(layout.horizontal.length);
  const known = Array.from({ length: n }, () => false);
  const learn = (i: number, v: number) => {
    const c = layout.cells[i]!;
    known[i] = true;
    ux.union(c.left, c.right, v);
    uy.union(c.top, c.bottom, v);
  };
  if (rules.showFrame) {
    ux.union(0, layout.vertical.length - 1, layout.width);
    uy.union(0, layout.horizontal.length - 1, layout.height);
  }
  for (const g of givens) if (!known[g]) learn(g, sizes[g]!);
  sweepToFixedPoint(known, (i) => {
    const c = layout.cells[i]!;
    const v = ux.relation(c.left, c.right) ?? uy.relation(c.top, c.bottom);
    if (v === null) return false;
    guard(board, i, v);
    learn(i, v);
    return true;
  });
  return known;
}

/** Shortest chain lengths (number of known lengths) between segments, capped at 255. */
class ChainLengths {
  readonly d: Uint8Array;
  private readonly da: Uint8Array;
  private readonly db: Uint8Array;
  constructor(readonly size: number) {
    this.d = new Uint8Array(size * size).fill(255);
    for (let i = 0; i < size; i++) this.d[i * size + i] = 0;
    this.da = new Uint8Array(size);
    this.db = new Uint8Array(size);
  }
  get(a: number, b: number): number {
    return this.d[a * this.size + b]!;
  }
  /** a new known length between a and b: relax every pair through it */
  add(a: number, b: number): void {
    const { d, size, da, db } = this;
    if (d[a * size + b] === 1) return;
    for (let u = 0; u < size; u++) { da[u] = d[u * size + a]!; db[u] = d[u * size + b]!; }
    for (let u = 0; u < size; u++) {
      const ua = da[u]!;
      const ub = db[u]!;
      if (ua === 255 && ub === 255) continue;
      const row = u * size;
      for (let v = 0; v < size; v++) {
        const viaAB = ua + 1 + db[v]!; // u..a - b..v (d is symmetric)
        const viaBA = ub + 1 + da[v]!;
        const best = viaAB < viaBA ? viaAB : viaBA;
        if (best < d[row + v]!) d[row + v] = best;
      }
    }
  }
}

function closureLocal(board: DeductionBoard, givens: readonly number[], rules: DeductionRules): boolean[] {
  const { layout } = board;
  const n = layout.cells.length;
  const k = rules.level;
  const cx = new ChainLengths(layout.vertical.length);
  const cy = new ChainLengths(layout.horizontal.length);
  const known = Array.from({ length: n }, () => false);
  const learn = (i: number) => {
    const c = layout.cells[i]!;
    known[i] = true;
    cx.add(c.left, c.right);
    cy.add(c.top, c.bottom);
  };
  if (rules.showFrame) {
    cx.add(0, layout.vertical.length - 1);
    cy.add(0, layout.horizontal.length - 1);
  }
  for (const g of givens) if (!known[g]) learn(g);
  sweepToFixedPoint(known, (i) => {
    const c = layout.cells[i]!;
    if (cx.get(c.left, c.right) > k && cy.get(c.top, c.bottom) > k) return false;
    learn(i);
    return true;
  });
  return known;
}

interface Edge { to: number; ref: number | 'W' | 'H'; value: number; sign: 1 | -1 }

/** BFS for the shortest chain of known lengths from a to b, at most k long. */
function chain(adj: Edge[][], a: number, b: number, k: number): Edge[] | null {
  if (a === b) return [];
  const prev = new Map<number, { from: number; edge: Edge }>();
  let frontier = [a];
  const seen = new Set([a]);
  for (let depth = 0; depth < k && frontier.length > 0; depth++) {
    const next: number[] = [];
    for (const u of frontier) {
      for (const e of adj[u]!) {
        if (seen.has(e.to)) continue;
        seen.add(e.to);
        prev.set(e.to, { from: u, edge: e });
        if (e.to === b) {
          const path: Edge[] = [];
          let cur = b;
          while (cur !== a) { const p = prev.get(cur)!; path.push(p.edge); cur = p.from; }
          return path.reverse();
        }
        next.push(e.to);
      }
    }
    frontier = next;
  }
  return null;
}

function stepText(label: string, terms: StepTerm[], value: number): string {
  const pos = terms.filter((t) => t.sign === 1).map((t) => String(t.value));
  const neg = terms.filter((t) => t.sign === -1).map((t) => String(t.value));
  if (terms.length === 1) return `${label} = ${value} (as ${terms[0]!.label})`;
  const expr = (pos.length > 0 ? pos.join(' + ') : '0') + neg.map((v) => ` - ${v}`).join('');
  return `${label} = ${expr} = ${value}`;
}

/**
 * Run the deduction in synchronous rounds (every step of a round uses only what was known
 * when the round began) and write down each step with its chain of known lengths.
 * Each step takes the shortest chain (x before y on ties); the bug guard checks every value.
 */
export function explainDeduction(board: DeductionBoard, givens: readonly number[], rules: DeductionRules): DeductionRun {
  const { layout, sizes } = board;
  const n = layout.cells.length;
  const k = rules.level;
  const ax: Edge[][] = layout.vertical.map(() => []);
  const ay: Edge[][] = layout.horizontal.map(() => []);
  const link = (adj: Edge[][], a: number, b: number, ref: number | 'W' | 'H', value: number) => {
    adj[a]!.push({ to: b, ref, value, sign: 1 });
    adj[b]!.push({ to: a, ref, value, sign: -1 });
  };
  const known = Array.from({ length: n }, () => false);
  const learn = (i: number) => {
    const c = layout.cells[i]!;
    known[i] = true;
    link(ax, c.left, c.right, i, sizes[i]!);
    link(ay, c.top, c.bottom, i, sizes[i]!);
  };
  if (rules.showFrame) {
    link(ax, 0, layout.vertical.length - 1, 'W', layout.width);
    link(ay, 0, layout.horizontal.length - 1, 'H', layout.height);
  }
  for (const g of givens) if (!known[g]) learn(g);
  const steps: DeductionStep[] = [];
  const available: number[] = [];
  for (let round = 1; known.some((x) => !x); round++) {
    const found: DeductionStep[] = [];
    for (let i = 0; i < n; i++) {
      if (known[i]) continue;
      const c = layout.cells[i]!;
      const px = chain(ax, c.left, c.right, k);
      const py = chain(ay, c.top, c.bottom, k);
      const useX = px !== null && (py === null || px.length <= py.length);
      const path = useX ? px : py;
      if (path === null) continue;
      const terms: StepTerm[] = path.map((e) => ({
        ref: e.ref,
        label: typeof e.ref === 'number' ? squareLabel(e.ref) : e.ref,
        sign: e.sign,
        value: e.value,
      }));
      const value = terms.reduce((acc, t) => acc + t.sign * t.value, 0);
      guard(board, i, value);
      const label = squareLabel(i);
      found.push({ square: i, label, round, direction: useX ? 'x' : 'y', value, terms, text: stepText(label, terms, value) });
    }
    if (found.length === 0) break;
    available.push(found.length);
    for (const st of found) { learn(st.square); steps.push(st); }
  }
  return { solved: known.every(Boolean), known, steps, available };
}
