// Shared test data for the tiling engine tests. Sources are named beside each value.
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import type { PlaneGraph, Tiling } from '../../../shared/tiling/index';

const dir = join(import.meta.dirname, '../../fixtures/catalogue');

/** Every line of the catalogue fixture files (S. E. Anderson, squaring.net; see SOURCE.md). */
export function catalogue(): { order: number; code: string }[] {
  const out: { order: number; code: string }[] = [];
  for (const f of readdirSync(dir).filter((n) => n.endsWith('.bkp')).sort()) {
    const order = Number(/o(\d+)spsr/.exec(f)![1]);
    for (const line of readFileSync(join(dir, f), 'utf8').split('\n')) if (line.trim()) out.push({ order, code: line.trim() });
  }
  return out;
}

/** The canonical code part (before the caption). */
export const withoutCaption = (line: string) => line.split('*')[0]!.trim();

// squaring.net catalogue; MathWorld credits Moron 1925
export const O9_33x32 = '9 33 32 (18,15)(7,8)(14,4)(10,1)(9)';
// squaring.net "Bouwkamp code" page
export const O9_69x61 = '9 69 61 (36,33)(5,28)(25,9,2)(7)(16)';
// OEIS A014530; Duijvestijn, J. Combin. Theory B 25 (1978) 240-243: the unique order-21 simple perfect squared square
export const O21_112 = '21 112 112 (50,35,27)(8,19)(15,17,11)(6,24)(29,25,9,2)(7,18)(16)(42)(4,37)(33)';
// OEIS A181340 / A217155 (Willcocks 1948): compound perfect squared square of lowest order
export const O24_175 = '24 175 175 (81,56,38)(18,20)(55,16,3)(1,5,14)(4)(9)(39)(51,30)(29,31,64)(43,8)(35,2)(33)';

/** Fills W x H with squares at the highest-leftmost free point, sizes from picks clipped to fit. */
export function greedyTiling(W: number, H: number, picks: number[]): Tiling {
  const top: number[] = Array.from({ length: W }, () => 0);
  const squares = [];
  let k = 0;
  for (;;) {
    let y = Infinity;
    let x = -1;
    for (let i = 0; i < W; i++) if (top[i]! < y) [y, x] = [top[i]!, i];
    if (y >= H) break;
    let w = 0;
    while (x + w < W && top[x + w] === y) w++;
    const s = Math.max(1, Math.min(picks[k++ % picks.length]!, w, H - y));
    for (let i = x; i < x + s; i++) top[i] = y + s;
    squares.push({ x, y, s });
  }
  return { W, H, squares };
}

function connectedWithout(g: PlaneGraph, removed: ReadonlySet<number>): boolean {
  const start = [...Array(g.n).keys()].find((v) => !removed.has(v));
  if (start === undefined) return true;
  const seen = new Set<number>([start]);
  const stack = [start];
  while (stack.length > 0) {
    const v = stack.pop()!;
    for (const w of g.adj[v]!) if (!removed.has(w) && !seen.has(w)) { seen.add(w); stack.push(w); }
  }
  return seen.size === g.n - removed.size;
}

/**
 * Brute force, independent of the engines: simple (no loop, no repeated neighbour, symmetric
 * lists), at least 4 vertices, and no set of at most 2 vertices disconnects it (the definition
 * of 3-connectedness; Tutte).
 */
export function isThreeConnected(g: PlaneGraph): boolean {
  if (g.n < 4) return false;
  for (let v = 0; v < g.n; v++) {
    const a = g.adj[v]!;
    if (new Set(a).size !== a.length || a.includes(v)) return false;
    for (const w of a) if (!g.adj[w]!.includes(v)) return false;
  }
  if (!connectedWithout(g, new Set())) return false;
  for (let a = 0; a < g.n; a++) {
    if (!connectedWithout(g, new Set([a]))) return false;
    for (let b = a + 1; b < g.n; b++) if (!connectedWithout(g, new Set([a, b]))) return false;
  }
  return true;
}

/**
 * A compound tiling by composition: `copies` copies of t stacked (every other one mirrored
 * left to right), W x copies*H; for large Kirchhoff systems whose sides stay small.
 */
export function stackedTiling(t: Tiling, copies: number): Tiling {
  const squares: Tiling['squares'] = [];
  for (let i = 0; i < copies; i++) {
    for (const s of t.squares) squares.push({ x: i % 2 === 0 ? s.x : t.W - s.x - s.s, y: i * t.H + s.y, s: s.s });
  }
  squares.sort((a, b) => a.y - b.y || a.x - b.x);
  return { W: t.W, H: copies * t.H, squares };
}
