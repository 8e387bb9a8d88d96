// A deliberately plain reference solver for Assembly, written separately from the engine
// and used only by the tests on small inputs: row-wise backtracking on a top-down skyline
// (the classical "highest, then leftmost free corner" method, common practice). At the
// corner it tries every distinct unused size that fits. One classical prune only: the
// lowest segment is a notch (both neighbours higher), so its width must be a sum of some
// unused sizes (Korf-style relaxation, engine.md 7.2). No symmetry is broken, so it returns every placement (equal sizes are never permuted
// because it branches on distinct sizes, not on pieces).
import type { Tiling } from '../../../shared/tiling/index';

export function referenceAssemble(W: number, H: number, pieces: number[], maxNodes = 5_000_000): Tiling[] {
  const count = new Map<number, number>();
  for (const p of pieces) count.set(p, (count.get(p) ?? 0) + 1);
  const distinct = [...count.keys()].sort((a, b) => b - a);
  const depth = Array.from({ length: W }, () => 0); // filled depth of every unit column
  const placed: { x: number; y: number; s: number }[] = [];
  const out: Tiling[] = [];
  let nodes = 0;
  function go(): void {
    if (++nodes > maxNodes) throw new Error('reference solver: node limit reached');
    let x0 = -1;
    let h = H;
    for (let x = 0; x < W; x++) if (depth[x]! < h) { h = depth[x]!; x0 = x; }
    if (x0 < 0) { if (placed.length === pieces.length) out.push({ W, H, squares: placed.map((q) => ({ ...q })) }); return; }
    let w = 0;
    while (x0 + w < W && depth[x0 + w] === h) w++;
    if (!subsetSum(w, H - h)) return;
    for (const s of distinct) {
      const c = count.get(s)!;
      if (c === 0 || s > w || h + s > H) continue;
      count.set(s, c - 1);
      for (let x = x0; x < x0 + s; x++) depth[x] = h + s;
      placed.push({ x: x0, y: h, s });
      go();
      placed.pop();
      for (let x = x0; x < x0 + s; x++) depth[x] = h;
      count.set(s, c);
    }
  }
  function subsetSum(target: number, maxSide: number): boolean {
    const can = new Uint8Array(target + 1);
    can[0] = 1;
    for (const [s, c] of count) {
      if (s > maxSide) continue;
      for (let k = 0; k < c; k++) for (let v = target; v >= s; v--) if (can[v - s]) can[v] = 1;
    }
    return can[target] === 1;
  }
  go();
  return out;
}
