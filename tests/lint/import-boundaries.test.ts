import { readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve, sep } from 'node:path';
import { describe, expect, it } from 'vitest';

// Import boundaries (docs: DEVELOPERS.md, "Imports flow one way"; decision 007): shared/ imports
// nothing from src/ or server/ and no Node/DOM/framework modules; src/ and server/
// never import each other; features in src/features/ never import each other; inside
// server/, the platform imports no area and nothing at the top level (the composition root),
// areas import no top-level file, and an area reaches another only through its index.ts or
// ports.ts (an area's schema.ts may import another area's schema.ts, for foreign keys).
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

/** Where a server file lives: 'platform', 'area:<name>', 'root' (the composition root), 'cli', or null outside server/. */
export function serverPlace(rel: string): string | null {
  const parts = rel.split(/[\\/]/);
  if (parts[0] !== 'server') return null;
  if (parts[1] === 'platform') return 'platform';
  if (parts[1] === 'areas') return `area:${parts[2] ?? ''}`;
  if (parts[1] === 'cli') return 'cli';
  return 'root';
}

/** Why an import from `fromRel` to `targetRel` (repo-relative, extension optional) breaks the server's rules, or null. */
export function serverRule(fromRel: string, targetRel: string): string | null {
  const from = serverPlace(fromRel);
  const to = serverPlace(targetRel);
  if (!from || !to) return null;
  const file = (targetRel.split(/[\\/]/).pop() ?? '').replace(/\.(ts|tsx)$/, '');
  const fromFile = (fromRel.split(/[\\/]/).pop() ?? '').replace(/\.(ts|tsx)$/, '');
  if (from === 'platform' && to.startsWith('area:')) return 'the platform must not import an area';
  if (from === 'platform' && to === 'root') return 'the platform must not import the composition root';
  if (from.startsWith('area:') && to === 'root') return 'an area must not import the composition root';
  if (from.startsWith('area:') && to === 'cli') return 'an area must not import the command line';
  if (from.startsWith('area:') && to.startsWith('area:') && from !== to) {
    if (file === 'index' || file === 'ports') return null;
    if (/(^|-)schema$/.test(file) && fromFile === 'schema') return null; // an area's table files (schema.ts, publication-schema.ts)
    return `${from.slice(5)} reaches into ${to.slice(5)}/${file}: go through its index.ts or ports.ts`;
  }
  return null;
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

  it('server/: the platform imports no area nor the composition root; areas meet only through index.ts and ports.ts', () => {
    const bad = violations('server', (file, _spec, target) => (target ? serverRule(relative(root, file), relative(root, target)) : null));
    expect(bad).toEqual([]);
  });

  it('the server rules see a violation when one exists', () => {
    // Guard against a checker that silently passes: synthetic pairs, one per rule.
    expect(serverRule('server/platform/http/route.ts', 'server/areas/stock/index')).toMatch(/platform must not import an area/);
    expect(serverRule('server/platform/jobs/runner.ts', 'server/job-kinds')).toMatch(/composition root/);
    expect(serverRule('server/areas/stock/stock.ts', 'server/app-deps')).toMatch(/composition root/);
    expect(serverRule('server/areas/puzzles/puzzles.ts', 'server/areas/stock/stock')).toMatch(/stock\/stock: go through its index\.ts or ports\.ts/);
    expect(serverRule('server/areas/puzzles/puzzles.ts', 'server/areas/stock/schema')).toMatch(/go through/);
    expect(serverRule('server/areas/puzzles/schema.ts', 'server/areas/stock/schema')).toBeNull();
    expect(serverRule('server/areas/puzzles/puzzles.ts', 'server/areas/stock/ports')).toBeNull();
    expect(serverRule('server/areas/puzzles/puzzles.ts', 'server/areas/puzzles/rules')).toBeNull();
    expect(serverRule('server/compose.ts', 'server/areas/stock/stock')).toBeNull();
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
