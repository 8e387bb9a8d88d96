import { describe, expect, it } from 'vitest';
import { TilingInputError, planeGraphFromDrawing, solvePlaneNetwork, canonicalCode, smithDiagram, parseTiling } from '../../../shared/tiling/index';
import { O9_33x32 } from './helpers';

describe('planeGraphFromDrawing: straight-line drawings to rotation systems', () => {
  it('the drawn Smith diagram of the 33 x 32 solves back to it (BSST 1940)', () => {
    // node positions: each segment at (midpoint x, y); the pole edge drawn as a detour is not
    // straight, so place the poles where a straight pole edge stays outside: far left
    const d = smithDiagram(parseTiling(O9_33x32));
    const nodes = d.nodes.map((n) => ({ x: (n.start + n.end) / 2, y: n.at }));
    nodes[0] = { x: -40, y: 0 };
    nodes[5] = { x: -40, y: 32 };
    const edges: [number, number][] = d.edges.map((e) => [e.from, e.to]);
    edges.push([0, 5]);
    const g = planeGraphFromDrawing(nodes, edges);
    if (g instanceof TilingInputError) throw g;
    const r = solvePlaneNetwork(g, { p: 0, q: 5 });
    if (!r.ok) throw new Error(r.message);
    expect(canonicalCode(r.tiling)).toBe(O9_33x32);
  });

  it('names the two crossing edges', () => {
    const e = planeGraphFromDrawing([{ x: 0, y: 0 }, { x: 1, y: 0 }, { x: 1, y: 1 }, { x: 0, y: 1 }], [[0, 1], [0, 2], [1, 3]]);
    expect(e).toBeInstanceOf(TilingInputError);
    expect((e as TilingInputError).code).toBe('crossing');
    expect((e as TilingInputError).message).toBe('edges 1 (0-2) and 2 (1-3) cross');
    expect((e as TilingInputError).where?.edges).toEqual([1, 2]);
  });

  it('rejects a node lying on an edge, touching and overlapping edges', () => {
    const onEdge = planeGraphFromDrawing([{ x: 0, y: 0 }, { x: 2, y: 0 }, { x: 1, y: 0 }], [[0, 1]]);
    expect((onEdge as TilingInputError).code).toBe('node-on-edge');
    const touching = planeGraphFromDrawing([{ x: 0, y: 0 }, { x: 2, y: 0 }, { x: 1, y: 0 }, { x: 1, y: 1 }], [[0, 1], [2, 3]]);
    expect((touching as TilingInputError).code).toBe('node-on-edge');
    const t = planeGraphFromDrawing([{ x: 0, y: 0 }, { x: 2, y: 0 }, { x: 1, y: -1 }, { x: 1, y: 1 }, { x: 5, y: 5 }], [[0, 1], [2, 3]]);
    expect((t as TilingInputError).code).toBe('crossing');
  });

  it('rejects malformed drawings', () => {
    const bad = (n: unknown, e: unknown) => (planeGraphFromDrawing(n as never, e as never) as TilingInputError).code;
    expect(bad([{ x: 0, y: 0 }], [])).toBe('bad-drawing');
    expect(bad([{ x: 0, y: 0 }, { x: 0, y: 0 }], [])).toBe('bad-drawing');
    expect(bad([{ x: 0, y: 0 }, { x: 1, y: Infinity }], [])).toBe('bad-drawing');
    expect(bad([{ x: 0, y: 0 }, { x: 1, y: 0 }], [[0, 0]])).toBe('bad-drawing');
    expect(bad([{ x: 0, y: 0 }, { x: 1, y: 0 }], [[0, 2]])).toBe('bad-drawing');
    expect(bad([{ x: 0, y: 0 }, { x: 1, y: 0 }], [[0, 1], [1, 0]])).toBe('bad-drawing');
    expect(bad([{ x: 0, y: 0 }, { x: 1, y: 0 }], [[0]])).toBe('bad-drawing');
    expect(bad(null, [])).toBe('bad-drawing');
    expect(bad(Array.from({ length: 1001 }, (_, i) => ({ x: i, y: 0 })), [])).toBe('too-large');
  });

  it('sorts neighbours by angle', () => {
    // a star: centre 0 with neighbours east (1), north-ish (2), west (3), south-ish (4) in y-down coordinates
    const g = planeGraphFromDrawing([{ x: 0, y: 0 }, { x: 1, y: 0 }, { x: 0, y: -1 }, { x: -1, y: 0 }, { x: 0, y: 1 }], [[0, 1], [0, 2], [0, 3], [0, 4]]);
    expect((g as { adj: number[][] }).adj[0]).toEqual([2, 1, 4, 3]); // angles -pi/2, 0, pi/2, pi
  });
});
