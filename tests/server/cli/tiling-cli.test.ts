import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { solveJson, verifyLine } from '../../../server/cli/tiling';

const root = join(import.meta.dirname, '../../..');
const dir = mkdtempSync(join(tmpdir(), 'sw-cli-'));

function cli(args: string[], input?: string) {
  const r = spawnSync(process.execPath, ['--import', 'tsx', 'server/cli/main.ts', ...args], { cwd: root, input, encoding: 'utf8', timeout: 60_000 });
  return { code: r.status, out: r.stdout, err: r.stderr, lines: r.stdout.split('\n').filter(Boolean) };
}

// squaring.net catalogue / reference facts
const C33 = '9 33 32 (18,15)(7,8)(14,4)(10,1)(9)';

describe('cli verify', () => {
  it('prints one JSON object per code line, skipping blank and # lines; exit 1 when any is invalid', () => {
    const r = cli(['verify'], `# a comment\n${C33}\n\n(9,10,14)(8,1)(7,4)(18)(15) * rotated\n9 33 32 (18,15)(7,8)(14,4)(10,1)(10)\n`);
    expect(r.code).toBe(1);
    expect(r.lines.map((l) => JSON.parse(l))).toEqual([
      { line: 2, ok: true, order: 9, width: 33, height: 32, square: false, perfect: true, simple: true, canonical: C33, spanningTrees: '130' },
      { line: 4, ok: true, order: 9, width: 33, height: 32, square: false, perfect: true, simple: true, canonical: C33, spanningTrees: '130' },
      { line: 5, ok: false, error: 'element 9 (size 10) is wider than the free segment (9) at x=24, y=23' },
    ]);
    expect(r.err).toBe('');
  });

  it('reads a file and exits 0 when all lines are valid; exit 2 on usage errors without a stack trace', () => {
    const f = join(dir, 'codes.txt');
    writeFileSync(f, `${C33}\n21 112 112 (50,35,27)(8,19)(15,17,11)(6,24)(29,25,9,2)(7,18)(16)(42)(4,37)(33)\n`);
    const ok = cli(['verify', f]);
    expect(ok.code).toBe(0);
    // the 112 square: tau(G) = 2 * 37632 (reference facts)
    expect(JSON.parse(ok.lines[1]!)).toMatchObject({ line: 2, ok: true, square: true, spanningTrees: '75264' });
    const missing = cli(['verify', join(dir, 'nope.txt')]);
    expect(missing.code).toBe(2);
    expect(missing.err).toMatch(/^cannot read .*nope\.txt: ENOENT\n$/);
    expect(cli(['verify', 'a', 'b']).code).toBe(2);
    const none = cli(['frobnicate']);
    expect(none.code).toBe(2);
    expect(none.err).toMatch(/^usage:/);
  });
});

describe('cli network and solve', () => {
  it('network prints both Smith diagrams and the Kirchhoff checks', () => {
    const r = cli(['network', C33]);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j).toMatchObject({ ok: true, canonical: C33, spanningTrees: '130', kirchhoff: { ok: true, violations: [] } });
    expect(j.horizontal.nodes.map((n: { potential: number }) => n.potential)).toEqual([32, 17, 14, 10, 9, 0]);
    expect(j.vertical.direction).toBe('vertical');
    const bad = cli(['network', '(1,2)']);
    expect(bad.code).toBe(1);
    expect(JSON.parse(bad.out).ok).toBe(false);
    expect(cli(['network']).code).toBe(2);
  });

  it('solve turns a rotation system with poles into the tiling (worked example: 66 x 64 reduced by 2)', () => {
    const f = join(dir, 'net.json');
    writeFileSync(f, JSON.stringify({ n: 6, adj: [[5, 1, 2], [0, 4, 3], [0, 3, 5], [2, 1, 4, 5], [3, 1, 5], [2, 3, 4, 0]], poles: { p: 0, q: 5 } }));
    const r = cli(['solve', f]);
    expect(r.code).toBe(0);
    expect(JSON.parse(r.out)).toMatchObject({ ok: true, canonical: C33, fullWidth: '66', fullHeight: '64', gcd: '2', spanningTrees: '130', perfect: true, simple: true });
    expect(cli(['solve']).code).toBe(2);
    expect(cli(['solve', join(dir, 'missing.json')]).code).toBe(2);
  });
});

describe('cli helpers (in process)', () => {
  it('verifyLine reports errors as JSON', () => {
    expect(JSON.parse(verifyLine('(0)', 3).json)).toEqual({ line: 3, ok: false, error: 'element 1 at column 2 is 0; sizes must be positive' });
  });

  it('solveJson validates its input and accepts drawings', () => {
    expect(JSON.parse(solveJson('{').json)).toMatchObject({ ok: false, code: 'bad-json' });
    expect(JSON.parse(solveJson('{"n": 3}').json)).toMatchObject({ ok: false, code: 'bad-input' });
    const crossing = { nodes: [{ x: 0, y: 0 }, { x: 1, y: 0 }, { x: 1, y: 1 }, { x: 0, y: 1 }], edges: [[0, 2], [1, 3]], poles: { p: 0, q: 2 } };
    expect(JSON.parse(solveJson(JSON.stringify(crossing)).json)).toMatchObject({ ok: false, code: 'crossing', error: 'edges 0 (0-2) and 1 (1-3) cross' });
    // the wheel W_4 drawn as a square with its centre; pole edge on the rim
    const w4 = { nodes: [{ x: 0, y: 0 }, { x: 2, y: 0 }, { x: 2, y: 2 }, { x: 0, y: 2 }, { x: 1, y: 1 }], edges: [[0, 1], [1, 2], [2, 3], [3, 0], [0, 4], [1, 4], [2, 4], [3, 4]], poles: { p: 0, q: 1 } };
    const r = JSON.parse(solveJson(JSON.stringify(w4)).json);
    expect(r.ok).toBe(true);
    expect(r.order).toBe(7);
    expect(JSON.parse(solveJson(JSON.stringify({ n: 4, adj: [[1, 2, 3], [0, 3, 2], [0, 1, 3], [0, 2, 1]], poles: { p: 0, q: 1 } })).json)).toMatchObject({ ok: false, code: 'zero-current' });
  });
});
