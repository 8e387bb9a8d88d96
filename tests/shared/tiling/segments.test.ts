import { describe, expect, it } from 'vitest';
import { maximalSegments } from '../../../shared/tiling/segments';
import { parseTiling } from '../../../shared/tiling/index';
import { O9_33x32 } from './helpers';

describe('maximalSegments', () => {
  it('finds the 6 horizontal and 6 vertical segments of the 33 x 32 (reference facts: y = 0, 15, 18, 22, 23, 32)', () => {
    const t = parseTiling(O9_33x32);
    const h = maximalSegments(t);
    expect(h.at).toEqual([0, 15, 18, 22, 23, 32]);
    const v = maximalSegments(t, true);
    expect(v.at).toEqual([0, 14, 18, 24, 25, 33]);
    // square 1 (the 18 at the top left) hangs from segment 0 and stands on the segment at y = 18
    expect([h.before[0], h.at[h.after[0]!]]).toEqual([0, 18]);
  });

  it('keeps collinear pieces with a gap apart and merges touching ones', () => {
    // a 3 x 2: a 2 on the left, two 1s stacked on the right; the line y = 1 only spans x 2..3
    const t = parseTiling('(2,1)(1)');
    const h = maximalSegments(t);
    expect(h.at.map((y, i) => [y, h.start[i], h.end[i]])).toEqual([
      [0, 0, 3],
      [1, 2, 3],
      [2, 0, 3],
    ]);
  });

  it('sorts with a comparator when packed keys would pass 2^52', () => {
    const s = 2 ** 30;
    const h = maximalSegments({ W: 2 * s, H: s, squares: [{ x: s, y: 0, s }, { x: 0, y: 0, s }] });
    expect(h.at).toEqual([0, s]);
    expect([h.start[0], h.end[0]]).toEqual([0, 2 * s]);
  });
});
