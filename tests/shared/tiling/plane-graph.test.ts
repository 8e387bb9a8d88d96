import { describe, expect, it } from 'vitest';
import { analysePlaneGraph } from '../../../shared/tiling/plane-graph';
import { dartArrays, dualOf, edgeCount, edgesOf, facesOf, mulberry32, randomCNet, splitFace, wheel } from '../../../shared/tiling/index';

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
    const b = analysePlaneGraph(dualOf(g));
    if (!a.ok || !b.ok) throw new Error('not plane');
    expect(dualOf(g).n).toBe(a.darts.faceCount);
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

describe('operations on rotation systems (faces, dual, face split, wheel)', () => {
  it('the wheel W_k (hub 0, rim 1..k) has 2k edges and k + 1 faces: k triangles and the rim (Euler), and is self-dual in size', () => {
    for (let k = 3; k < 9; k++) {
      const w = wheel(k);
      expect(analysePlaneGraph(w).ok).toBe(true);
      expect(w.adj[0]).toEqual(Array.from({ length: k }, (_, i) => i + 1));
      expect(edgeCount(w)).toBe(2 * k);
      expect(edgesOf(w)).toHaveLength(2 * k);
      const sizes = facesOf(w).map((f) => f.length).sort((x, y) => x - y);
      expect(sizes).toEqual([...Array<number>(k).fill(3), k].sort((x, y) => x - y));
      const d = dualOf(w);
      expect([d.n, edgeCount(d)]).toEqual([k + 1, 2 * k]);
    }
    expect(() => wheel(2)).toThrow(RangeError);
  });

  it('facesOf numbers and traces the faces as analysePlaneGraph does, every dart once', () => {
    const rng = mulberry32(12);
    for (let i = 0; i < 20; i++) {
      const g = randomCNet(8 + Math.floor(rng() * 40), rng);
      const a = analysePlaneGraph(g);
      if (!a.ok) throw new Error(a.message);
      const { first, face } = a.darts;
      const fs = facesOf(g);
      expect(fs).toHaveLength(a.darts.faceCount);
      let darts = 0;
      fs.forEach((f, id) => f.forEach((u, t) => {
        const v = f[(t + 1) % f.length]!;
        expect(face[first[u]! + g.adj[u]!.indexOf(v)]).toBe(id);
        darts++;
      }));
      expect(darts).toBe(2 * edgeCount(g));
    }
  });

  it('the dual has a vertex of degree |f| per face f, joined across each edge, and its dual has the shape of the graph', () => {
    const rng = mulberry32(13);
    for (let i = 0; i < 20; i++) {
      const g = randomCNet(8 + Math.floor(rng() * 40), rng);
      const fs = facesOf(g);
      const d = dualOf(g);
      expect(analysePlaneGraph(d).ok).toBe(true);
      expect(d.adj.map((r) => r.length)).toEqual(fs.map((f) => f.length));
      // around face f, position t lists the face on the other side of the dart f[t] -> f[t+1]
      d.adj.forEach((row, id) => row.forEach((across, t) => {
        const u = fs[id]![t]!;
        const v = fs[id]![(t + 1) % fs[id]!.length]!;
        const other = fs[across]!;
        expect(other.some((x, s) => x === v && other[(s + 1) % other.length] === u)).toBe(true);
      }));
      const dd = dualOf(d);
      expect(dd.n).toBe(g.n);
      expect(dd.adj.map((r) => r.length).sort((x, y) => x - y)).toEqual(g.adj.map((r) => r.length).sort((x, y) => x - y));
    }
  });

  it('a face split adds one edge and cuts one face of k corners into faces of j - i + 1 and k - (j - i) + 1 corners, leaving the input as it was', () => {
    const g = wheel(6);
    const before = JSON.stringify(g);
    const rim = facesOf(g).find((f) => f.length === 6)!;
    const h = splitFace(g, rim, 1, 4);
    expect(JSON.stringify(g)).toBe(before);
    expect(analysePlaneGraph(h).ok).toBe(true);
    expect(edgeCount(h)).toBe(13);
    expect(h.adj[rim[1]!]).toContain(rim[4]);
    expect(facesOf(h).map((f) => f.length).sort((x, y) => x - y)).toEqual([3, 3, 3, 3, 3, 3, 4, 4]);
  });

  it('dartArrays: dart first[v] + i runs v -> adj[v][i], its reverse runs back, and a one-way edge has no reverse (-1)', () => {
    const g = randomCNet(30, mulberry32(14));
    const { first, tail, head, rev } = dartArrays(g);
    expect(first[g.n]).toBe(2 * edgeCount(g));
    for (let v = 0; v < g.n; v++) g.adj[v]!.forEach((u, i) => expect([tail[first[v]! + i], head[first[v]! + i]]).toEqual([v, u]));
    rev.forEach((r, d) => {
      expect([tail[r], head[r]]).toEqual([head[d], tail[d]]);
      expect(rev[r]).toBe(d);
    });
    expect([...dartArrays({ n: 3, adj: [[1, 2], [0], [1]] }).rev]).toEqual([2, -1, 0, -1]);
  });
});
