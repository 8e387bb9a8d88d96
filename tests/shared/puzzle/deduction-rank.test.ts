import { describe, expect, it } from 'vitest';
import { all, create } from 'mathjs';
import { mulberry32, parseTiling } from '../../../shared/tiling/index';
import { kirchhoffSystem, proveUniqueByRank } from '../../../shared/puzzle/deduction-rank';
import { isSolvable } from '../../../shared/puzzle/deduction-propagate';
import { tilingLayout } from '../../../shared/puzzle/layout-graph';
import { catalogue } from './catalogue';

// mathjs with exact fractions is the outside oracle for the linear algebra
const math = create(all ?? {}, { number: 'Fraction' });
const det = (rows: number[][]) => Number(math.det(math.matrix(rows.map((r) => r.map((v) => math.fraction(v))))).valueOf());

function fullRankByMathjs(rows: number[][]): boolean {
  // rank = number of columns  <=>  det(A^T A) != 0 (exact)
  const cols = rows[0]!.length;
  const ata = Array.from({ length: cols }, (_, i) => Array.from({ length: cols }, (_, j) => rows.reduce((acc, r) => acc + r[i]! * r[j]!, 0)));
  return det(ata) !== 0;
}

describe('rank proof of a Deduction puzzle', () => {
  it('the true sizes satisfy the Kirchhoff system (checked with mathjs multiply)', () => {
    const t = parseTiling('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)');
    const g = tilingLayout(t);
    const sys = kirchhoffSystem(g, [{ square: 0, size: 18 }], true);
    const value = (name: string) => {
      const k = Number(name.slice(1));
      if (name[0] === 'x') return g.vertical[k]!.at;
      if (name[0] === 'y') return g.horizontal[k]!.at;
      return t.squares[k]!.s;
    };
    const v = sys.variables.map(value);
    const product = math.multiply(math.matrix(sys.rows), math.matrix(v)).toArray() as unknown as number[];
    expect(product.map(Number)).toEqual(sys.rhs);
  });

  it('agrees with mathjs on full rank, and with propagation (solvable implies unique), on seeded givens', () => {
    const rnd = mulberry32(11);
    const tilings = catalogue(10).map((c) => c.tiling);
    let solvedSeen = 0;
    let deficientSeen = 0;
    for (let t = 0; t < 24; t++) {
      const tiling = tilings[t % tilings.length]!;
      const g = tilingLayout(tiling);
      const n = tiling.squares.length;
      const count = Math.floor(rnd() * 4); // 0 to 3 givens
      const givens = [...new Set(Array.from({ length: count }, () => Math.floor(rnd() * n)))];
      const showFrame = rnd() < 0.3;
      const gs = givens.map((i) => ({ square: i, size: tiling.squares[i]!.s }));
      const proof = proveUniqueByRank(g, gs, showFrame);
      expect(proof.unique).toBe(fullRankByMathjs(kirchhoffSystem(g, gs, showFrame).rows));
      const board = { layout: g, sizes: tiling.squares.map((q) => q.s) };
      if (isSolvable(board, givens, { level: Number.POSITIVE_INFINITY, showFrame })) { solvedSeen++; expect(proof.unique).toBe(true); }
      if (!proof.unique) { deficientSeen++; expect(isSolvable(board, givens, { level: Number.POSITIVE_INFINITY, showFrame })).toBe(false); }
    }
    // the seeded sample covers both outcomes (with no given and no frame only the scale is open)
    expect(solvedSeen).toBeGreaterThan(0);
    expect(deficientSeen).toBeGreaterThan(0);
  });

  it('a printed frame alone fixes every size of a simple squared rectangle (BSST 1940: the currents are determined by the total current)', () => {
    const t = parseTiling('9 69 61 (36,33)(5,28)(25,9,2)(7)(16)');
    expect(proveUniqueByRank(tilingLayout(t), [], true).unique).toBe(true);
    expect(proveUniqueByRank(tilingLayout(t), [], false).unique).toBe(false);
  });
});
