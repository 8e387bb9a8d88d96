import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { canonicalKey, classifyTiling, dualOf, edgesOf, facesOf, parseTiling, solvePlaneNetwork, verifyTiling } from '../../../shared/tiling/index';
import { canonicalForm, edgeOrbits } from '../../../shared/foundry/canonical-graph';
import { exhaustiveTilings, passesGambini } from '../../../shared/foundry/exhaustive';
import { graphFromKey, planeGraphsWithEdges } from '../../../shared/foundry/generate-graphs';
import type { FoundTiling } from '../../../shared/foundry/found-tiling';
import { referenceGraphKeys } from './reference-generator';

// OEIS A002839: simple perfect squared rectangles of order n (squares included), n = 9..16.
const A002839 = [2, 6, 22, 67, 213, 744, 2609, 9016];
// OEIS A002881: simple imperfect squared rectangles of order n (squares included), n = 9..16.
const A002881 = [1, 0, 0, 9, 34, 104, 283, 953];

function catalogue(order: number): string[] {
  // Published catalogue (squaring.net), copied to tests/fixtures/foundry (see SOURCE.md).
  const text = readFileSync(join(import.meta.dirname, '../../fixtures/foundry', `o${order}spsr.bkp`), 'utf8');
  return text.split('\n').filter((l) => l.trim() !== '').map((l) => canonicalKey(parseTiling(l)));
}

describe('exhaustive squared rectangles', () => {
  it('finds as many simple perfect and simple imperfect rectangles as OEIS A002839 / A002881 for orders 9..16', () => {
    for (let n = 9; n <= 16; n++) {
      const s = exhaustiveTilings({ order: n });
      // Sources: OEIS A002839 (simple perfect) and A002881 (simple imperfect).
      expect({ n, perfect: s.simplePerfect, imperfect: s.simpleImperfect }).toEqual({ n, perfect: A002839[n - 9], imperfect: A002881[n - 9] });
      expect(s.stopped).toBe(false);
    }
  });

  it('gives exactly the published catalogue for orders 9..13', () => {
    for (let n = 9; n <= 13; n++) {
      const found: string[] = [];
      exhaustiveTilings({ order: n, onFound: (t) => { if (t.perfect) found.push(t.key); } });
      const published = catalogue(n);
      expect(new Set(published).size).toBe(published.length);
      expect(found.sort()).toEqual([...published].sort());
    }
  });

  it('gives exactly what the straightforward way gives: every graph of the level-by-level generator, every edge as pole, solvePlaneNetwork, classify (orders 9..14)', () => {
    for (let n = 9; n <= 14; n++) {
      const ours: string[] = [];
      exhaustiveTilings({ order: n, onFound: (t) => ours.push(t.key) });
      const theirs = new Set<string>();
      for (const key of referenceGraphKeys(n + 1)) {
        const g = graphFromKey(key);
        for (const [p, q] of edgesOf(g)) {
          const r = solvePlaneNetwork(g, { p, q });
          if (r.ok && classifyTiling(r.tiling).simple) theirs.add(canonicalKey(r.tiling));
        }
      }
      expect(new Set(ours).size).toBe(ours.length);
      expect(ours.sort()).toEqual([...theirs].sort());
    }
  });

  it('every result is verified, simple, of the asked order and reported once', () => {
    const seen = new Set<string>();
    exhaustiveTilings({
      order: 13,
      onFound: (t: FoundTiling) => {
        expect(verifyTiling(t.tiling)).toEqual({ ok: true });
        const c = classifyTiling(t.tiling);
        expect(c.simple).toBe(true);
        expect(c.order).toBe(13);
        expect(c.gcd).toBe(1);
        expect(seen.has(t.key)).toBe(false);
        seen.add(t.key);
      },
    });
    expect(seen.size).toBe(213 + 34);
  });

  it('full width + full height = number of spanning trees of the c-net, for every (graph, pole) pair up to 14 edges', () => {
    // Deletion-contraction with the matrix-tree theorem: tau(G) = tau(G - e) + tau(G / e)
    // (Brooks, Smith, Stone & Tutte 1940). tau(G) is computed here independently by
    // Kirchhoff's theorem as det of the Laplacian with one row and column removed.
    let pairs = 0;
    for (let m = 6; m <= 14; m++) {
      for (const { key } of planeGraphsWithEdges(m)) {
        const g = graphFromKey(key);
        const tau = spanningTrees(g.adj);
        for (const [p, q] of edgesOf(g)) {
          const r = solvePlaneNetwork(g, { p, q });
          if (!r.ok) { expect(r.code).toBe('zero-current'); continue; }
          expect(r.fullWidth + r.fullHeight).toBe(tau);
          expect(r.spanningTrees).toBe(tau);
          pairs++;
        }
      }
    }
    expect(pairs).toBeGreaterThan(500);
  });

  it('pole edges mapped onto each other by an automorphism give the same rectangle', () => {
    let checked = 0;
    for (const { key } of planeGraphsWithEdges(13)) {
      const g = graphFromKey(key);
      const { maps } = canonicalForm(g, true);
      const keyOf = (p: number, q: number) => {
        const r = solvePlaneNetwork(g, { p, q });
        return r.ok ? canonicalKey(r.tiling) : r.code;
      };
      for (const [p, q] of edgesOf(g)) {
        const k = keyOf(p, q);
        for (const sigma of maps) {
          expect(keyOf(sigma[p]!, sigma[q]!)).toBe(k);
          checked++;
        }
      }
      expect(edgeOrbits(g).length).toBeLessThanOrEqual(13);
    }
    expect(checked).toBeGreaterThan(500);
  });

  it('the dual c-net gives the same rectangle turned a quarter turn', () => {
    for (const { key } of planeGraphsWithEdges(12)) {
      const g = graphFromKey(key);
      const d = dualOf(g);
      const faces = facesOf(g);
      for (const [p, q] of edgesOf(g)) {
        // the dual edge joins the two faces on either side of (p, q)
        const f1 = faces.findIndex((f) => f.some((v, i) => v === p && f[(i + 1) % f.length] === q));
        const f2 = faces.findIndex((f) => f.some((v, i) => v === q && f[(i + 1) % f.length] === p));
        const a = solvePlaneNetwork(g, { p, q });
        const b = solvePlaneNetwork(d, { p: f1, q: f2 });
        expect(a.ok).toBe(b.ok);
        if (a.ok && b.ok) {
          expect(canonicalKey(b.tiling)).toBe(canonicalKey(a.tiling));
          expect(b.tiling.W).toBe(a.tiling.H);
        }
      }
    }
  });

  it("Gambini's filter rejects a pole of the wheel's hub and rim (two sides meeting two squares)", () => {
    const g = graphFromKey([...planeGraphsWithEdges(8)][0]!.key);
    const sizes = new Map<string, number>();
    for (const f of facesOf(g)) f.forEach((v, i) => sizes.set(`${v},${f[(i + 1) % f.length]}`, f.length));
    // W_4: every edge has two triangles or a degree-3 end beside it
    expect(edgesOf(g).every(([p, q]) => !passesGambini(g, p, q, sizes))).toBe(true);
  });

  it('stops when asked and rejects an order outside 5..25', () => {
    let calls = 0;
    const s = exhaustiveTilings({ order: 14, shouldStop: () => ++calls > 3 });
    expect(s.stopped).toBe(true);
    expect(() => exhaustiveTilings({ order: 4 })).toThrow(/order must be an integer in 5\.\.25, got 4/);
  });
});

/** Kirchhoff's matrix-tree theorem with exact fraction-free elimination (BigInt). */
function spanningTrees(adj: number[][]): bigint {
  const n = adj.length - 1;
  const a: bigint[][] = [];
  for (let i = 0; i < n; i++) {
    const row: bigint[] = Array.from({ length: n }, () => 0n);
    row[i] = BigInt(adj[i]!.length);
    for (const j of adj[i]!) if (j < n) row[j]! -= 1n;
    a.push(row);
  }
  let prev = 1n;
  for (let k = 0; k < n - 1; k++) {
    for (let i = k + 1; i < n; i++) {
      for (let j = k + 1; j < n; j++) a[i]![j] = (a[i]![j]! * a[k]![k]! - a[i]![k]! * a[k]![j]!) / prev;
    }
    prev = a[k]![k]!;
  }
  return a[n - 1]![n - 1]!;
}
