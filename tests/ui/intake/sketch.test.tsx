import { describe, expect, it } from 'vitest';
import { verifyTiling } from '../../../shared/tiling/index';
import { solveSketch } from '../../../src/features/submit/components/sketch-tab';

// The wheel W_4 drawn with straight edges: a hub and four rim nodes.
const nodes = [{ x: 240, y: 180 }, { x: 140, y: 80 }, { x: 340, y: 80 }, { x: 340, y: 280 }, { x: 140, y: 280 }];
const edges: [number, number][] = [[0, 1], [0, 2], [0, 3], [0, 4], [1, 2], [2, 3], [3, 4], [4, 1]];

describe('Sketch network: solving the drawing', () => {
  it('turns the wheel W4 with a rim pole edge into a verified tiling; its network has 45 spanning trees', () => {
    const r = solveSketch(nodes, edges, [1, 2]);
    if (r.kind !== 'ok') throw new Error(r.message);
    expect(verifyTiling(r.tiling)).toEqual({ ok: true });
    // 7 edges besides the pole edge: 7 squares
    expect(r.tiling.squares).toHaveLength(7);
    // OEIS A004146: the wheel with 4 rim vertices has 45 spanning trees (L(8) - 2, Lucas numbers)
    expect(r.spanningTrees).toBe(45n);
  });

  it('names the two crossing edges of a drawing that is not plane', () => {
    // a square with both diagonals and no centre node
    const r = solveSketch(nodes.slice(1), [[0, 2], [1, 3], [0, 1], [1, 2], [2, 3], [3, 0]], [0, 1]);
    expect(r).toMatchObject({ kind: 'error', edges: [0, 1] });
  });

  it('says so when the drawing is disconnected or the poles are not joined by an edge', () => {
    const apart = solveSketch([...nodes, { x: 450, y: 180 }, { x: 470, y: 200 }], [...edges, [5, 6]], [1, 2]);
    expect(apart).toMatchObject({ kind: 'error' });
    expect(apart.kind === 'error' && apart.message).toMatch(/not connected/);
    const notJoined = solveSketch(nodes, edges, [1, 3]);
    expect(notJoined.kind === 'error' && notJoined.message).toMatch(/joined by an edge/);
  });

  it('asks for more before there is a network, and for the poles before solving', () => {
    expect(solveSketch([], [], null).kind).toBe('empty');
    const noPoles = solveSketch(nodes, edges, null);
    expect(noPoles.kind === 'empty' && noPoles.message).toMatch(/poles/);
  });

  it('explains a zero current: the balanced Wheatstone bridge carries nothing across its bridge', () => {
    // Kirchhoff: with four equal resistors the bridge B-C joins two points of equal potential
    const bridge = [{ x: 100, y: 40 }, { x: 200, y: 150 }, { x: 300, y: 210 }, { x: 100, y: 320 }];
    const r = solveSketch(bridge, [[0, 1], [0, 2], [1, 3], [2, 3], [1, 2], [0, 3]], [0, 3]);
    expect(r.kind === 'error' && r.message).toMatch(/no current/);
  });
});
