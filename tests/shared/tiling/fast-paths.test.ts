import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  TilingInputError,
  canonicalForm,
  classifyTiling,
  edgesOf,
  mulberry32,
  orientations,
  parseTiling,
  randomCNet,
  solvePlaneNetwork,
  toBouwkamp,
  toTableCode,
  verifyTiling,
  type Tiling,
} from '../../../shared/tiling/index';
import { acceptCode, tilingFacts } from '../../../shared/tiling/tiling-facts';
import { readCarefully } from '../../../shared/tiling/parse';
import { core } from '../../../shared/tiling/tiling-core';
import { bruteForceSubRectangles, referenceCanonical, referenceClassification, referenceSubRectangles } from './reference';
import { O21_112, O24_175, O9_33x32, catalogue, greedyTiling } from './helpers';

// The fast paths (one skyline decode in tiling-core.ts, the one-pass reader read-fast.ts)
// against the straightforward ones (reference.ts: segments by sorting, brute force, all
// orientations compared; parse.ts's careful reader), on seeded random tilings.

function solved(seed: number, count: number, minEdges: number, maxEdges: number): Tiling[] {
  const rng = mulberry32(seed);
  const out: Tiling[] = [];
  while (out.length < count) {
    const g = randomCNet(minEdges + Math.floor(rng() * (maxEdges - minEdges + 1)), rng);
    const es = edgesOf(g);
    const [p, q] = es[Math.floor(rng() * es.length)]!;
    const r = solvePlaneNetwork(g, { p, q });
    if (r.ok) out.push(r.tiling);
  }
  return out;
}

/** Two tilings side by side (compound), the second turned a quarter turn when that fits. */
function sideBySide(a: Tiling, b: Tiling): Tiling | null {
  const bb = b.H === a.H ? b : b.W === a.H ? orientations(b, { all: true }).find((o) => o.H === a.H)! : null;
  if (!bb) return null;
  return { W: a.W + bb.W, H: a.H, squares: [...a.squares, ...bb.squares.map((q) => ({ x: q.x + a.W, y: q.y, s: q.s }))] };
}

const sorted = (rs: { x: number; y: number; w: number; h: number }[]) => rs.map((r) => `${r.x},${r.y},${r.w},${r.h}`).sort();

function compare(t: Tiling): void {
  const fast = classifyTiling(t);
  const ref = referenceClassification(t);
  expect({ ...fast, subRectangles: sorted(fast.subRectangles) }).toEqual({ ...ref, subRectangles: sorted(ref.subRectangles), subRectanglesTruncated: false });
  const c = canonicalForm(t);
  expect(c).toEqual(referenceCanonical(t));
}

describe('fast classification and canonical form = the straightforward ones', () => {
  it('on simple tilings solved from seeded random c-nets, orders 7 to 40, in all eight orientations', () => {
    for (const t of solved(1, 150, 8, 41)) for (const o of orientations(t, { all: true })) compare(o);
  });

  it('on imperfect and compound tilings (greedy fills and pairs side by side), in all orientations (fast-check, seeded)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 14 }), fc.integer({ min: 1, max: 14 }), fc.array(fc.integer({ min: 1, max: 7 }), { minLength: 30, maxLength: 30 }), (W, H, picks) => {
        for (const o of orientations(greedyTiling(W, H, picks), { all: true })) compare(o);
      }),
      { seed: 21, numRuns: 400 },
    );
    const simple = solved(2, 40, 10, 20);
    for (let i = 0; i + 1 < simple.length; i++) {
      const t = sideBySide(simple[i]!, simple[i + 1]!);
      if (t) for (const o of orientations(t, { all: true })) compare(o);
    }
    for (const code of [O9_33x32, O21_112, O24_175]) compare(parseTiling(code));
  });

  it('sub-rectangles by segments agree with a brute-force union-of-squares test on small tilings', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 9 }), fc.integer({ min: 1, max: 9 }), fc.array(fc.integer({ min: 1, max: 5 }), { minLength: 20, maxLength: 20 }), (W, H, picks) => {
        const t = greedyTiling(W, H, picks);
        expect(sorted(referenceSubRectangles(t))).toEqual(sorted(bruteForceSubRectangles(t)));
        expect(sorted(classifyTiling(t).subRectangles)).toEqual(sorted(bruteForceSubRectangles(t)));
      }),
      { seed: 8, numRuns: 500 },
    );
  });

  it('loading by decode accepts exactly the tilings verifyTiling accepts (a moved, grown or shrunk square breaks it)', () => {
    const rng = mulberry32(3);
    for (const t of [...solved(4, 60, 8, 30), ...catalogue().slice(0, 40).map((c) => parseTiling(c.code))]) {
      expect(core.load(t)).toBe(true);
      for (let k = 0; k < 5; k++) {
        const b = { W: t.W, H: t.H, squares: t.squares.map((q) => ({ ...q })) };
        const q = b.squares[Math.floor(rng() * b.squares.length)]!;
        const what = Math.floor(rng() * 4);
        if (what === 0) q.x += 1;
        else if (what === 1) q.y -= 1;
        else if (what === 2) q.s += 1;
        else b.W += 1;
        expect(core.load(b)).toBe(verifyTiling(b).ok);
      }
    }
  });
});

function outcome(f: () => Tiling) {
  try {
    return { tiling: f() };
  } catch (e) {
    if (!(e instanceof TilingInputError)) throw e;
    return { error: [e.code, e.message, e.where] };
  }
}

describe('the fast reader = the careful reader', () => {
  it('reads every catalogue code, random codes in every notation, and their variants exactly as the careful reader does', () => {
    const codes: string[] = catalogue().map((c) => c.code);
    for (const t of solved(5, 120, 8, 40)) {
      codes.push(toBouwkamp(t), toBouwkamp(t, { header: false }), toTableCode(t), toTableCode(t, { header: false }));
      codes.push(toBouwkamp(t).replace(/\(/g, '[').replace(/\)/g, ']'), toBouwkamp(t).replace(/,/g, ' ') + ' * caption 12 (3)');
    }
    // (a headerless table code whose first size happens to equal the count minus 3 reads as
    // having a header, in both readers alike: compare outcomes, not just tilings)
    for (const code of codes) expect(outcome(() => parseTiling(code))).toEqual(outcome(() => readCarefully(code)));
  });

  it('on mutated codes gives the same tiling or the same error (kind, message, place) as the careful reader (fast-check, seeded)', () => {
    const base = solved(6, 30, 9, 25).map((t) => toBouwkamp(t));
    fc.assert(
      fc.property(fc.constantFrom(...base), fc.nat(400), fc.constantFrom('0', '1', '9', ' ', ',', '(', ')', '[', ']', '', 'x', '-', '.', '*', '{'), (code, at, ch) => {
        const i = at % (code.length + 1);
        for (const m of [code.slice(0, i) + ch + code.slice(i), code.slice(0, i) + ch + code.slice(i + 1)]) {
          expect(outcome(() => parseTiling(m))).toEqual(outcome(() => readCarefully(m)));
        }
      }),
      { seed: 13, numRuns: 3000 },
    );
  });
});

describe('acceptCode and tilingFacts', () => {
  it('give the tiling, classification, canonical code and key the separate entry points give', () => {
    for (const t of solved(7, 60, 8, 40)) {
      for (const code of [toBouwkamp(t), toTableCode(t)]) {
        const a = acceptCode(code, true);
        const t2 = parseTiling(code);
        expect(a.tiling).toEqual(t2);
        expect(a.classification).toEqual(classifyTiling(t2));
        const c = canonicalForm(t2);
        expect([a.code, a.key, a.canonicalTiling]).toEqual([c.code, c.key, c.tiling]);
      }
      expect(tilingFacts(t).key).toBe(canonicalForm(t).key);
    }
    expect(() => acceptCode('9 33 32 (18,15)(7,8)(14,10)(4,1)(9)')).toThrow(/element 6 \(size 10\) is wider than the free segment \(4\) at x=14, y=18/);
    expect(() => tilingFacts({ W: 2, H: 1, squares: [{ x: 0, y: 0, s: 1 }, { x: 0, y: 0, s: 1 }] })).toThrow(TilingInputError);
  });
});
