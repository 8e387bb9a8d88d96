import { describe, expect, it } from 'vitest';
import { parseTiling, smithDiagram } from '../../../shared/tiling/index';
import { O9_33x32, catalogue } from './helpers';

describe('smithDiagram (Brooks, Smith, Stone & Tutte 1940)', () => {
  const t = parseTiling(O9_33x32);

  it('has a node per maximal horizontal segment, potential = height above the bottom', () => {
    const d = smithDiagram(t);
    expect(d.nodes.map((n) => [n.at, n.start, n.end, n.potential])).toEqual([
      [0, 0, 33, 32],
      [15, 18, 33, 17],
      [18, 0, 18, 14],
      [22, 14, 25, 10],
      [23, 24, 33, 9],
      [32, 0, 33, 0],
    ]);
    expect(d.nodes[0]!.pole).toBe('positive');
    expect(d.nodes[5]!.pole).toBe('negative');
    expect(d.pole).toMatchObject({ from: 0, to: 5, current: 33 });
    // drawing data: an arc outside the right side from the top-right to the bottom-right corner
    expect(d.pole.path[0]).toEqual({ x: 33, y: 0 });
    expect(d.pole.path.at(-1)).toEqual({ x: 33, y: 32 });
    expect(d.pole.path.every((p) => p.x >= 33)).toBe(true);
  });

  it('has an edge per square from its top segment to its bottom segment, current = side', () => {
    const d = smithDiagram(t);
    expect(d.edges.map((e) => [e.from, e.to, e.current])).toEqual([
      [0, 2, 18],
      [0, 1, 15],
      [1, 3, 7],
      [1, 4, 8],
      [2, 5, 14],
      [2, 3, 4],
      [3, 5, 10],
      [3, 4, 1],
      [4, 5, 9],
    ]);
    expect(d.edges[0]!.line).toEqual({ x1: 9, y1: 0, x2: 9, y2: 18 });
  });

  it('the vertical diagram uses vertical segments with potential = distance from the right side', () => {
    const d = smithDiagram(t, 'vertical');
    expect(d.direction).toBe('vertical');
    expect(d.nodes[0]).toMatchObject({ at: 0, start: 0, end: 32, potential: 33, pole: 'positive', line: { x1: 0, y1: 0, x2: 0, y2: 32 } });
    expect(d.nodes.at(-1)).toMatchObject({ at: 33, potential: 0, pole: 'negative' });
    expect(d.pole.current).toBe(32);
    expect(d.edges.length).toBe(9);
  });

  it('merges touching pieces of one line (a cross) into one segment', () => {
    // four unit squares meeting at (1,1): the middle line is one segment, not two
    const d = smithDiagram(parseTiling('(1,1)(1,1)'));
    expect(d.nodes.map((n) => [n.at, n.start, n.end])).toEqual([
      [0, 0, 2],
      [1, 0, 2],
      [2, 0, 2],
    ]);
  });

  it('its rotation system is a simple plane c-net with the pole edge', () => {
    const d = smithDiagram(t);
    expect(d.graph.n).toBe(6);
    expect(d.graph.adj.reduce((a, l) => a + l.length, 0)).toBe(2 * 10); // 9 squares + pole edge
    expect(d.graph.adj[0]).toContain(5);
  });

  it('the c-net of every simple catalogue tiling is 3-connected (BSST 1940; reference facts), brute force', () => {
    for (const { code } of catalogue()) {
      const g = smithDiagram(parseTiling(code)).graph;
      for (let a = 0; a < g.n; a++) {
        for (let b = a + 1; b < g.n; b++) {
          const start = [...Array(g.n).keys()].find((v) => v !== a && v !== b)!;
          const seen = new Set([start]);
          const stack = [start];
          while (stack.length > 0) {
            for (const u of g.adj[stack.pop()!]!) {
              if (u === a || u === b || seen.has(u)) continue;
              seen.add(u);
              stack.push(u);
            }
          }
          expect(seen.size, `${code} without ${a}, ${b}`).toBe(g.n - 2);
        }
      }
    }
  });
});
