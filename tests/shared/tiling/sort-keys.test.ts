import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { sortKeys } from '../../../shared/tiling/sort-keys';

describe('sortKeys', () => {
  it('sorts like the native numeric sort, short and long arrays (fast-check, seeded)', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 0, max: 2 ** 40 }), { maxLength: 120 }), (xs) => {
        const a = Float64Array.from(xs);
        sortKeys(a);
        expect(Array.from(a)).toEqual(xs.slice().sort((p, q) => p - q));
      }),
      { seed: 8, numRuns: 500 },
    );
  });
});
