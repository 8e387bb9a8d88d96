import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { parseTiling } from '../../../shared/tiling/index';
import { certify, inputHash, isCertificateCurrent, PUZZLE_ENGINE_VERSION, recheckCertificate } from '../../../shared/puzzle/certificate';
import type { CertificateInput } from '../../../shared/puzzle/certificate';

// OEIS A014530; Duijvestijn 1978
const SQUARE_112 = '21 112 112 (50,35,27)(8,19)(15,17,11)(6,24)(29,25,9,2)(7,18)(16)(42)(4,37)(33)';
const nodeHash = (s: string) => createHash('sha256').update(s, 'utf8').digest('hex');

describe('certificates', () => {
  const t = parseTiling(SQUARE_112);
  const assembly: CertificateInput = { kind: 'assembly', width: 112, height: 112, pieces: t.squares.map((q) => q.s) };

  it('an Assembly certificate records the verdict, counts, checks, nodes, time, date and engine version', () => {
    const { certificate: c } = certify(assembly, { createdAt: () => new Date('2026-12-02T10:00:00Z') });
    expect(c).toMatchObject({ kind: 'assembly', verdict: 'unique', engineVersion: PUZZLE_ENGINE_VERSION, createdAt: '2026-12-02T10:00:00.000Z' });
    expect(c.counts.classes).toBe(1);
    expect(c.counts.rawSolutions).toBe(8); // the 8 images of a perfect square
    expect(c.checks.some((x) => /Kirchhoff/.test(x))).toBe(true);
    expect(c.nodes).toBeGreaterThan(0);
    expect(c.inputHash).toMatch(/^[0-9a-f]{64}$/);
  });

  it('the input hash ignores the order of the pieces and equals the hash node would give', () => {
    const shuffled: CertificateInput = { ...assembly, pieces: [...(assembly as { pieces: number[] }).pieces].reverse() };
    expect(inputHash(shuffled)).toBe(inputHash(assembly));
    expect(inputHash(assembly, nodeHash)).toBe(inputHash(assembly));
    expect(inputHash({ ...assembly, starters: [{ size: 50, x: 0, y: 0 }] })).not.toBe(inputHash(assembly));
  });

  it('re-checking by recomputation holds for the same input and fails for another input or engine version', () => {
    const { certificate } = certify(assembly);
    expect(recheckCertificate(certificate, assembly).holds).toBe(true);
    const other = recheckCertificate(certificate, { kind: 'assembly', width: 70, height: 70, pieces: Array.from({ length: 24 }, (_, i) => i + 1) });
    expect(other.holds).toBe(false);
    expect(other.reasons.join(' ')).toMatch(/hash differs/);
    expect(other.reasons.join(' ')).toMatch(/verdict was unique, recomputed none/);
    const old = { ...certificate, engineVersion: 'puzzle-engine/0' };
    expect(isCertificateCurrent(old)).toBe(false);
    expect(isCertificateCurrent(certificate)).toBe(true);
    expect(recheckCertificate(old, assembly).reasons.join(' ')).toMatch(/issued by engine puzzle-engine\/0/);
  });

  it('an undecided verdict never re-checks as holding', () => {
    const input: CertificateInput = { kind: 'assembly', width: 70, height: 70, pieces: Array.from({ length: 24 }, (_, i) => i + 1) };
    const { certificate } = certify(input, { assembly: { budget: { maxNodes: 100 } } });
    expect(certificate.verdict).toBe('undecided');
    expect(recheckCertificate(certificate, input, { assembly: { budget: { maxNodes: 100 } } }).holds).toBe(false);
  });

  it('a Deduction certificate carries the rank proof and re-checks', () => {
    const givens = [t.squares[0]!, t.squares[5]!, t.squares[9]!].map((q) => ({ x: q.x, y: q.y, size: q.s }));
    const input: CertificateInput = { kind: 'deduction', tiling: t, givens, level: 'closure', showFrame: false };
    const out = certify(input);
    if (out.kind !== 'deduction') throw new Error('expected a deduction certificate');
    const { certificate: c, result } = out;
    expect(c.counts.rank).toBe(c.counts.unknowns);
    expect(c.verdict).toBe(result.solved ? 'unique' : 'stuck');
    expect(recheckCertificate(c, input).holds).toBe(true);
    const none: CertificateInput = { kind: 'deduction', tiling: t, givens: [], level: 'closure', showFrame: false };
    expect(certify(none).certificate.verdict).toBe('not-unique');
    expect(() => certify({ ...input, givens: [{ x: 1, y: 1, size: 3 }] } as CertificateInput)).toThrow(/not a square of the tiling/);
  });
});
