import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { canonicalJson, normaliseCertificateInput, sha256Hex } from '../../../shared/puzzle/index';
import { parseTiling } from '../../../shared/tiling/index';
import { assemblyGrade, certificateInputOf, provePuzzle, type PuzzleJobInput } from '../../../server/areas/puzzles/rules';
import { ORDER_9, SQUARE_112, TWIN_13 } from './fixtures';

// The work of a 'puzzle-prove' job, run in-process (the worker runs the same function).

const input = (code: string, over: Partial<PuzzleJobInput>): PuzzleJobInput => ({
  kind: 'assembly', tiling: parseTiling(code), level: null, showFrame: false, starters: null, givens: null, grade: null, seed: 1, ...over,
});

describe('puzzle-prove', () => {
  it('the order-21 square needs no starter pieces: its sizes assemble in exactly one way (OEIS A014530)', () => {
    const s = provePuzzle(input(SQUARE_112, {}), 'make', 1);
    expect(s.certificate.verdict).toBe('unique');
    expect(s.certificate.counts.classes).toBe(1);
    expect(s.starters).toEqual([]);
    expect(s.notes.join(' ')).toMatch(/no starter pieces needed/);
  });

  it('the twin order-13 set (two ways, issue 4) gets starter pieces that make it unique', () => {
    const s = provePuzzle(input(TWIN_13, {}), 'make', 1);
    expect(s.certificate.verdict).toBe('unique');
    expect(s.starters.length).toBeGreaterThan(0);
    const t = parseTiling(TWIN_13);
    for (const st of s.starters) expect(t.squares).toContainEqual({ x: st.x, y: st.y, s: st.size });
    // the bare set, proved on its own, has two classes
    expect(provePuzzle(input(TWIN_13, { starters: [] }), 'prove', 1).certificate.counts.classes).toBe(2);
  });

  it('hashes the input with node:crypto: the same SHA-256 (FIPS 180-4) as the engine default over the same canonical JSON', () => {
    const i = input(ORDER_9, { kind: 'deduction', level: 2 });
    const s = provePuzzle(i, 'make', 1);
    const text = canonicalJson(normaliseCertificateInput(certificateInputOf({ ...i, level: s.level }, [], s.givens)));
    expect(s.certificate.inputHash).toBe(createHash('sha256').update(text, 'utf8').digest('hex'));
    expect(s.certificate.inputHash).toBe(sha256Hex(text));
  });

  it('with a grade wished and no level, keeps the level whose grade comes closest', () => {
    const t = parseTiling(SQUARE_112);
    const byLevel = ([1, 2, 3, 4, 'closure'] as const).map((level) => provePuzzle({ ...input(SQUARE_112, { kind: 'deduction' }), level, tiling: t }, 'make', 1));
    for (const wish of [1, 5]) {
      const s = provePuzzle(input(SQUARE_112, { kind: 'deduction', grade: wish }), 'make', 1);
      const best = Math.min(...byLevel.map((b) => Math.abs((b.grade ?? 0) - wish)));
      expect(Math.abs((s.grade ?? 0) - wish)).toBe(best);
      expect(s.certificate.verdict).toBe('unique');
    }
  });

  it('re-checks a certificate by recomputation; a tampered one does not hold', () => {
    const i = input(ORDER_9, { kind: 'deduction', level: 3 });
    const made = provePuzzle(i, 'make', 1);
    const again = { ...i, givens: made.givens, level: made.level };
    expect(provePuzzle({ ...again, certificate: made.certificate }, 'recheck', 1).recheck).toEqual({ holds: true, reasons: [] });
    const tampered = { ...made.certificate, inputHash: '0'.repeat(64) };
    const r = provePuzzle({ ...again, certificate: tampered }, 'recheck', 1).recheck!;
    expect(r.holds).toBe(false);
    expect(r.reasons.join(' ')).toMatch(/hash differs/);
  });

  it('grades Assembly puzzles 1..5 by pieces, easier with starter pieces (decision 070, our rule)', () => {
    expect(assemblyGrade(9, 0)).toBe(1);
    expect(assemblyGrade(13, 0)).toBe(2);
    expect(assemblyGrade(21, 0)).toBe(4);
    expect(assemblyGrade(25, 0)).toBe(5);
    expect(assemblyGrade(25, 4)).toBe(3);
    expect(assemblyGrade(9, 6)).toBe(1);
  });
});
