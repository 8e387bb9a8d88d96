import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { parseTiling, verifyTiling } from '../../../shared/tiling/index';

const root = join(import.meta.dirname, '../../..');

function cli(args: string[]) {
  const r = spawnSync(process.execPath, ['--import', 'tsx', 'server/cli/main.ts', ...args], { cwd: root, encoding: 'utf8', timeout: 60_000 });
  return { code: r.status, out: r.stdout, err: r.stderr, lines: r.stdout.split('\n').filter(Boolean) };
}

// squaring.net catalogue / reference facts: simple perfect 33 x 32 of order 9 (Moroń 1925)
const C33 = '9 33 32 (18,15)(7,8)(14,4)(10,1)(9)';

describe('cli assemble', () => {
  it('the 33 x 32 pieces assemble in exactly one way: verdict unique, exit 0, the known tiling', () => {
    const r = cli(['assemble', '--frame', '33x32', '--pieces', '18,15,7,8,14,4,10,1,9']);
    expect(r.code).toBe(0);
    const a = JSON.parse(r.lines[0]!);
    expect(Object.keys(a).sort()).toEqual(['classes', 'complete', 'ms', 'nodes', 'solutions', 'verdict']);
    expect(a).toMatchObject({ verdict: 'unique', classes: 1, complete: true, solutions: [C33] });
    expect(a.nodes).toBeGreaterThan(0);
  });

  it('the order-13 twin set assembles in two different ways: verdict multiple with two verified codes, exit 1', () => {
    // engine.md section 7 (two simple perfect rectangles with the same 13 elements)
    const r = cli(['assemble', '--frame', '112x75', '--pieces', '33,24,19,36,5,14,9,20,42,11,3,39,31']);
    expect(r.code).toBe(1);
    const a = JSON.parse(r.lines[0]!);
    expect(a.verdict).toBe('multiple');
    expect(a.classes).toBe(2);
    expect(a.solutions).toHaveLength(2);
    for (const code of a.solutions) expect(verifyTiling(parseTiling(code)).ok).toBe(true);
    expect(a.solutions[0]).not.toBe(a.solutions[1]);
  });

  it('areas that do not add up give none; bad arguments are usage errors (exit 2) without a stack trace', () => {
    const none = cli(['assemble', '--frame', '5x5', '--pieces', '3,2']);
    expect(none.code).toBe(1);
    expect(JSON.parse(none.lines[0]!).verdict).toBe('none');
    const bad = cli(['assemble', '--frame', '3y3', '--pieces', '1']);
    expect(bad.code).toBe(2);
    expect(bad.err).toContain('--frame');
    expect(bad.err).not.toMatch(/\n\s+at /);
    expect(cli(['assemble', '--pieces', '1']).code).toBe(2);
    expect(cli(['assemble', '--frame', '1x1', '--pieces', '1', '--budget-ms', '-4']).code).toBe(2);
  });
});

describe('cli deduce', () => {
  it('prints givens, steps whose values equal the true sizes, a grade 1-5 and the level; exit 0', () => {
    const r = cli(['deduce', C33, '--level', '2', '--seed', '3']);
    expect(r.code).toBe(0);
    const d = JSON.parse(r.lines[0]!);
    expect(Object.keys(d).sort()).toEqual(['givens', 'grade', 'level', 'steps', 'unique']);
    expect(d.unique).toBe(true);
    expect(d.level).toBe(2);
    expect(d.grade).toBeGreaterThanOrEqual(1);
    expect(d.grade).toBeLessThanOrEqual(5);
    const t = parseTiling(C33);
    const sizeAt = new Map(t.squares.map((q) => [`${q.x},${q.y}`, q.s]));
    for (const g of d.givens) expect(sizeAt.get(`${g.x},${g.y}`)).toBe(g.size);
    // every square is either given or deduced
    expect(d.givens.length + d.steps.length).toBe(9);
    const trueSizes = t.squares.map((q) => q.s);
    for (const s of d.steps) expect(trueSizes).toContain(s.value);
  });

  it('the same seed gives the same puzzle', () => {
    const a = cli(['deduce', C33, '--seed', '7']).out;
    const b = cli(['deduce', C33, '--seed', '7']).out;
    expect(a).toBe(b);
  });

  it('a bad code answers ok:false with the message (exit 1); a missing code or bad level is a usage error (exit 2)', () => {
    const r = cli(['deduce', '9 33 32 (18,15)(7,8)(14,4)(10,1)(10)']);
    expect(r.code).toBe(1);
    expect(JSON.parse(r.lines[0]!)).toEqual({ ok: false, error: expect.stringContaining('element 9') });
    expect(cli(['deduce']).code).toBe(2);
    expect(cli(['deduce', C33, '--level', 'zero']).code).toBe(2);
  });
});
