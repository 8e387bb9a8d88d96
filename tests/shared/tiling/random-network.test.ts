import { describe, expect, it } from 'vitest';
import { analysePlaneGraph } from '../../../shared/tiling/plane-graph';
import { edgeCount, facesOf, mulberry32, randomCNet } from '../../../shared/tiling/index';
import { isThreeConnected } from './helpers';

describe('random c-nets (wheel + face splits + duals)', () => {
  it('produce plane, simple, 3-connected graphs with the requested number of edges (brute force check)', () => {
    const rng = mulberry32(1);
    for (let i = 0; i < 30; i++) {
      const m = [6, 8, 9, 10, 12, 15, 20][i % 7]!;
      const g = randomCNet(m, rng);
      expect(analysePlaneGraph(g).ok).toBe(true);
      expect(edgeCount(g)).toBe(m);
      // 3-connected (Tutte): simple, and removing any one or two vertices leaves it connected
      expect(isThreeConnected(g)).toBe(true);
    }
  });

  it('have the asked number of edges from 8 to 41, satisfy Euler (V - E + F = 2) and have minimum degree 3', () => {
    const rng = mulberry32(5);
    for (let m = 8; m <= 41; m++) {
      const g = randomCNet(m, rng);
      expect(edgeCount(g)).toBe(m);
      expect(g.n - m + facesOf(g).length).toBe(2);
      expect(Math.min(...g.adj.map((a) => a.length))).toBeGreaterThanOrEqual(3);
    }
  });

  it('refuse edge counts no 3-connected graph has', () => {
    expect(() => randomCNet(7, mulberry32(1))).toThrow(RangeError);
    expect(() => randomCNet(5, mulberry32(1))).toThrow(RangeError);
  });

  it('are reproducible from the seed, and another seed gives other graphs', () => {
    expect(randomCNet(20, mulberry32(5))).toEqual(randomCNet(20, mulberry32(5)));
    const a = [1, 2, 3].map((seed) => JSON.stringify(randomCNet(30, mulberry32(seed))));
    expect(new Set(a).size).toBe(3);
  });
});
