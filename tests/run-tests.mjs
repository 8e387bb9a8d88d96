#!/usr/bin/env node
// The README's `npm test`: lint (with import-boundary rules), type-check, then every
// vitest project (node, dom, e2e). Ends with one line `N passed, N failed[, N skipped]`
// that CI reads; the exit code is non-zero when anything failed.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const extra = process.argv.slice(2);
let passed = 0;
let failed = 0;
let skipped = 0;

function step(name, cmd, args) {
  const t0 = Date.now();
  const r = spawnSync(cmd, args, { stdio: 'inherit', env: process.env });
  const ok = r.status === 0;
  console.log(`[${ok ? 'ok' : 'FAILED'}] ${name} (${((Date.now() - t0) / 1000).toFixed(1)} s)`);
  if (ok) passed += 1;
  else failed += 1;
  return ok;
}

if (extra.length === 0) {
  step('lint (oxlint, import boundaries)', 'npx', ['--no-install', 'oxlint', '--deny-warnings']);
  step('typecheck (tsc --noEmit)', 'npx', ['--no-install', 'tsc', '--noEmit', '-p', 'tsconfig.json']);
}

const dir = mkdtempSync(join(tmpdir(), 'sw-vitest-'));
const out = join(dir, 'report.json');
const r = spawnSync(
  'npx',
  ['--no-install', 'vitest', 'run', '--reporter=default', '--reporter=json', `--outputFile.json=${out}`, ...extra],
  { stdio: 'inherit', env: process.env },
);
let vitestOk = r.status === 0;
try {
  const report = JSON.parse(readFileSync(out, 'utf8'));
  passed += report.numPassedTests ?? 0;
  failed += report.numFailedTests ?? 0;
  skipped += (report.numPendingTests ?? 0) + (report.numTodoTests ?? 0);
  // A suite that failed to load counts as a failure even if it had no tests.
  for (const s of report.testResults ?? []) {
    if (s.status === 'failed' && (s.assertionResults ?? []).every((a) => a.status !== 'failed')) failed += 1;
  }
} catch {
  console.error('vitest wrote no report');
  failed += 1;
  vitestOk = false;
}
rmSync(dir, { recursive: true, force: true });
if (!vitestOk && failed === 0) failed += 1;
console.log(`${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}`);
process.exit(failed > 0 ? 1 : 0);
