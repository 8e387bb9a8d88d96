// Joining stock rectangles into squared squares (a classic construction; see squaring.net on
// compound squared squares):
// 1. Two rectangles of the same dimensions a x b with no size in common: set them corner to
//    corner, one turned a quarter turn, and add squares a and b -> a squared square of side a + b.
// 2. Two rectangles a x b sharing exactly one size c that sits in a corner of each: overlap
//    them on that square -> a squared square of side a + b - c, adding squares a - c and b - c.
// Every result is rebuilt from its squares and verified by the tiling engine before it is offered.
import { orientations, tilingFromSquares, TilingInputError, type Square, type Tiling } from '../tiling/index';
import { factsOf, foundTiling, type FoundryRunControl } from './found-tiling';

export interface JoinPart {
  /** the stock's id or key, kept in the origin */
  id: string;
  tiling: Tiling;
}

export interface JoinOptions extends FoundryRunControl {
  /** offer only perfect results (default true) */
  perfectOnly?: boolean;
  onProgress?: (p: { done: number; total: number; found: number }) => void;
}

export interface JoinSummary {
  parts: number;
  pairs: number;
  found: number;
  perfect: number;
  rejectedImperfect: number;
  ms: number;
  stopped: boolean;
}

function sizesOf(t: Tiling): Set<number> {
  return new Set(t.squares.map((s) => s.s));
}

function shift(squares: readonly Square[], dx: number, dy: number): Square[] {
  return squares.map((s) => ({ x: s.x + dx, y: s.y + dy, s: s.s }));
}

function build(side: number, squares: Square[]): Tiling | null {
  try {
    return tilingFromSquares({ width: side, height: side, squares: squares.map((s) => ({ x: s.x, y: s.y, size: s.s })) });
  } catch (e) {
    if (e instanceof TilingInputError) return null;
    throw e;
  }
}

/** Orientations of t with width w (and height h). */
function withWidth(t: Tiling, w: number): Tiling[] {
  return orientations(t, { all: true }).filter((o) => o.W === w);
}

/** Construction 1: a x b and b x a corner to corner plus squares a and b. */
export function joinCornerToCorner(A: Tiling, B: Tiling): Tiling | null {
  const a = Math.max(A.W, A.H);
  const b = Math.min(A.W, A.H);
  if (Math.max(B.W, B.H) !== a || Math.min(B.W, B.H) !== b || a === b) return null;
  const A0 = withWidth(A, a)[0];
  const B0 = withWidth(B, b)[0];
  if (!A0 || !B0) return null;
  const squares = [
    ...A0.squares,
    ...shift(B0.squares, a, b),
    { x: 0, y: b, s: a },
    { x: a, y: 0, s: b },
  ];
  return build(a + b, squares);
}

/** Construction 2: overlap on a shared corner square c. All placements that verify. */
export function joinOverlapping(A: Tiling, B: Tiling, c: number): Tiling[] {
  const a = Math.max(A.W, A.H);
  const b = Math.min(A.W, A.H);
  if (Math.max(B.W, B.H) !== a || Math.min(B.W, B.H) !== b || c >= b) return [];
  const out: Tiling[] = [];
  for (const A0 of withWidth(A, a)) {
    // c at A0's bottom-right corner
    if (!A0.squares.some((s) => s.s === c && s.x === a - c && s.y === b - c)) continue;
    for (const B0 of withWidth(B, b)) {
      // c at B0's top-left corner
      if (!B0.squares.some((s) => s.s === c && s.x === 0 && s.y === 0)) continue;
      const Bs = shift(B0.squares.filter((s) => !(s.x === 0 && s.y === 0)), a - c, b - c);
      const side = a + b - c;
      const t = build(side, [...A0.squares, ...Bs, { x: 0, y: b, s: a - c }, { x: a, y: 0, s: b - c }]);
      if (t) out.push(t);
    }
  }
  return out;
}

/** Find every joinable pair among the parts (grouped by dimensions) and offer the verified results. */
export function joinStock(parts: readonly JoinPart[], opts: JoinOptions = {}): JoinSummary {
  const t0 = Date.now();
  const perfectOnly = opts.perfectOnly !== false;
  const byDims = new Map<string, JoinPart[]>();
  for (const p of parts) {
    const k = `${Math.max(p.tiling.W, p.tiling.H)}x${Math.min(p.tiling.W, p.tiling.H)}`;
    const list = byDims.get(k) ?? [];
    list.push(p);
    byDims.set(k, list);
  }
  const groups = [...byDims.values()].filter((g) => g.length >= 2);
  const s: JoinSummary = { parts: parts.length, pairs: 0, found: 0, perfect: 0, rejectedImperfect: 0, ms: 0, stopped: false };
  const seen = new Set<string>();
  const offer = (t: Tiling, origin: Record<string, unknown>) => {
    const f = factsOf(t);
    if (!f) return;
    if (perfectOnly && !f.classification.perfect) { s.rejectedImperfect++; return; }
    const ft = foundTiling(f, origin);
    if (seen.has(ft.key)) return;
    seen.add(ft.key);
    s.found++;
    if (ft.perfect) s.perfect++;
    opts.onFound?.(ft);
  };
  let done = 0;
  for (const g of groups) {
    if (opts.shouldStop?.()) { s.stopped = true; break; }
    for (let i = 0; i < g.length; i++) {
      for (let j = i + 1; j < g.length; j++) {
        const A = g[i]!;
        const B = g[j]!;
        const sa = sizesOf(A.tiling);
        const common = [...sizesOf(B.tiling)].filter((x) => sa.has(x));
        if (common.length === 0) {
          s.pairs++;
          const t = joinCornerToCorner(A.tiling, B.tiling);
          if (t) offer(t, { method: 'joining', construction: 'corner-to-corner', parts: [A.id, B.id] });
        } else if (common.length === 1) {
          s.pairs++;
          const c = common[0]!;
          for (const t of [...joinOverlapping(A.tiling, B.tiling, c), ...joinOverlapping(B.tiling, A.tiling, c)]) {
            offer(t, { method: 'joining', construction: 'overlap', shared: c, parts: [A.id, B.id] });
          }
        }
      }
    }
    done++;
    opts.onProgress?.({ done, total: groups.length, found: s.found });
  }
  s.ms = Date.now() - t0;
  return s;
}
