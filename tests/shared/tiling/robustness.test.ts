import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { TilingInputError, checkKirchhoff, parseTiling, planeGraphFromDrawing, solvePlaneNetwork, tilingFromSquares, verifyTiling } from '../../../shared/tiling/index';

// Every public entry point meets arbitrary outside data with a clear rejection, never a crash
// (fast-check, seeded).
describe('public entry points on arbitrary input', () => {
  it('parseTiling and tilingFromSquares throw only TilingInputError', () => {
    fc.assert(
      fc.property(fc.oneof(fc.string(), fc.json(), fc.anything()), (x) => {
        for (const f of [() => parseTiling(x as string), () => tilingFromSquares(x as never)]) {
          try {
            f();
          } catch (e) {
            expect(e).toBeInstanceOf(TilingInputError);
          }
        }
      }),
      { seed: 1234, numRuns: 2000 },
    );
  });

  it('solvePlaneNetwork answers { ok: false } on malformed graphs and poles, never throwing', () => {
    const graph = fc.oneof(
      fc.anything(),
      fc.record({ n: fc.integer({ min: -2, max: 8 }), adj: fc.array(fc.array(fc.oneof(fc.integer({ min: -1, max: 9 }), fc.anything()), { maxLength: 6 }), { maxLength: 9 }) }),
    );
    fc.assert(
      fc.property(graph, fc.anything(), fc.record({ p: fc.integer({ min: -1, max: 9 }), q: fc.integer({ min: -1, max: 9 }) }), (g, junk, pole) => {
        const r = solvePlaneNetwork(g as never, pole);
        if (r.ok) expect(verifyTiling(r.tiling)).toEqual({ ok: true });
        else expect(r.message.length).toBeGreaterThan(5);
        expect(() => solvePlaneNetwork(g as never, junk as never)).not.toThrow();
      }),
      { seed: 4321, numRuns: 2000 },
    );
  });

  it('planeGraphFromDrawing returns a graph or a TilingInputError, never throwing', () => {
    fc.assert(
      fc.property(fc.array(fc.record({ x: fc.integer({ min: 0, max: 4 }), y: fc.integer({ min: 0, max: 4 }) }), { maxLength: 8 }), fc.array(fc.tuple(fc.integer({ min: -1, max: 8 }), fc.integer({ min: -1, max: 8 })), { maxLength: 12 }), (nodes, edges) => {
        const r = planeGraphFromDrawing(nodes, edges);
        if (!(r instanceof TilingInputError)) expect(r.adj.length).toBe(nodes.length);
      }),
      { seed: 99, numRuns: 2000 },
    );
  });

  it('verifyTiling and checkKirchhoff report, never throw, on malformed tilings', () => {
    fc.assert(
      fc.property(fc.record({ W: fc.integer({ min: -1, max: 6 }), H: fc.integer({ min: -1, max: 6 }), squares: fc.array(fc.record({ x: fc.integer({ min: -1, max: 6 }), y: fc.integer({ min: -1, max: 6 }), s: fc.integer({ min: -1, max: 6 }) }), { maxLength: 6 }) }), (t) => {
        const v = verifyTiling(t);
        const k = checkKirchhoff(t);
        // an exact tiling satisfies both laws (BSST 1940); a broken one may or may not
        if (v.ok) expect(k).toEqual({ ok: true, violations: [] });
        else expect(v.message.length).toBeGreaterThan(5);
      }),
      { seed: 5, numRuns: 2000 },
    );
  });
});
