import { describe, expect, it } from 'vitest';
import { parseTiling } from '../../../shared/tiling/index';
import { edgeStops, firstFreePlace, isComplete, snap, step, stopsFor } from '../../../src/reader/assembly-geometry';

// The Assembly board's places (src/reader/assembly-geometry.ts), on the 33 x 32 rectangle of
// nine squares (Moroń 1925; Bouwkamp code 9 33 32 (18,15)(7,8)(14,4)(10,1)(9), as in the README).
const frame = { W: 33, H: 32 };
const moron = parseTiling('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)').squares.map((q) => ({ x: q.x, y: q.y, s: q.s }));

describe('places against an edge', () => {
  it('lie against the frame or a placed piece, inside the frame', () => {
    expect(edgeStops(33, 15, [{ at: 0, s: 18 }])).toEqual([0, 3, 18]);
    for (const v of edgeStops(33, 10, [{ at: 5, s: 7 }, { at: 20, s: 3 }])) expect(v >= 0 && v <= 23).toBe(true);
  });

  it('reach every square of the solution when the pieces go in top to bottom, left to right', () => {
    const placed: typeof moron = [];
    for (const q of [...moron].sort((a, b) => a.y - b.y || a.x - b.x)) {
      const { xs, ys } = stopsFor(frame, q.s, placed);
      expect(xs, `x of ${q.s}`).toContain(q.x);
      expect(ys, `y of ${q.s}`).toContain(q.y);
      placed.push(q);
    }
  });

  it('snap a drop within reach, and step from place to place', () => {
    expect(snap(17.4, [0, 18, 25], 1)).toBe(18);
    expect(snap(12.4, [0, 18, 25], 1)).toBe(12);
    expect(step(0, [0, 18, 25], 1)).toBe(18);
    expect(step(18, [0, 18, 25], -1)).toBe(0);
    expect(step(25, [0, 18, 25], 1)).toBe(25);
  });

  it('offer the first free place top to bottom and left to right', () => {
    expect(firstFreePlace(frame, 15, [{ x: 0, y: 0, s: 18 }])).toEqual({ x: 18, y: 0 });
    expect(firstFreePlace(frame, 18, [])).toEqual({ x: 0, y: 0 });
  });
});

describe('a complete board', () => {
  it('is the exact cover of the frame: all pieces, areas adding up, no overlap', () => {
    expect(isComplete(frame, moron, 9)).toBe(true);
    expect(isComplete(frame, moron.slice(1), 9)).toBe(false);
    const shifted = moron.map((q) => (q.s === 9 ? { ...q, x: q.x - 1 } : q));
    expect(isComplete(frame, shifted, 9)).toBe(false);
  });
});
