import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync, mkdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { z } from 'zod';

// Zero import cycles across server/, src/ and shared/ (decision 007), by oxlint's
// import/no-cycle rule with the project's setting (type-only imports count too). `npm test`
// runs the whole lint; this test runs that one rule alone, so a cycle fails here with the
// cycle's path in the message, and shows the rule really fires on a cycle.

const root = resolve(import.meta.dirname, '..', '..');
const oxlint = join(root, 'node_modules', '.bin', 'oxlint');

const configSchema = z.object({ rules: z.record(z.string(), z.unknown()) });
const projectRule = () => configSchema.parse(JSON.parse(readFileSync(join(root, '.oxlintrc.json'), 'utf8'))).rules['import/no-cycle'];

/** oxlint with only the project's import/no-cycle setting, over `dirs` of `cwd`. */
function cycleRule(cwd: string, dirs: string[]) {
  const dir = mkdtempSync(join(tmpdir(), 'sw-cycle-config-'));
  try {
    const config = join(dir, 'oxlintrc.json');
    writeFileSync(config, JSON.stringify({ plugins: ['import', 'typescript'], categories: { correctness: 'off' }, rules: { 'import/no-cycle': projectRule() } }));
    const r = spawnSync(oxlint, ['-c', config, ...dirs], { cwd, encoding: 'utf8' });
    return { status: r.status, out: `${r.stdout}${r.stderr}` };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

describe('import cycles', () => {
  it('are switched on as an error in the lint configuration', () => {
    expect(projectRule()).toEqual(['error', { ignoreTypes: false }]);
  });

  it('there are none in server/, src/ or shared/', () => {
    const r = cycleRule(root, ['server', 'src', 'shared']);
    expect(r.out).toMatch(/Found 0 warnings and 0 errors/);
    expect(r.status).toBe(0);
  });

  it('the rule finds a cycle when there is one, of type-only imports too', () => {
    const dir = mkdtempSync(join(tmpdir(), 'sw-cycle-'));
    try {
      mkdirSync(join(dir, 'server'));
      writeFileSync(join(dir, 'server', 'a.ts'), "import type { B } from './b';\nexport type A = { b: B };\n");
      writeFileSync(join(dir, 'server', 'b.ts'), "import type { A } from './a';\nexport type B = { a?: A };\n");
      const r = cycleRule(dir, ['server']);
      expect(r.status).not.toBe(0);
      expect(r.out).toMatch(/no-cycle/);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
