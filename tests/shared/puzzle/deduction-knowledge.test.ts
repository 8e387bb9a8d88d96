import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { WeightedUnionFind } from '../../../shared/puzzle/deduction-knowledge';

describe('weighted union-find', () => {
  it('knows coord(b) - coord(a) exactly when a chain of facts links them, with the right value (seeded property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: -50, max: 50 }), { minLength: 8, maxLength: 8 }),
        fc.array(fc.tuple(fc.nat(7), fc.nat(7)), { maxLength: 12 }),
        (coords, facts) => {
          const u = new WeightedUnionFind(8);
          // brute force: connectivity by repeated relaxation
          const comp = Array.from({ length: 8 }, (_, i) => i);
          for (const [a, b] of facts) {
            u.union(a, b, coords[b]! - coords[a]!);
            const ca = comp[a]!;
            const cb = comp[b]!;
            for (let i = 0; i < 8; i++) if (comp[i] === cb) comp[i] = ca;
          }
          for (let a = 0; a < 8; a++) for (let b = 0; b < 8; b++) {
            const r = u.relation(a, b);
            if (comp[a] === comp[b]) expect(r).toBe(coords[b]! - coords[a]!);
            else expect(r).toBeNull();
          }
        },
      ),
      { seed: 20261202, numRuns: 200 },
    );
  });

  it('rejects a contradicting fact', () => {
    const u = new WeightedUnionFind(3);
    u.union(0, 1, 5);
    u.union(1, 2, 2);
    expect(u.union(0, 2, 7)).toBe(false);
    expect(() => u.union(0, 2, 8)).toThrow(/contradiction/);
  });
});
