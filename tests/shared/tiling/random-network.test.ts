import { describe, expect, it } from 'vitest';
import { analysePlaneGraph } from '../../../shared/tiling/plane-graph';
import { dual, edgeList, faces, mulberry32, randomCNet, wheel, type PlaneGraph } from '../../../shared/tiling/index';

function connectedWithout(g: PlaneGraph, removed: Set<number>): boolean {
  const start = [...Array(g.n).keys()].find((v) => !removed.has(v))!;
  const seen = new Set([start]);
  const stack = [start];
  while (stack.length) {
    for (const u of g.adj[stack.pop()!]!) {
      if (removed.has(u) || seen.has(u)) continue;
      seen.add(u);
      stack.push(u);
    }
  }
  return seen.size === g.n - removed.size;
}

describe('random c-nets (wheel + face splits + duals)', () => {
  it('the wheel W_k has 2k edges and k+1 faces (Euler), and is self-dual', () => {
    for (let k = 3; k < 9; k++) {
      const w = wheel(k);
      expect(edgeList(w).length).toBe(2 * k);
      expect(faces(w).length).toBe(k + 1);
      expect(dual(w).n).toBe(k + 1);
    }
  });

  it('produce plane, simple, 3-connected graphs with the requested number of edges (brute force check)', () => {
    const rng = mulberry32(1);
    for (let i = 0; i < 30; i++) {
      const m = [6, 8, 9, 10, 12, 15, 20][i % 7]!;
      const g = randomCNet(m, rng);
      expect(analysePlaneGraph(g).ok).toBe(true);
      expect(edgeList(g).length).toBe(m);
      // 3-connected (Tutte): removing any two vertices leaves the graph connected
      for (let a = 0; a < g.n; a++) for (let b = a + 1; b < g.n; b++) expect(connectedWithout(g, new Set([a, b]))).toBe(true);
    }
  });

  it('refuse edge counts no 3-connected graph has', () => {
    expect(() => randomCNet(7, mulberry32(1))).toThrow(RangeError);
    expect(() => randomCNet(5, mulberry32(1))).toThrow(RangeError);
  });

  it('are reproducible from the seed', () => {
    expect(randomCNet(20, mulberry32(5))).toEqual(randomCNet(20, mulberry32(5)));
  });
});
