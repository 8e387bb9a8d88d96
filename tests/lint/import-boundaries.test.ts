import { readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve, sep } from 'node:path';
import { describe, expect, it } from 'vitest';

// Import boundaries (docs: DEVELOPERS.md, "Imports flow one way"): shared/ imports
// nothing from src/ or server/ and no Node/DOM/framework modules; src/ and server/
// never import each other; features in src/features/ never import each other.
// oxlint enforces the first three by pattern; this check resolves every relative
// import to a real path, so it also catches the cases patterns cannot see.

const root = resolve(import.meta.dirname, '..', '..');
const importRe = /(?:import|export)\s[^'"`]*?from\s*['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)|^\s*import\s*['"]([^'"]+)['"]/gm;

function walk(dir: string): string[] {
  let out: string[] = [];
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) out = out.concat(walk(p));
    else if (/\.(ts|tsx)$/.test(name)) out.push(p);
  }
  return out;
}

function importsOf(file: string): string[] {
  const text = readFileSync(file, 'utf8');
  const specs: string[] = [];
  for (const m of text.matchAll(importRe)) {
    const spec = m[1] ?? m[2] ?? m[3];
    if (spec) specs.push(spec);
  }
  return specs;
}

function area(path: string): string {
  return relative(root, path).split(sep)[0] ?? '';
}

function featureOf(path: string): string | null {
  const parts = relative(root, path).split(sep);
  return parts[0] === 'src' && parts[1] === 'features' ? (parts[2] ?? null) : null;
}

function violations(top: string, rule: (file: string, spec: string, target: string | null) => string | null): string[] {
  const found: string[] = [];
  let files: string[] = [];
  try {
    files = walk(join(root, top));
  } catch {
    return found;
  }
  for (const file of files) {
    for (const spec of importsOf(file)) {
      const target = spec.startsWith('.') ? resolve(dirname(file), spec) : null;
      const why = rule(file, spec, target);
      if (why) found.push(`${relative(root, file)}: '${spec}' (${why})`);
    }
  }
  return found;
}

const nodeOnly = /^(node:|fs$|path$|os$|child_process$|worker_threads$|crypto$|http$|https$|net$|stream$|url$)/;
const frameworkOnly = /^(react|react-dom|react-router|react-router-dom|express|better-sqlite3|drizzle-orm|@tanstack\/|@react-pdf\/|pngjs|nodemailer|multer|better-auth)(\/|$)/;

describe('import boundaries', () => {
  it('shared/ imports nothing from src/ or server/, and no Node-, DOM- or framework-only module', () => {
    const bad = violations('shared', (_f, spec, target) => {
      if (target && ['src', 'server'].includes(area(target))) return 'shared must not import app code';
      if (nodeOnly.test(spec)) return 'Node-only module';
      if (frameworkOnly.test(spec)) return 'framework module';
      return null;
    });
    expect(bad).toEqual([]);
  });

  it('src/ never imports server/ nor Node modules', () => {
    const bad = violations('src', (_f, spec, target) => {
      if (target && area(target) === 'server') return 'src must not import server';
      if (nodeOnly.test(spec)) return 'Node-only module in browser code';
      return null;
    });
    expect(bad).toEqual([]);
  });

  it('server/ never imports src/', () => {
    const bad = violations('server', (_f, _spec, target) =>
      target && area(target) === 'src' ? 'server must not import src' : null,
    );
    expect(bad).toEqual([]);
  });

  it('features in src/features/ do not import each other', () => {
    const bad = violations(join('src', 'features'), (file, _spec, target) => {
      if (!target) return null;
      const from = featureOf(file);
      const to = featureOf(target);
      return from && to && from !== to ? `feature ${from} imports feature ${to}` : null;
    });
    expect(bad).toEqual([]);
  });

  it('the checker sees a cross-feature import when one exists', () => {
    // Guard against a checker that silently passes: resolve a synthetic pair.
    const a = join(root, 'src', 'features', 'alpha', 'components', 'x.tsx');
    const target = resolve(dirname(a), '../../beta/api/y');
    expect(featureOf(a)).toBe('alpha');
    expect(featureOf(target)).toBe('beta');
  });
});
