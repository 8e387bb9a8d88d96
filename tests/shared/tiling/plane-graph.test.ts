import { describe, expect, it } from 'vitest';
import { analysePlaneGraph } from '../../../shared/tiling/plane-graph';
import { dual, mulberry32, randomCNet, wheel } from '../../../shared/tiling/index';

describe('analysePlaneGraph: rotation systems', () => {
  it("K4 as the wheel W_3 has 4 faces (Euler's formula V - E + F = 2)", () => {
    const a = analysePlaneGraph(wheel(3));
    if (!a.ok) throw new Error(a.message);
    expect([a.darts.edgeCount, a.darts.faceCount]).toEqual([6, 4]);
  });

  it('every dart belongs to exactly one face, its successor walk closes, and rev is an involution', () => {
    const g = randomCNet(24, mulberry32(3));
    const a = analysePlaneGraph(g);
    if (!a.ok) throw new Error(a.message);
    const { rev, face, faceNext, faceFirst, faceCount } = a.darts;
    let total = 0;
    for (let f = 0; f < faceCount; f++) {
      let d = faceFirst[f]!;
      do {
        expect(face[d]).toBe(f);
        total++;
        d = faceNext[d]!;
      } while (d !== faceFirst[f]);
    }
    expect(total).toBe(rev.length);
    rev.forEach((r, d) => expect(rev[r]).toBe(d));
  });

  it('the dual of a c-net has as many vertices as the c-net has faces, and the same edges', () => {
    const g = randomCNet(18, mulberry32(4));
    const a = analysePlaneGraph(g);
    const b = analysePlaneGraph(dual(g));
    if (!a.ok || !b.ok) throw new Error('not plane');
    expect(dual(g).n).toBe(a.darts.faceCount);
    expect(b.darts.edgeCount).toBe(a.darts.edgeCount);
    expect(b.darts.faceCount).toBe(g.n);
  });

  it('names the asymmetric edge, the repeated neighbour and the unreachable vertex', () => {
    expect(analysePlaneGraph({ n: 3, adj: [[1, 2], [0], [1]] })).toMatchObject({ ok: false, message: 'edge 0-2 appears in adj[0] but 0 is missing from adj[2]' });
    expect(analysePlaneGraph({ n: 2, adj: [[1, 1], [0, 0]] })).toMatchObject({ ok: false, message: 'vertex 0 lists neighbour 1 twice; parallel edges are not accepted' });
    expect(analysePlaneGraph({ n: 4, adj: [[1], [0], [3], [2]] })).toMatchObject({ ok: false, code: 'disconnected', message: 'the graph is not connected: vertex 2 cannot be reached from vertex 0' });
    expect(analysePlaneGraph({ n: 2, adj: [[1], 'x' as never] })).toMatchObject({ ok: false, message: 'adj[1] is not an array' });
    expect(analysePlaneGraph({ n: 2.5, adj: [] })).toMatchObject({ ok: false, code: 'not-plane' });
  });
});
